import { StyleSheet, Text } from 'react-native';

import { colors, fonts, radius, space } from '@/constants/theme';
import { orderStageLabels, type OrderStage } from '@/shared/orders';

const tone: Record<OrderStage, 'waiting' | 'attention' | 'moving' | 'done'> = {
  sent: 'waiting',
  quoted: 'moving',
  'changes-asked': 'attention',
  grinding: 'moving',
  shipped: 'moving',
  received: 'done',
  installed: 'done',
};

/** A grind order's stage as a compact tag, coloured by whose turn it is. */
export function OrderStageChip({ stage, testID }: { stage: OrderStage; testID?: string }) {
  return (
    <Text style={[styles.chip, styles[tone[stage]]]} testID={testID}>
      {orderStageLabels[stage]}
    </Text>
  );
}

const styles = StyleSheet.create({
  chip: {
    alignSelf: 'flex-start',
    flexShrink: 0,
    fontFamily: fonts.semibold,
    fontSize: 13,
    paddingHorizontal: space.sm,
    paddingVertical: 2,
    borderRadius: radius.pill,
    overflow: 'hidden',
  },
  waiting: { color: colors.ink, backgroundColor: colors.sunken },
  attention: { color: colors.watch, backgroundColor: colors.watchSoft },
  moving: { color: colors.accent, backgroundColor: colors.accentSoft },
  done: { color: colors.pass, backgroundColor: colors.passSoft },
});
