import { useState } from 'react';
import { Pressable, StyleSheet, Text, useWindowDimensions, View } from 'react-native';

import { Button } from '@/components/ui/button';
import { MailHtml } from '@/components/mailbox/mail-html';
import { EmptyState, ErrorNotice, Pending } from '@/components/ui/query-state';
import { Screen, Section } from '@/components/ui/screen';
import { formatDateTime } from '@/constants/format';
import { breakpoints, colors, fonts, radius, space, type as typeScale } from '@/constants/theme';
import { useOutboxMessageQuery, useOutboxQuery } from '@/hooks/use-outbox';
import type { OutboxMessage } from '@/shared/orders';

/** Development only: the e-mails Lobewright would have sent, kept by the local transport. */
export function MailboxScreen() {
  const outbox = useOutboxQuery();
  const wide = useWindowDimensions().width >= breakpoints.wide;
  const [openId, setOpenId] = useState<string | null>(null);
  const messages = outbox.data ?? [];

  const list = (
    <Section title={`Outbox (${messages.length})`}>
      {outbox.isPending ? <Pending label="Loading the outbox…" /> : null}
      {outbox.isError ? <ErrorNotice error={outbox.error} onRetry={() => outbox.refetch()} /> : null}
      {outbox.data === null ? <EmptyState title="This server keeps no outbox: mail goes out for real." /> : null}
      {outbox.data && messages.length === 0 ? (
        <EmptyState title="No mail yet">
          <Text style={styles.body}>
            Mail addressed to you lands here: an issued sheet for a grinder; a quote, a change request or a shipment for a builder; a verification or reset
            link.
          </Text>
        </EmptyState>
      ) : null}
      {messages.length > 0 ? (
        <View role="list" style={styles.list} testID="outbox-list">
          {messages.map((m) => (
            <MailRow key={m.id} message={m} active={m.id === openId} onOpen={() => setOpenId(m.id)} />
          ))}
        </View>
      ) : null}
      <Button label="Check for new mail" variant="secondary" busy={outbox.isFetching} onPress={() => outbox.refetch()} testID="outbox-refresh" />
    </Section>
  );
  const reader = openId ? <MailReader id={openId} onClose={wide ? undefined : () => setOpenId(null)} /> : null;

  return (
    <Screen title="Dev mailbox" subtitle="Mail kept by the local transport. Not shown in production builds." testID="mailbox-screen">
      {wide ? (
        <View style={styles.columns}>
          <View style={styles.side}>{list}</View>
          <View style={styles.main}>
            {reader ?? (
              <EmptyState title="Choose a message">
                <Text style={styles.body}>Its plain-text part and its HTML part open here.</Text>
              </EmptyState>
            )}
          </View>
        </View>
      ) : (
        (reader ?? list)
      )}
    </Screen>
  );
}

function MailRow({ message, active, onOpen }: { message: OutboxMessage; active: boolean; onOpen: () => void }) {
  return (
    <View role="listitem">
      <Pressable role="button" onPress={onOpen} style={[styles.row, active && styles.rowActive]} testID={`outbox-${message.id}`}>
        <Text style={styles.subject}>{message.subject}</Text>
        <Text style={styles.meta}>
          To {message.to} · {formatDateTime(message.createdAt)}
        </Text>
      </Pressable>
    </View>
  );
}

function MailReader({ id, onClose }: { id: string; onClose?: () => void }) {
  const message = useOutboxMessageQuery(id);
  return (
    <Section title={message.data?.subject ?? 'Message'}>
      {onClose ? <Button label="Back to the outbox" variant="quiet" onPress={onClose} testID="mail-close" /> : null}
      {message.isPending ? <Pending label="Opening the message…" /> : null}
      {message.isError ? <ErrorNotice error={message.error} onRetry={() => message.refetch()} /> : null}
      {message.data ? (
        <View style={styles.reader} testID="mail-reader">
          <Text style={styles.meta}>
            To {message.data.to} · {formatDateTime(message.data.createdAt)}
          </Text>
          <Text style={styles.label}>Plain-text part</Text>
          <Text style={styles.text} selectable testID="mail-text">
            {message.data.text}
          </Text>
          <Text style={styles.label}>HTML part</Text>
          <MailHtml html={message.data.html} title={`HTML part of “${message.data.subject}”`} />
        </View>
      ) : null}
    </Section>
  );
}

const styles = StyleSheet.create({
  columns: { flexDirection: 'row', gap: space.xl, alignItems: 'flex-start' },
  side: { flex: 2, minWidth: 0 },
  main: { flex: 3, minWidth: 0 },
  list: { gap: space.sm },
  row: { gap: 2, padding: space.md, borderRadius: radius.md, borderWidth: 1, borderColor: colors.line, backgroundColor: colors.surface },
  rowActive: { borderColor: colors.accent, backgroundColor: colors.accentSoft },
  subject: { fontFamily: fonts.semibold, fontSize: 15, color: colors.ink },
  meta: { ...typeScale.small, color: colors.inkMuted },
  label: { ...typeScale.label, color: colors.inkMuted },
  body: { ...typeScale.body, color: colors.ink },
  reader: { gap: space.sm },
  text: { fontFamily: fonts.mono, fontSize: 13, lineHeight: 19, color: colors.ink, backgroundColor: colors.sunken, padding: space.md, borderRadius: radius.md },
});
