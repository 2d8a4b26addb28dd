import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { StyleSheet, Text, View } from 'react-native';

import { colors, fonts, radius, space, type as typeScale } from '@/constants/theme';
import { useMoveOrderMutation } from '@/hooks/use-orders';
import { blankMove, moveFieldPaths, moveRules, quoteNumberSpecs, type MoveDraft } from '@/lib/order-move-fields';
import { firmOnlyStage, orderIsLive, orderMoves, type Order, type OrderMove, type OrderStage } from '@/shared/orders';
import { calcUnits } from '@/state/units';

import { Button } from '@/components/ui/button';
import { applyServerErrors, FormField } from '@/components/ui/form-field';
import { DraftField, draftResolver } from '@/components/ui/number-field';
import { ErrorNotice } from '@/components/ui/query-state';

export type OrderSide = 'builder' | 'grinder';

/** What each move's button says, in the words of the side that makes it. */
const moveLabels: Record<OrderStage, string> = {
  sent: 'Send',
  quoted: 'Accept and quote',
  'changes-asked': 'Ask for changes',
  grinding: 'Start grinding',
  shipped: 'Mark shipped',
  received: 'Mark received',
  installed: 'Mark installed',
};

/** Moves that need more than a press open a short form first. */
const needsForm: Partial<Record<OrderStage, true>> = { quoted: true, 'changes-asked': true, shipped: true };

/** The moves this side may make from the order's stage, as buttons, with the form each one needs. */
export function OrderMoves({ order, side }: { order: Order; side: OrderSide }) {
  // A superseded order that had not reached the grinder's wheel is closed: the server refuses every move on it.
  // A request for a quote is never ground: the grinding move waits for the firm order (the server refuses it too).
  const moves = orderIsLive(order) ? orderMoves[order.stage].filter((m) => m.by === side && (order.firm !== null || m.to !== firmOnlyStage)) : [];
  const move = useMoveOrderMutation(order.id);
  const [open, setOpen] = useState<OrderStage | null>(null);
  // Rebuilt each render, so the form open now decides what the next submit checks (money and days need no unit toggle).
  // With no form open nothing is submitted through the form; moves without one send their body directly.
  const rules = moveRules(order.version, open ?? 'quoted');
  const { control, handleSubmit, setError, clearErrors, resetField } = useForm<MoveDraft, unknown, OrderMove>({
    defaultValues: blankMove(),
    resolver: draftResolver<MoveDraft, OrderMove>(rules.specs, rules.schema, rules.others, calcUnits),
  });

  if (moves.length === 0) return null;

  // The notice below says the server's answer; its field messages also land on their fields.
  const send = (body: OrderMove) =>
    move.mutate(body, {
      onSuccess: () => {
        setOpen(null);
        resetField('message');
      },
      onError: (error) => void applyServerErrors(error, setError, moveFieldPaths),
    });
  const submit = handleSubmit(send);

  return (
    <View style={styles.stack} testID="order-moves">
      <View style={styles.row}>
        {moves.map((m) => (
          <Button
            key={m.to}
            label={moveLabels[m.to]}
            variant={m.to === 'changes-asked' ? 'secondary' : 'primary'}
            busy={move.isPending && open === null && move.variables?.to === m.to}
            disabled={move.isPending || open === m.to}
            onPress={() => {
              move.reset();
              clearErrors();
              if (needsForm[m.to]) setOpen(m.to);
              else send({ version: order.version, to: m.to });
            }}
            testID={`move-${m.to}`}
          />
        ))}
      </View>
      {open ? (
        <View style={styles.form} testID={`move-form-${open}`}>
          <Text style={styles.formTitle}>{moveLabels[open]}</Text>
          {open === 'quoted' ? (
            <>
              <DraftField control={control} spec={quoteNumberSpecs.price} units={calcUnits} testPrefix="quote" testID="quote-price" />
              <DraftField control={control} spec={quoteNumberSpecs.leadTime} units={calcUnits} testPrefix="quote" testID="quote-lead-time" />
            </>
          ) : null}
          {open === 'shipped' ? (
            <>
              <FormField control={control} name="shipping.carrier" label="Carrier" testID="ship-carrier" />
              <FormField control={control} name="shipping.tracking" label="Tracking" testID="ship-tracking" />
            </>
          ) : null}
          <FormField
            control={control}
            name="message"
            label={open === 'changes-asked' ? 'What should change' : 'Message to the shop (optional)'}
            multiline
            hint={open === 'changes-asked' ? 'The builder saves a new revision and issues it again.' : undefined}
            testID="move-message"
          />
          {move.isError ? <ErrorNotice error={move.error} /> : null}
          <View style={styles.row}>
            <Button label={`Confirm: ${moveLabels[open].toLowerCase()}`} busy={move.isPending} onPress={() => void submit()} testID={`confirm-${open}`} />
            <Button label="Cancel" variant="quiet" disabled={move.isPending} onPress={() => setOpen(null)} testID="cancel-move" />
          </View>
        </View>
      ) : move.isError ? (
        <ErrorNotice error={move.error} />
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  stack: { gap: space.md },
  row: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  form: { gap: space.md, padding: space.md, borderWidth: 1, borderColor: colors.line, borderRadius: radius.md, backgroundColor: colors.paper },
  formTitle: { ...typeScale.bodyStrong, fontFamily: fonts.semibold, color: colors.ink },
});
