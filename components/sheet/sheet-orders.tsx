import { Link } from 'expo-router';
import { useState } from 'react';
import { StyleSheet, Text, TextInput, View } from 'react-native';

import { formatDateTime, quoteSentence } from '@/constants/format';
import { colors, fonts, radius, space, type as typeScale } from '@/constants/theme';
import { useGrindingShopsQuery, useIssueSheetMutation, useSheetOrdersQuery } from '@/hooks/use-orders';
import type { Order } from '@/shared/orders';
import type { SheetWithHistory } from '@/shared/sheets';

import { Button } from '@/components/ui/button';
import { noteInput } from '@/components/ui/note-input';
import { ChoiceGroup } from '@/components/ui/choice-group';
import { FirmnessChip } from '@/components/order/order-firmness';
import { OrderMoves } from '@/components/order/order-moves';
import { OrderStageChip } from '@/components/order/order-stage-chip';
import { SupersededChip } from '@/components/order/superseded';
import { EmptyState, ErrorNotice, Pending } from '@/components/ui/query-state';
import { Section } from '@/components/ui/screen';
import { TextField } from '@/components/ui/text-field';

/** Sends the revision the server names (the owner's approved one, else the latest draft) to one grinding shop, after a confirm step. */
export function IssuePanel({ sheet }: { sheet: SheetWithHistory }) {
  const target = sheet.toIssue;
  const shops = useGrindingShopsQuery(target !== null);
  const issue = useIssueSheetMutation(sheet.id);
  const [shopId, setShopId] = useState('');
  const [note, setNote] = useState('');
  const [confirming, setConfirming] = useState(false);
  const [firm, setFirm] = useState<'quote' | 'firm'>('quote');
  const [reason, setReason] = useState('');

  if (!target) {
    return (
      <Section title="Issue to a grinder">
        <Text style={styles.body} testID="issue-frozen">
          {sheet.issueBlocked}
        </Text>
      </Section>
    );
  }
  const current = { number: target.number };
  const chosen = shops.data?.find((s) => s.id === shopId);
  return (
    <Section title="Issue to a grinder">
      <Text style={styles.meta} testID="issue-target">
        {target.approved ? `The owner approved revision ${target.number}: that is the revision to send. ` : ''}Issuing freezes revision {target.number} for
        good. The grinder sees this revision only, never a draft.
      </Text>
      {target.replacesApproved !== null ? (
        <Text style={styles.warn} role="alert" testID="issue-withdraws">
          The owner approved revision {target.replacesApproved}. Issuing revision {target.number} supersedes it before grinding, so their approval is withdrawn
          and they are e-mailed to approve again. Offer them revision {target.number} on the owner page.
        </Text>
      ) : null}
      {shops.isPending ? <Pending label="Loading grinding shops…" /> : null}
      {shops.isError ? <ErrorNotice error={shops.error} onRetry={() => shops.refetch()} /> : null}
      {shops.data && shops.data.length === 0 ? <EmptyState title="No grinding shops on Lobewright yet" /> : null}
      {shops.data && shops.data.length > 0 ? (
        <>
          <ChoiceGroup
            label="Grinding shop"
            value={shopId}
            choices={shops.data.map((s) => ({ value: s.id, label: s.name }))}
            onChange={(v) => {
              setShopId(v);
              setConfirming(false);
            }}
            testID="issue-shop"
          />
          {target.approved ? (
            <Text style={styles.meta}>It goes as the firm order: the one revision of this job the grinder may grind.</Text>
          ) : (
            <>
              <ChoiceGroup
                label="Send as"
                value={firm}
                choices={[
                  { value: 'quote', label: 'Request for a quote' },
                  { value: 'firm', label: 'Firm order without the owner' },
                ]}
                onChange={(v) => setFirm(v === 'firm' ? 'firm' : 'quote')}
                testID="issue-kind"
              />
              {firm === 'firm' ? (
                <TextField label="Why it goes ahead without the owner" value={reason} onChangeText={setReason} testID="issue-reason" />
              ) : (
                <Text style={styles.meta}>The grinder can quote it but not grind it until the owner approves this revision or you confirm it.</Text>
              )}
            </>
          )}
          <Text style={styles.label} nativeID="issue-note-label">
            Note for the grinder
          </Text>
          <TextInput
            accessibilityLabel="Note for the grinder"
            aria-labelledby="issue-note-label"
            value={note}
            onChangeText={setNote}
            multiline
            style={styles.note}
            testID="issue-note"
          />
          {issue.isError ? <ErrorNotice error={issue.error} /> : null}
          {confirming && chosen ? (
            <View style={styles.confirm} role="alert" testID="issue-confirm-box">
              <Text style={styles.body}>
                Send revision {current.number} of “{sheet.title}” to {chosen.name} as{' '}
                {target.approved || firm === 'firm' ? 'the firm order' : 'a request for a quote'}? It cannot be edited afterwards.
              </Text>
              <View style={styles.row}>
                <Button
                  label={`Issue revision ${current.number}`}
                  busy={issue.isPending}
                  onPress={() =>
                    issue.mutate(
                      { version: sheet.version, grinderShopId: chosen.id, note, ...(firm === 'firm' && !target.approved ? { confirm: { reason } } : {}) },
                      {
                        onSuccess: () => {
                          setConfirming(false);
                          setNote('');
                        },
                      },
                    )
                  }
                  testID="issue-confirm"
                />
                <Button label="Not yet" variant="quiet" disabled={issue.isPending} onPress={() => setConfirming(false)} testID="issue-cancel" />
              </View>
            </View>
          ) : (
            <Button label="Issue to this grinder" disabled={!chosen} onPress={() => setConfirming(true)} testID="issue-start" />
          )}
        </>
      ) : null}
    </Section>
  );
}

