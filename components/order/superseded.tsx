import { StyleSheet, Text, View } from 'react-native';

import { formatDateTime } from '@/constants/format';
import { colors, radius, space, type as typeScale } from '@/constants/theme';
import { orderIsLive, type Order } from '@/shared/orders';
import type { Supersession } from '@/shared/sheets';

import { Chip } from '@/components/ui/chip';

/** "Superseded by rev 3": a revision, or the order that holds it, after a later revision of its sheet was issued. */
export function SupersededChip({ supersededBy, testID }: { supersededBy: Supersession | null; testID?: string }) {
  if (!supersededBy) return null;
  return <Chip label={`Superseded by rev ${supersededBy.number}`} tone="watch" testID={testID} />;
}

/** What a superseded order means for both shops: closed before grinding, or under way on a revision that is no longer the latest. */
export function SupersededNotice({ order, testID }: { order: Order; testID?: string }) {
  const by = order.supersededBy;
  if (!by) return null;
  const closed = !orderIsLive(order);
  return (
    <View style={styles.box} role="alert" testID={testID}>
      <SupersededChip supersededBy={by} />
      <Text style={styles.body}>
        {closed
          ? `Revision ${by.number} of this sheet was issued ${formatDateTime(by.at)}, before grinding began on revision ${order.revisionNumber}. This order is closed: it cannot be quoted or moved. Work from revision ${by.number}.`
          : `Revision ${by.number} of this sheet was issued ${formatDateTime(by.at)}, after grinding began on revision ${order.revisionNumber}. Both shops should agree whether this cam goes on or stops.`}
      </Text>
    </View>
  );
}

const styles = StyleSheet.create({
  box: { gap: space.sm, padding: space.md, borderRadius: radius.md, borderWidth: 1, borderColor: colors.watch, backgroundColor: colors.watchSoft },
  body: { ...typeScale.body, color: colors.ink },
});
