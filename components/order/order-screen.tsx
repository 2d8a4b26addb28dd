import { StyleSheet, Text, useWindowDimensions, View } from 'react-native';

import { Button } from '@/components/ui/button';
import { OrderEvents } from '@/components/order/order-events';
import { ConfirmOrderPanel, FirmnessChip, firmnessText } from '@/components/order/order-firmness';
import { OrderMoves, type OrderSide } from '@/components/order/order-moves';
import { orderSide } from '@/lib/order-side';
import { OrderStageChip } from '@/components/order/order-stage-chip';
import { OrderThread } from '@/components/order/order-thread';
import { ErrorNotice, Pending } from '@/components/ui/query-state';
import { RevisionNotes } from '@/components/sheet/revision-notes';
import { RevisionView } from '@/components/sheet/revision-view';
import { SupersededNotice } from '@/components/order/superseded';
import { Screen, Section, type BackLink } from '@/components/ui/screen';
import { formatDateTime, quoteSentence } from '@/constants/format';
import { breakpoints, colors, fonts, radius, space, type as typeScale } from '@/constants/theme';
import { ApiError } from '@/lib/api';
import { useMeQuery } from '@/hooks/use-me';
import { useOrderQuery } from '@/hooks/use-orders';
import { useSheetQuery } from '@/hooks/use-sheets';
import { firmOnlyStage, orderMoves, orderStageLabels, type OrderDetail } from '@/shared/orders';

export function OrderScreen({ id }: { id: string }) {
  const order = useOrderQuery(id);
  const side = orderSide(useMeQuery().data?.activeShop?.role);
  const back: BackLink | undefined = side === 'grinder' ? { href: '/incoming', label: 'Back to incoming' } : undefined;
  if (order.isPending) return <Pending label="Loading the grind order…" />;
  if (order.isError) {
    const gone = order.error instanceof ApiError && order.error.status === 404;
    return (
      <Screen title="Grind order" back={back}>
        <ErrorNotice
          error={gone ? new Error('This grind order was not sent to or from your shop.') : order.error}
          onRetry={gone ? undefined : () => order.refetch()}
        />
      </Screen>
    );
  }
  return <OrderView order={order.data} side={side} back={back} />;
}