/** The grind orders sent from this sheet, newest first, with their stage and the builder's next move. */
export function SheetOrders({ sheetId, canMove }: { sheetId: string; canMove: boolean }) {
  const orders = useSheetOrdersQuery(sheetId);
  return (
    <Section title="Grind orders">
      {orders.isPending ? <Pending label="Loading orders…" /> : null}
      {orders.isError ? <ErrorNotice error={orders.error} onRetry={() => orders.refetch()} /> : null}
      {orders.data && orders.data.length === 0 ? (
        <EmptyState title="Not issued yet">
          <Text style={styles.body}>Issue a revision to a grinding shop and its order shows here.</Text>
        </EmptyState>
      ) : null}
      {orders.data && orders.data.length > 0 ? (
        <View role="list" style={styles.list} testID="sheet-orders">
          {[...orders.data]
            .sort((a, b) => b.revisionNumber - a.revisionNumber)
            .map((o) => (
              <OrderRow key={o.id} order={o} canMove={canMove} />
            ))}
        </View>
      ) : null}
    </Section>
  );
}

function OrderRow({ order, canMove }: { order: Order; canMove: boolean }) {
  return (
    <View role="listitem" style={styles.item} testID={`sheet-order-${order.revisionNumber}`}>
      <View style={styles.itemHead}>
        <Text style={styles.itemTitle}>
          Revision {order.revisionNumber} · {order.grinderShop.name}
        </Text>
        <OrderStageChip stage={order.stage} testID={`sheet-order-stage-${order.revisionNumber}`} />
        <FirmnessChip order={order} testID={`sheet-order-firm-${order.revisionNumber}`} />
        <SupersededChip supersededBy={order.supersededBy} testID={`sheet-order-superseded-${order.revisionNumber}`} />
      </View>
      <Text style={styles.meta}>
        Issued {formatDateTime(order.issuedAt)} · checksum <Text style={styles.mono}>{order.checksum}</Text>
      </Text>
      {order.quote ? (
        <Text style={styles.body} testID={`sheet-order-quote-${order.revisionNumber}`}>
          {quoteSentence(order.quote)}
        </Text>
      ) : null}
      {order.shipping ? (
        <Text style={styles.body} testID={`sheet-order-shipping-${order.revisionNumber}`}>
          Shipped by {order.shipping.carrier}, tracking <Text style={styles.mono}>{order.shipping.tracking}</Text>
        </Text>
      ) : null}
      {canMove ? <OrderMoves order={order} side="builder" /> : null}
      <Link href={{ pathname: '/orders/[id]', params: { id: order.id } }} style={styles.link} testID={`open-order-${order.revisionNumber}`}>
        Open the order page
      </Link>
    </View>
  );
}

const styles = StyleSheet.create({
  body: { ...typeScale.body, color: colors.ink },
  meta: { ...typeScale.small, color: colors.inkMuted },
  warn: {
    ...typeScale.body,
    color: colors.ink,
    padding: space.md,
    borderRadius: radius.md,
    borderWidth: 1,
    borderColor: colors.watch,
    backgroundColor: colors.watchSoft,
  },
  label: { ...typeScale.label, color: colors.ink },
  mono: { fontFamily: fonts.mono, color: colors.ink },
  row: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  note: noteInput,
  confirm: { gap: space.md, padding: space.md, borderRadius: radius.md, borderWidth: 1, borderColor: colors.accent, backgroundColor: colors.accentSoft },
  list: { gap: space.md },
  item: { gap: space.sm, padding: space.md, borderRadius: radius.md, borderWidth: 1, borderColor: colors.line },
  itemHead: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', justifyContent: 'space-between', gap: space.sm },
  itemTitle: { fontFamily: fonts.semibold, fontSize: 16, color: colors.ink },
  link: { ...typeScale.label, color: colors.accent, textDecorationLine: 'underline', alignSelf: 'flex-start', paddingVertical: space.xs },
});
