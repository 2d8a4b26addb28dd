import { orderStageLabels, type OrderStage } from '@/shared/orders';

import { Chip, type ChipTone } from '@/components/ui/chip';

/** Whose turn it is: waiting on the grinder, something to answer, under way, or done. */
const tone: Record<OrderStage, ChipTone> = {
  sent: 'neutral',
  quoted: 'accent',
  'changes-asked': 'watch',
  grinding: 'accent',
  shipped: 'accent',
  received: 'pass',
  installed: 'pass',
};

/** A grind order's stage as a compact tag, coloured by whose turn it is. */
export function OrderStageChip({ stage, testID }: { stage: OrderStage; testID?: string }) {
  return <Chip label={orderStageLabels[stage]} tone={tone[stage]} testID={testID} />;
}
