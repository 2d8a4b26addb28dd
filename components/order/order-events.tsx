import { StyleSheet, Text, View } from 'react-native';

import { formatDateTime } from '@/constants/format';
import { colors, fonts, space, type as typeScale } from '@/constants/theme';
import { orderStageLabels, orderStages, type OrderEvent, type OrderStage } from '@/shared/orders';

const isStage = (v: unknown): v is OrderStage => typeof v === 'string' && (orderStages as readonly string[]).includes(v);

/** One audit entry in plain words: the stage it moved to when the detail says so, else the action's own name. */
function describe(event: OrderEvent): string {
  const to = event.detail?.to;
  if (isStage(to)) return orderStageLabels[to];
  if (event.action === 'issue') return orderStageLabels.sent;
  const by = event.detail?.by;
  if (event.action === 'supersede' && typeof by === 'number') return `Superseded by revision ${by}`;
  if (event.action === 'confirm') {
    const reason = event.detail?.reason;
    return by === 'owner' ? 'Firm order: the owner approved' : `Firm order without the owner: ${typeof reason === 'string' ? reason : ''}`;
  }
  return event.action.replace(/[._-]+/g, ' ').replace(/^\w/, (c) => c.toUpperCase());
}

/** The order's audit trail, oldest first: every issue and every move, with who and when. */
export function OrderEvents({ events }: { events: OrderEvent[] }) {
  if (events.length === 0) return <Text style={styles.meta}>Nothing recorded yet.</Text>;
  return (
    <View role="list" style={styles.list} testID="order-events">
      {events.map((e) => (
        <View key={e.id} role="listitem" style={styles.item}>
          <View style={styles.dot} />
          <View style={styles.grow}>
            <Text style={styles.what}>{describe(e)}</Text>
            <Text style={styles.meta}>
              {e.by} · {formatDateTime(e.at)}
            </Text>
          </View>
        </View>
      ))}
    </View>
  );
}

const styles = StyleSheet.create({
  list: { gap: space.sm },
  item: { flexDirection: 'row', gap: space.sm, alignItems: 'flex-start' },
  dot: { width: 10, height: 10, borderRadius: 5, marginTop: 6, backgroundColor: colors.accent },
  grow: { flex: 1, gap: 2 },
  what: { fontFamily: fonts.medium, fontSize: 15, color: colors.ink },
  meta: { ...typeScale.small, color: colors.inkMuted },
});