function OrderView({ order, side, back }: { order: OrderDetail; side: OrderSide | null; back?: BackLink }) {
  const wide = useWindowDimensions().width >= breakpoints.wide;
  const r = order.revision;
  const otherSide = side === 'grinder' ? order.repairShop.name : order.grinderShop.name;
  // A request for a quote waits on the firm order before the grinder's wheel: the firmness text says what comes next.
  const waitingOn = orderMoves[order.stage].find((m) => m.by !== side && (order.firm !== null || m.to !== firmOnlyStage));
  const jobId = useSheetQuery(order.sheetId, side === 'builder').data?.jobId;
  const sheetBack = jobId
    ? ({ href: { pathname: '/jobs/[id]/sheets/[sheetId]', params: { id: jobId, sheetId: order.sheetId } }, label: 'Back to the spec sheet' } satisfies BackLink)
    : back;

  const identity = (
    <Section title="What both shops hold">
      <Text style={styles.label}>Checksum</Text>
      <Text style={styles.checksum} selectable testID="order-checksum" aria-label={`Checksum ${order.checksum.split('').join(' ')}`}>
        {order.checksum}
      </Text>
      <Text style={styles.meta}>Read these characters to the other shop: the same checksum means the same revision, value for value.</Text>
      <View style={styles.facts}>
        <Fact label="Revision" value={String(order.revisionNumber)} testID="order-revision" />
        <Fact label="Issued" value={formatDateTime(order.issuedAt)} />
        <Fact label="Repair shop" value={order.repairShop.name} />
        <Fact label="Grinding shop" value={order.grinderShop.name} />
        <Fact label="Vehicle" value={order.vehicle} />
      </View>
      <Button label="Print-ready sheet" variant="secondary" href={{ pathname: '/orders/[id]/print', params: { id: order.id } }} testID="open-print" />
    </Section>
  );

  const stage = (
    <Section title="Stage">
      <View style={styles.chips}>
        <OrderStageChip stage={order.stage} testID="order-stage" />
        <FirmnessChip order={order} testID="order-firmness" />
      </View>
      <Text style={styles.body} testID="order-firmness-text">
        {firmnessText(order, side)}
      </Text>
      <SupersededNotice order={order} testID="order-superseded" />
      {order.quote ? (
        <Text style={styles.body} testID="order-quote">
          {quoteSentence(order.quote)}
        </Text>
      ) : null}
      {order.shipping ? (
        <Text style={styles.body} testID="order-shipping">
          Shipped by {order.shipping.carrier}, tracking <Text style={styles.mono}>{order.shipping.tracking}</Text>
        </Text>
      ) : null}
      {side ? <OrderMoves order={order} side={side} /> : null}
      {side === 'builder' ? <ConfirmOrderPanel order={order} /> : null}
      {waitingOn ? (
        <Text style={styles.meta}>
          Next from {waitingOn.by === 'grinder' ? order.grinderShop.name : order.repairShop.name}: {orderStageLabels[waitingOn.to].toLowerCase()}.
        </Text>
      ) : null}
      {order.stage === 'changes-asked' && side === 'builder' ? (
        <Text style={styles.body}>The grinder asked for changes. Save the sheet with the changes, then issue the new revision.</Text>
      ) : null}
    </Section>
  );

  const spec = (
    <Section title={`Lobe specs, revision ${order.revisionNumber}`}>
      <RevisionView revision={r} />
      <View style={styles.facts}>
        <Fact label="Bore × stroke" value={`${r.engine.bore.toFixed(3)} × ${r.engine.stroke.toFixed(3)} in`} />
        <Fact label="Base circle" value={r.spec.baseCircle === null ? 'grinder to state' : `${r.spec.baseCircle.toFixed(3)} in`} />
      </View>
      <RevisionNotes revision={r} testPrefix="order" />
    </Section>
  );

  const talk = (
    <Section title={`Messages with ${otherSide}`}>
      <OrderThread orderId={order.id} side={side} initial={order.messages} />
    </Section>
  );
  const audit = (
    <Section title="History">
      <OrderEvents events={order.events} />
    </Section>
  );

  return (
    <Screen title={order.sheetTitle} subtitle={`Grind order · revision ${order.revisionNumber} · ${otherSide}`} back={sheetBack} testID="order-screen">
      {wide ? (
        <View style={styles.columns}>
          <View style={[styles.main, styles.stack]}>
            {identity}
            {spec}
          </View>
          <View style={[styles.side, styles.stack]}>
            {stage}
            {talk}
            {audit}
          </View>
        </View>
      ) : (
        <View style={styles.stack}>
          {stage}
          {identity}
          {spec}
          {talk}
          {audit}
        </View>
      )}
    </Screen>
  );
}

function Fact({ label, value, testID }: { label: string; value: string; testID?: string }) {
  return (
    <View style={styles.fact} testID={testID}>
      <Text style={styles.meta}>{label}</Text>
      <Text style={styles.factValue}>{value}</Text>
    </View>
  );
}

const styles = StyleSheet.create({
  chips: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  stack: { gap: space.lg },
  columns: { flexDirection: 'row', gap: space.xl, alignItems: 'flex-start' },
  main: { flex: 3, minWidth: 0 },
  side: { flex: 2, minWidth: 0 },
  label: { ...typeScale.label, color: colors.inkMuted },
  body: { ...typeScale.body, color: colors.ink },
  meta: { ...typeScale.small, color: colors.inkMuted },
  mono: { fontFamily: fonts.mono, color: colors.ink },
  checksum: {
    fontFamily: fonts.monoBold,
    fontSize: 30,
    lineHeight: 38,
    letterSpacing: 3,
    color: colors.ink,
    alignSelf: 'flex-start',
    paddingHorizontal: space.md,
    paddingVertical: space.sm,
    backgroundColor: colors.sunken,
    borderRadius: radius.md,
  },
  facts: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md },
  fact: { minWidth: 140, gap: 2 },
  factValue: { ...typeScale.bodyStrong, color: colors.ink },
});
