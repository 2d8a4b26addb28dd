import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { StyleSheet, Text, View } from 'react-native';
import { z } from 'zod';

import { colors, fonts, radius, space, type as typeScale } from '@/constants/theme';
import { ApiError } from '@/lib/api';
import { centsFromText } from '@/lib/number-draft';
import { useMoveOrderMutation } from '@/hooks/use-orders';
import { orderIsLive, orderMoves, type Order, type OrderMove, type OrderStage } from '@/shared/orders';

import { Button } from '@/components/ui/button';
import { ErrorNotice } from '@/components/ui/query-state';
import { FormField } from '@/components/ui/form-field';

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

type MoveForm = { price: string; leadTime: string; message: string; carrier: string; tracking: string };
const emptyForm: MoveForm = { price: '', leadTime: '', message: '', carrier: '', tracking: '' };

/** Where the server's field names land on this form. */
const formField: Record<string, keyof MoveForm> = {
  'quote.priceCents': 'price',
  'quote.leadTimeDays': 'leadTime',
  message: 'message',
  'shipping.carrier': 'carrier',
  'shipping.tracking': 'tracking',
};

/** What a move's form must hold before it is sent, field by field (the server checks the same again). */
function moveFormSchema(to: OrderStage | null) {
  return z.object({ price: z.string(), leadTime: z.string(), message: z.string(), carrier: z.string(), tracking: z.string() }).superRefine((v, ctx) => {
    const need = (ok: boolean, path: keyof MoveForm, message: string) => {
      if (!ok) ctx.addIssue({ code: 'custom', path: [path], message });
    };
    if (to === 'quoted') {
      const days = Number(v.leadTime);
      need(Number.isFinite(centsFromText(v.price)), 'price', 'Enter the price in dollars, like 485.00');
      need(v.leadTime.trim() !== '' && Number.isInteger(days) && days >= 0 && days <= 365, 'leadTime', 'Enter the lead time as whole days, 0 to 365');
    }
    if (to === 'changes-asked') need(v.message.trim() !== '', 'message', 'Say what should change on the sheet');
    if (to === 'shipped') {
      need(v.carrier.trim() !== '', 'carrier', 'Name the carrier');
      need(v.tracking.trim() !== '', 'tracking', 'Enter the tracking text');
    }
  });
}

/** The request body of a move from its checked form. */
function moveBody(order: Order, to: OrderStage, v: MoveForm): OrderMove {
  const message = v.message.trim();
  const body: OrderMove = { version: order.version, to };
  if (to === 'quoted') body.quote = { priceCents: centsFromText(v.price), leadTimeDays: Number(v.leadTime) };
  if (to === 'shipped') body.shipping = { carrier: v.carrier.trim(), tracking: v.tracking.trim() };
  if (message || to === 'changes-asked') body.message = message;
  return body;
}

/** The moves this side may make from the order's stage, as buttons, with the form each one needs. */
export function OrderMoves({ order, side }: { order: Order; side: OrderSide }) {
  // A superseded order that had not reached the grinder's wheel is closed: the server refuses every move on it.
  const moves = orderIsLive(order) ? orderMoves[order.stage].filter((m) => m.by === side) : [];
  const move = useMoveOrderMutation(order.id);
  const [open, setOpen] = useState<OrderStage | null>(null);
  const { control, handleSubmit, setError, clearErrors, resetField } = useForm<MoveForm>({
    defaultValues: emptyForm,
    resolver: (values, context, options) => zodResolver(moveFormSchema(open))(values, context, options),
  });

  if (moves.length === 0) return null;

  const send = (to: OrderStage, values: MoveForm) =>
    move.mutate(moveBody(order, to, values), {
      onSuccess: () => {
        setOpen(null);
        resetField('message');
      },
      onError: (error) => {
        if (!(error instanceof ApiError)) return;
        for (const [field, message] of Object.entries(error.fields)) {
          const name = formField[field];
          if (name) setError(name, { type: 'server', message });
        }
      },
    });
  const submit = (to: OrderStage) => handleSubmit((values) => send(to, values))();

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
              else send(m.to, emptyForm);
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
              <FormField control={control} name="price" label="Price" unit="USD" keyboardType="decimal-pad" testID="quote-price" />
              <FormField control={control} name="leadTime" label="Lead time" unit="days" keyboardType="numeric" testID="quote-lead-time" />
            </>
          ) : null}
          {open === 'shipped' ? (
            <>
              <FormField control={control} name="carrier" label="Carrier" testID="ship-carrier" />
              <FormField control={control} name="tracking" label="Tracking" testID="ship-tracking" />
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
            <Button label={`Confirm: ${moveLabels[open].toLowerCase()}`} busy={move.isPending} onPress={() => submit(open)} testID={`confirm-${open}`} />
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
