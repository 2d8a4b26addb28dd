import { useState } from 'react';
import { StyleSheet, Text, View } from 'react-native';

import { formatDateTime } from '@/constants/format';
import { colors, fonts, radius, space, type as typeScale } from '@/constants/theme';
import { ApiError } from '@/lib/api';
import { useOrderMessagesQuery, useSendMessageMutation } from '@/hooks/use-orders';
import type { OrderMessage } from '@/shared/orders';

import { Button } from '@/components/ui/button';
import type { OrderSide } from '@/components/order/order-moves';
import { EmptyState, ErrorNotice, Pending } from '@/components/ui/query-state';
import { TextField } from '@/components/ui/text-field';

/** The conversation between the repair shop and the grinding shop on one order, with a composer. */
export function OrderThread({ orderId, side, initial }: { orderId: string; side: OrderSide | null; initial: OrderMessage[] }) {
  const messages = useOrderMessagesQuery(orderId);
  const send = useSendMessageMutation(orderId);
  const [body, setBody] = useState('');
  const list = messages.data ?? initial;
  const fieldError = send.error instanceof ApiError ? send.error.fields.body : undefined;

  return (
    <View style={styles.stack}>
      {messages.isPending && initial.length === 0 ? <Pending label="Loading messages…" /> : null}
      {messages.isError ? <ErrorNotice error={messages.error} onRetry={() => messages.refetch()} /> : null}
      {list.length === 0 && !messages.isPending ? (
        <EmptyState title="No messages yet">
          <Text style={styles.meta}>Questions about the spec, the core or delivery go here, and both shops see them.</Text>
        </EmptyState>
      ) : (
        <View role="list" style={styles.list} testID="order-messages">
          {list.map((m) => {
            const mine = side !== null && m.author.side === side;
            return (
              <View key={m.id} role="listitem" style={[styles.bubble, mine ? styles.mine : styles.theirs]} testID="order-message">
                <Text style={styles.author}>
                  {m.author.name} · {m.author.shopName}
                </Text>
                <Text style={styles.body}>{m.body}</Text>
                <Text style={styles.meta}>{formatDateTime(m.createdAt)}</Text>
              </View>
            );
          })}
        </View>
      )}
      {side ? (
        <View style={styles.composer}>
          <TextField
            label={side === 'grinder' ? 'Message to the repair shop' : 'Message to the grinder'}
            value={body}
            onChangeText={setBody}
            multiline
            error={fieldError}
            testID="message-body"
          />
          {send.isError && !fieldError ? <ErrorNotice error={send.error} /> : null}
          <Button
            label="Send message"
            busy={send.isPending}
            disabled={body.trim().length === 0}
            onPress={() => send.mutate({ body }, { onSuccess: () => setBody('') })}
            testID="message-send"
          />
        </View>
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  stack: { gap: space.md },
  list: { gap: space.sm },
  bubble: { gap: 2, padding: space.md, borderRadius: radius.md, borderWidth: 1, maxWidth: '92%' },
  mine: { alignSelf: 'flex-end', backgroundColor: colors.accentSoft, borderColor: colors.accent },
  theirs: { alignSelf: 'flex-start', backgroundColor: colors.surface, borderColor: colors.line },
  author: { fontFamily: fonts.semibold, fontSize: 14, color: colors.ink },
  body: { ...typeScale.body, color: colors.ink },
  meta: { ...typeScale.small, color: colors.inkMuted },
  composer: { gap: space.sm },
});
