import { useState } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import { Pressable, StyleSheet, Text, View } from 'react-native';

import { formatCents, formatDateTime } from '@/constants/format';
import { colors, fonts, radius, space } from '@/constants/theme';
import { ApiError } from '@/lib/api';
import { openPaymentPage } from '@/lib/payment-page';
import { useStartDepositMutation } from '@/hooks/use-deposits';
import { invalidateOwnerView, useApproveMutation } from '@/hooks/use-owner-page';
import { ownerUpdatingText, type OwnerView, type OwnerViewOption } from '@/shared/owner';

import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/text-field';
import { ownerType } from '@/components/owner/owner-type';

/** Approve the chosen option (name + a tick), then pay the deposit; shows what is already done. */
export function OwnerDecision({ base, view, chosen }: { base: string; view: OwnerView; chosen: OwnerViewOption | undefined }) {
  const approve = useApproveMutation(base);
  const deposit = useStartDepositMutation(base);
  const [name, setName] = useState(view.customerName.replace(/\s*\(demo\)$/, ''));
  const [agree, setAgree] = useState(false);
  const queryClient = useQueryClient();
  const fields = approve.error instanceof ApiError ? approve.error.fields : {};
  // The shop changed the offer after this page was read: show it again before anything is approved.
  const offerChanged = approve.error instanceof ApiError && approve.error.code === 'offer_changed';
  const money = (cents: number) => formatCents(cents, view.currency);
  const reload = () => {
    approve.reset();
    void invalidateOwnerView(queryClient, base);
  };

  if (view.approval) {
    const paid = view.payment?.state === 'paid' ? view.payment : null;
    const depositCents = view.approval.depositCents;
    return (
      <View style={styles.box} testID="owner-decision">
        <Text role="heading" aria-level={2} style={styles.heading}>
          Your decision
        </Text>
        <Text style={styles.body} testID="owner-approved">
          {view.approval.name} approved “{view.approval.optionTitle}” on {formatDateTime(view.approval.at)}.
        </Text>
        <Text style={styles.small}>
          The shop grinds exactly the sheet you approved: checksum <Text style={styles.mono}>{view.approval.checksum}</Text>.
        </Text>
        {paid ? (
          <View style={styles.paid} role="status" testID="deposit-paid">
            <Text style={styles.paidTitle}>Deposit paid</Text>
            <Text style={styles.paidBody}>
              {formatCents(paid.amountCents, paid.currency)} on {formatDateTime(paid.paidAt!)}. Thank you; the shop has been told.
            </Text>
          </View>
        ) : depositCents > 0 && !view.depositsOn ? (
          <Text style={styles.body} testID="deposit-in-person">
            The deposit of {money(depositCents)} is paid at the shop: card payments are not taken on this page. Call the shop to arrange it.
          </Text>
        ) : depositCents > 0 ? (
          <>
            <Text style={styles.body}>To start the work, pay the deposit of {money(depositCents)}. The rest is due when the engine is back together.</Text>
            <Button
              label={`Pay the ${money(depositCents)} deposit`}
              busy={deposit.isPending}
              onPress={() => deposit.mutate(undefined, { onSuccess: ({ url }) => openPaymentPage(url) })}
              testID="pay-deposit"
            />
            {deposit.error ? (
              <Text role="alert" style={styles.error}>
                {deposit.error.message}
              </Text>
            ) : null}
          </>
        ) : (
          <Text style={styles.body}>The shop asks no deposit for this option.</Text>
        )}
      </View>
    );
  }

  return (
    <View style={styles.box} testID="owner-decision">
      <Text role="heading" aria-level={2} style={styles.heading}>
        Approve an option
      </Text>
      {view.withdrawn ? (
        <Text style={styles.body} role="alert" testID="owner-withdrawn">
          Please approve again. Your approval of “{view.withdrawn.optionTitle}” was withdrawn on {formatDateTime(view.withdrawn.at)}, before any metal was cut:{' '}
          {view.withdrawn.reason} Nothing is ground until you approve the option as it is now. A deposit you already paid counts toward it.
        </Text>
      ) : null}
      {chosen ? (
        <Text style={styles.body} testID="owner-chosen">
          You chose “{chosen.title}”: {money(chosen.priceCents)}, with a {money(chosen.depositCents)} deposit, ready in about {chosen.leadTimeDays} days.
        </Text>
      ) : (
        <Text style={styles.body}>Choose one of the options above first.</Text>
      )}
      {chosen?.updating ? (
        <Text role="alert" style={styles.error} testID="owner-option-updating">
          {ownerUpdatingText(chosen.updating)}
        </Text>
      ) : null}
      <TextField label="Your name" value={name} onChangeText={setName} autoComplete="name" error={fields.name} testID="approver-name" />
      <Pressable
        role="checkbox"
        aria-checked={agree}
        onPress={() => setAgree((a) => !a)}
        style={styles.agree}
        testID="approve-agree"
        accessibilityLabel="I approve this option and its price, and I have read the cautions"
      >
        <View style={[styles.tick, agree && styles.tickOn]}>{agree ? <Text style={styles.tickMark}>✓</Text> : null}</View>
        <Text style={styles.agreeText}>I approve this option and its price, and I have read the cautions.</Text>
      </Pressable>
      {fields.agree ? (
        <Text role="alert" style={styles.error}>
          {fields.agree}
        </Text>
      ) : null}
      <Button
        label="Approve"
        busy={approve.isPending}
        disabled={!chosen || offerChanged || chosen.updating !== null}
        onPress={() => chosen && approve.mutate({ optionId: chosen.id, checksum: chosen.checksum, offer: chosen.offer, name, agree: agree as true })}
        testID="approve"
      />
      {offerChanged ? (
        <View role="alert" style={styles.changed} testID="offer-changed">
          <Text style={styles.changedText}>{approve.error!.message}</Text>
          <Button label="Show the shop's new offer" variant="secondary" onPress={reload} testID="offer-reload" />
        </View>
      ) : approve.error && !Object.keys(fields).length ? (
        <Text role="alert" style={styles.error}>
          {approve.error.message}
        </Text>
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  box: { gap: space.md, padding: space.lg, borderRadius: radius.lg, borderWidth: 2, borderColor: colors.ink, backgroundColor: colors.surface },
  heading: { ...ownerType.heading, color: colors.ink },
  body: { ...ownerType.body, color: colors.ink },
  small: { ...ownerType.small, color: colors.inkMuted },
  mono: { fontFamily: fonts.mono },
  error: { ...ownerType.body, color: colors.fail },
  changed: { gap: space.md, padding: space.md, borderRadius: radius.md, borderWidth: 2, borderColor: colors.fail, backgroundColor: colors.failSoft },
  changedText: { ...ownerType.body, color: colors.ink },
  agree: { flexDirection: 'row', alignItems: 'center', gap: space.md, minHeight: 56 },
  tick: {
    width: 30,
    height: 30,
    borderRadius: radius.sm,
    borderWidth: 3,
    borderColor: colors.ink,
    alignItems: 'center',
    justifyContent: 'center',
    backgroundColor: colors.surface,
  },
  tickOn: { backgroundColor: colors.accent, borderColor: colors.accent },
  tickMark: { color: colors.accentInk, fontFamily: fonts.bold, fontSize: 20, lineHeight: 22 },
  agreeText: { ...ownerType.body, color: colors.ink, flexShrink: 1 },
  paid: { gap: space.xs, padding: space.lg, borderRadius: radius.md, backgroundColor: colors.passSoft, borderLeftWidth: 6, borderLeftColor: colors.pass },
  paidTitle: { ...ownerType.heading, color: colors.pass },
  paidBody: { ...ownerType.body, color: colors.ink },
});
