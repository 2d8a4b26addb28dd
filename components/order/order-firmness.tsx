import { useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { space } from '@/constants/theme';
import { useConfirmOrderMutation } from '@/hooks/use-orders';
import { confirmableStages, orderIsLive, type Order } from '@/shared/orders';

import { Button } from '@/components/ui/button';
import { Chip } from '@/components/ui/chip';
import { ErrorNotice } from '@/components/ui/query-state';
import { TextField } from '@/components/ui/text-field';

/** "Firm order" or "Request for a quote": whether the grinder may grind this revision. */
export function FirmnessChip({ order, testID }: { order: Pick<Order, 'firm'>; testID?: string }) {
  return order.firm ? <Chip label="Firm order" tone="confirmed" testID={testID} /> : <Chip label="Request for a quote" tone="neutral" testID={testID} />;
}

/** What firmness means on the order page, in words for the side reading it. */
export function firmnessText(order: Order, side: 'builder' | 'grinder' | null): string {
  if (order.firm?.by === 'owner') return 'Firm order: the vehicle owner approved this revision. It is the one revision of this job to grind.';
  if (order.firm) return `Firm order: ${order.repairShop.name} confirmed it without the owner’s approval. Their reason: ${order.firm.reason ?? ''}`;
  return side === 'grinder'
    ? `Request for a quote: quote it, but do not grind it until the owner approves it or ${order.repairShop.name} confirms it.`
    : 'Request for a quote: the grinder can quote it but not grind it. It becomes the firm order when the owner approves this revision, or when you confirm it here.';
}

/** The builder confirms a request for a quote as the firm order without the owner's approval, with a reason for the record. */
export function ConfirmOrderPanel({ order }: { order: Order }) {
  const confirm = useConfirmOrderMutation(order.id);
  const [reason, setReason] = useState('');
  if (order.firm || !orderIsLive(order) || !confirmableStages.includes(order.stage)) return null;
  return (
    <View style={styles.stack} testID="confirm-order">
      <TextField
        label="Go ahead without the owner: why?"
        value={reason}
        onChangeText={setReason}
        multiline
        hint="The reason is kept with the order and in its history. Skip this if the owner will approve: their approval makes it firm."
        testID="confirm-reason"
      />
      {confirm.isError ? <ErrorNotice error={confirm.error} /> : null}
      <Button
        label="Confirm as the firm order"
        variant="secondary"
        busy={confirm.isPending}
        onPress={() => confirm.mutate({ version: order.version, reason })}
        testID="confirm-order-submit"
      />
    </View>
  );
}

const styles = StyleSheet.create({
  stack: { gap: space.sm },
});
