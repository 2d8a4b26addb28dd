import { Pressable, StyleSheet, Text, View } from 'react-native';

import { formatCents, formatDateTime } from '@/constants/format';
import { colors, fonts, radius, space } from '@/constants/theme';
import type { OwnerViewOption } from '@/shared/owner';

import { ownerType } from '@/components/owner/owner-type';
import { CheckSummaryChip } from '@/components/sheet/check-list';
import { Chip } from '@/components/ui/chip';

type OwnerOptionCardProps = {
  option: OwnerViewOption;
  /** Currency of the page's prices. */
  currency: string;
  /** The first option's title: every other option is compared with it. */
  referenceTitle: string;
  chosen: boolean;
  /** Null once an option is approved: the cards are read-only. */
  onChoose: (() => void) | null;
  approved: boolean;
};

/** One option the shop offers: price, deposit, time, and what changes, in plain words. */
export function OwnerOptionCard({ option, currency, referenceTitle, chosen, onChoose, approved }: OwnerOptionCardProps) {
  const points = option.comparison?.points.filter((p) => p.topic !== 'fit') ?? [];
  return (
    <View style={[styles.card, chosen && styles.chosen]} testID={`owner-option-${option.id}`}>
      <View style={styles.head}>
        <Text role="heading" aria-level={3} style={styles.title}>
          {option.title}
        </Text>
        {approved ? <Chip label="Approved" tone="confirmed" look="large" testID="owner-option-approved" /> : null}
      </View>
      <View style={styles.prices}>
        <Figure label="Price" value={formatCents(option.priceCents, currency)} />
        <Figure label="Deposit to start" value={formatCents(option.depositCents, currency)} />
        <Figure label="Cam ready in about" value={`${option.leadTimeDays} days`} />
      </View>
      {option.ownerNote ? <Text style={styles.body}>{option.ownerNote}</Text> : null}
      {option.comparison ? (
        <View style={styles.compare}>
          <Text style={styles.strong}>{option.comparison.headline}</Text>
          {points.map((p) => (
            <Text key={p.topic} style={styles.body}>
              • {p.text}
            </Text>
          ))}
        </View>
      ) : (
        <Text style={styles.body}>This is the option the others are compared with{referenceTitle === option.title ? '' : ` (${referenceTitle})`}.</Text>
      )}
      <View style={styles.checked} testID={`owner-option-${option.id}-checks`}>
        <CheckSummaryChip summary={option.summary} testID={`owner-option-${option.id}-status`} />
        <Text style={styles.small} testID={`owner-option-${option.id}-checked`}>
          {option.checkedOnEngine
            ? `Checked on the engine against revision ${option.checkedOnEngine.revisionNumber}, ${formatDateTime(option.checkedOnEngine.at)}${option.checkedOnEngine.by ? ` by ${option.checkedOnEngine.by}` : ''}`
            : 'Worked out from the numbers; not yet checked on the engine'}
        </Text>
      </View>
      <Text style={styles.body} testID={`owner-option-${option.id}-fit`}>
        {option.fit}
      </Text>
      <Text style={styles.strong} testID={`owner-option-${option.id}-core`}>
        {option.core.answer === 'old-cam' ? 'Your old camshaft will do. ' : option.core.answer === 'new-core' ? 'Needs a new core. ' : ''}
        <Text style={styles.body}>{option.core.text}</Text>
      </Text>
      <Text style={styles.small}>
        Sheet revision {option.revisionNumber} · checksum <Text style={styles.mono}>{option.checksum}</Text>
      </Text>
      {onChoose ? (
        <Pressable
          role="radio"
          aria-checked={chosen}
          accessibilityLabel={`Choose ${option.title}`}
          onPress={onChoose}
          style={[styles.choose, chosen && styles.chooseOn]}
          testID={`choose-option-${option.id}`}
        >
          <View style={[styles.dot, chosen && styles.dotOn]} />
          <Text style={[styles.chooseText, chosen && styles.chooseTextOn]}>{chosen ? 'Chosen' : 'Choose this option'}</Text>
        </Pressable>
      ) : null}
    </View>
  );
}

function Figure({ label, value }: { label: string; value: string }) {
  return (
    <View style={styles.figure}>
      <Text style={styles.figureLabel}>{label}</Text>
      <Text style={styles.figureValue}>{value}</Text>
    </View>
  );
}

const styles = StyleSheet.create({
  checked: { flexDirection: 'row', alignItems: 'center', gap: space.sm, flexWrap: 'wrap' },
  card: { gap: space.md, padding: space.lg, borderRadius: radius.lg, borderWidth: 2, borderColor: colors.lineStrong, backgroundColor: colors.surface },
  chosen: { borderColor: colors.accent, borderWidth: 4 },
  head: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', gap: space.sm },
  title: { ...ownerType.heading, color: colors.ink, flexShrink: 1 },
  prices: { flexDirection: 'row', flexWrap: 'wrap', gap: space.lg },
  figure: { minWidth: 130, gap: 2 },
  figureLabel: { ...ownerType.small, color: colors.inkMuted },
  figureValue: { fontFamily: fonts.bold, fontSize: 24, lineHeight: 30, color: colors.ink },
  compare: { gap: space.sm },
  strong: { ...ownerType.strong, color: colors.ink },
  body: { ...ownerType.body, color: colors.ink },
  small: { ...ownerType.small, color: colors.inkMuted },
  mono: { fontFamily: fonts.mono },
  choose: {
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.md,
    minHeight: 56,
    paddingHorizontal: space.lg,
    borderRadius: radius.md,
    borderWidth: 2,
    borderColor: colors.accent,
    backgroundColor: colors.surface,
  },
  chooseOn: { backgroundColor: colors.accent },
  dot: { width: 22, height: 22, borderRadius: 11, borderWidth: 3, borderColor: colors.accent, backgroundColor: colors.surface },
  dotOn: { borderColor: colors.accentInk, backgroundColor: colors.accentInk },
  chooseText: { fontFamily: fonts.bold, fontSize: 19, color: colors.accent },
  chooseTextOn: { color: colors.accentInk },
});
