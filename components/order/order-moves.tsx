import { useState } from 'react';
import { StyleSheet, Text, View } from 'react-native';

import { centsFromText } from '@/constants/format';
import { colors, fonts, radius, space, type as typeScale } from '@/constants/theme';
import { ApiError } from '@/lib/api';
import { useMoveOrderMutation } from '@/hooks/use-orders';
import { orderMoves, type Order, type OrderMove, type OrderStage } from '@/shared/orders';

import { Button } from '@/components/ui/button';
import { ErrorNotice } from '@/components/ui/query-state';
import { TextField } from '@/components/ui/text-field';

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
  const moves = orderMoves[order.stage].filter((m) => m.by === side);
  const move = useMoveOrderMutation(order.id);
  const [open, setOpen] = useState<OrderStage | null>(null);
  const [price, setPrice] = useState('');
  const [leadTime, setLeadTime] = useState('');
  const [message, setMessage] = useState('');
  const [carrier, setCarrier] = useState('');
  const [tracking, setTracking] = useState('');
  const [local, setLocal] = useState<Record<string, string>>({});

  if (moves.length === 0) return null;
  const serverFields = move.error instanceof ApiError ? move.error.fields : {};
  const fieldError = (key: string) => local[key] ?? serverFields[key];

  const submit = (to: OrderStage) => {
    const errors: Record<string, string> = {};
    const body: OrderMove = { version: order.version, to };
    if (to === 'quoted') {
      const priceCents = centsFromText(price);
      const days = Number(leadTime);
      if (!Number.isFinite(priceCents)) errors['quote.priceCents'] = 'Enter the price in dollars, like 485.00';
      if (!leadTime.trim() || !Number.isInteger(days) || days < 0 || days > 365) errors['quote.leadTimeDays'] = 'Enter the lead time as whole days, 0 to 365';
      body.quote = { priceCents, leadTimeDays: days };
      if (message.trim()) body.message = message.trim();
    }
    if (to === 'changes-asked') {
      if (!message.trim()) errors.message = 'Say what should change on the sheet';
      body.message = message.trim();
    }
    if (to === 'shipped') {
      if (!carrier.trim()) errors['shipping.carrier'] = 'Name the carrier';
      if (!tracking.trim()) errors['shipping.tracking'] = 'Enter the tracking text';
      body.shipping = { carrier: carrier.trim(), tracking: tracking.trim() };
      if (message.trim()) body.message = message.trim();
    }
    setLocal(errors);
    if (Object.keys(errors).length > 0) return;
    move.mutate(body, {
      onSuccess: () => {
        setOpen(null);
        setMessage('');
      },
    });
  };

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
              setLocal({});
              if (needsForm[m.to]) setOpen(m.to);
              else submit(m.to);
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
              <TextField label="Price" unit="USD" value={price} onChangeText={setPrice} inputMode="decimal" error={fieldError('quote.priceCents')} testID="quote-price" />
              <TextField label="Lead time" unit="days" value={leadTime} onChangeText={setLeadTime} inputMode="numeric" error={fieldError('quote.leadTimeDays')} testID="quote-lead-time" />
            </>
          ) : null}
          {open === 'shipped' ? (
            <>
              <TextField label="Carrier" value={carrier} onChangeText={setCarrier} error={fieldError('shipping.carrier')} testID="ship-carrier" />
              <TextField label="Tracking" value={tracking} onChangeText={setTracking} error={fieldError('shipping.tracking')} testID="ship-tracking" />
            </>
          ) : null}
          <TextField
            label={open === 'changes-asked' ? 'What should change' : 'Message to the shop (optional)'}
            value={message}
            onChangeText={setMessage}
            multiline
            error={fieldError('message')}
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
