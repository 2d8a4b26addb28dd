import { Stack, useLocalSearchParams, useRouter } from 'expo-router';
import { useEffect, useRef, useState } from 'react';
import { Image, ScrollView, StyleSheet, Text, View } from 'react-native';

import { formatCents } from '@/constants/format';
import { colors, radius, space } from '@/constants/theme';
import { useConfirmDepositMutation } from '@/hooks/use-deposits';
import { useOwnerViewQuery } from '@/hooks/use-owner-page';

import { OwnerDecision } from '@/components/owner/owner-decision';
import { OwnerOptionCard } from '@/components/owner/owner-option-card';
import { ownerType } from '@/components/owner/owner-type';
import { ErrorNotice, Pending } from '@/components/ui/query-state';

/**
 * The owner's summary, opened from a share link with no account: what failed,
 * the options with prices and plain-words comparisons, the cautions, approval
 * and the deposit. Large type and strong contrast for a phone held outdoors.
 */
export function OwnerSummary({ base }: { base: string }) {
  const { deposit } = useLocalSearchParams<{ deposit?: string }>();
  const router = useRouter();
  const view = useOwnerViewQuery(base);
  const confirm = useConfirmDepositMutation(base);
  const [chosenId, setChosenId] = useState<string | null>(null);
  const confirmed = useRef(false);

  // Back from the payment page: check the session once, then drop it from the address.
  useEffect(() => {
    if (!deposit || confirmed.current) return;
    confirmed.current = true;
    confirm.mutate(deposit, { onSettled: () => router.setParams({ deposit: undefined }) });
  }, [deposit, confirm, router]);

  if (view.isPending) return <Pending label="Opening your summary…" />;
  if (view.isError) {
    return (
      <ScrollView style={styles.scroll} contentContainerStyle={styles.content}>
        <Stack.Screen options={{ title: 'Summary not available' }} />
        <ErrorNotice error={view.error} />
      </ScrollView>
    );
  }
  const v = view.data;
  const reference = v.options[0];
  const chosen = v.options.find((o) => o.id === (v.approval?.optionId ?? chosenId));
  return (
    // Focusable so the page scrolls from the keyboard even when nothing on it is left to press.
    <ScrollView style={styles.scroll} contentContainerStyle={styles.content} testID="owner-summary" tabIndex={0} aria-label="Your summary">
      <Stack.Screen options={{ title: `Your ${v.vehicle}` }} />
      <View style={styles.page}>
        <View style={styles.header}>
          <Text style={styles.shop}>{v.shopName}</Text>
          <Text role="heading" aria-level={1} style={styles.title}>
            Your {v.vehicle}
          </Text>
          <Text style={styles.small}>
            Prepared for {v.customerName}. This page works until {new Date(v.expiresAt).toLocaleDateString('en-US', { dateStyle: 'long' })}.
          </Text>
        </View>
        {confirm.isPending ? <Pending label="Checking your payment…" /> : null}
        {v.approval ? (
          <Text style={styles.banner} role="status" testID="owner-status-top">
            {v.payment?.state === 'paid'
              ? `You approved “${v.approval.optionTitle}” and paid the ${formatCents(v.payment.amountCents, v.payment.currency)} deposit. Thank you.`
              : `You approved “${v.approval.optionTitle}”. The deposit is below.`}
          </Text>
        ) : null}

        <View style={styles.block}>
          <Text role="heading" aria-level={2} style={styles.heading}>
            What we found
          </Text>
          <Text style={styles.body} testID="owner-what-failed">
            {v.whatFailed || 'The shop has not written this part yet.'}
          </Text>
          {v.photos.map((p) => (
            <View key={p.id} style={styles.photo}>
              <Image source={{ uri: p.url }} style={styles.image} resizeMode="cover" accessibilityLabel={p.caption || 'Photo of the failed part'} />
              {p.caption ? <Text style={styles.small}>{p.caption}</Text> : null}
            </View>
          ))}
        </View>

        <View style={styles.block} role="radiogroup" aria-label="Options">
          <Text role="heading" aria-level={2} style={styles.heading}>
            {v.options.length === 1 ? 'What we propose' : `Your ${v.options.length} options`}
          </Text>
          {v.options.map((o) => (
            <OwnerOptionCard
              key={o.id}
              option={o}
              currency={v.currency}
              referenceTitle={reference?.title ?? o.title}
              chosen={chosen?.id === o.id}
              approved={v.approval?.optionId === o.id}
              onChoose={v.approval ? null : () => setChosenId(o.id)}
            />
          ))}
        </View>

        <View style={styles.cautions} role="note" aria-label="Before you decide" testID="owner-cautions">
          <Text role="heading" aria-level={2} style={styles.heading}>
            Before you decide
          </Text>
          {v.cautions.map((c) => (
            <Text key={c} style={styles.body}>
              • {c}
            </Text>
          ))}
        </View>

        <OwnerDecision base={base} view={v} chosen={chosen} />
        <Text style={styles.small}>Questions? Call {v.shopName}. Anyone with this page’s address can read it, so keep it to yourself.</Text>
      </View>
    </ScrollView>
  );
}

const styles = StyleSheet.create({
  scroll: { flex: 1, backgroundColor: colors.surface },
  content: { padding: space.lg, paddingBottom: space.xxxl },
  page: { width: '100%', maxWidth: 760, alignSelf: 'center', gap: space.xl },
  header: { gap: space.sm },
  shop: { ...ownerType.strong, color: colors.accent },
  title: { ...ownerType.display, color: colors.ink },
  heading: { ...ownerType.heading, color: colors.ink },
  body: { ...ownerType.body, color: colors.ink },
  small: { ...ownerType.small, color: colors.inkMuted },
  block: { gap: space.md },
  banner: { ...ownerType.strong, color: colors.accentInk, backgroundColor: colors.pass, padding: space.lg, borderRadius: radius.md, overflow: 'hidden' },
  photo: { gap: space.xs },
  image: { width: '100%', aspectRatio: 4 / 3, borderRadius: radius.md, backgroundColor: colors.sunken },
  cautions: { gap: space.sm, padding: space.lg, borderRadius: radius.lg, borderLeftWidth: 8, borderLeftColor: colors.watch, backgroundColor: colors.watchSoft },
});
