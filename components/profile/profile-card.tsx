import { StyleSheet, Text, View } from 'react-native';

import { formatDate } from '@/constants/format';
import { colors, space, type as typeScale } from '@/constants/theme';
import type { UnitConverter } from '@/state/units';
import { formatNumber } from '@/lib/number-draft';
import type { Profile } from '@/shared/profile';

import { LinkCard } from '@/components/ui/link-card';

/** Lobe lift in the chosen length unit, or inches while the converter loads. */
function lift(value: number, units: UnitConverter | null) {
  if (!units) return formatNumber(value, 3);
  return formatNumber(units.toShown('length', value), units.digits('length', 3));
}

/** One library profile: its name, the start of its core notes, and the numbers a builder compares first. */
export function ProfileCard({ profile, units }: { profile: Profile; units: UnitConverter | null }) {
  const { intake, exhaust, lsa, icl } = profile.spec;
  const liftUnit = units ? units.label('length') : 'in';
  const numbers: [string, string][] = [
    ['At 0.050 in (I / E)', `${formatNumber(intake.duration050, 0)}° / ${formatNumber(exhaust.duration050, 0)}°`],
    [`Lobe lift (I / E)`, `${lift(intake.lobeLift, units)} / ${lift(exhaust.lobeLift, units)} ${liftUnit}`],
    ['LSA', `${formatNumber(lsa, 1).replace(/\.0$/, '')}° cam`],
    ['ICL', `${formatNumber(icl, 1).replace(/\.0$/, '')}° ATDC`],
  ];
  return (
    <LinkCard href={{ pathname: '/profiles/[id]', params: { id: profile.id } }} edge={colors.intake} testID={`profile-card-${profile.id}`}>
      <View style={styles.inner}>
        <Text style={styles.label} numberOfLines={2}>
          {profile.label}
        </Text>
        <Text style={styles.notes} numberOfLines={2}>
          {profile.coreNotes || 'No core notes.'}
        </Text>
        <View style={styles.numbers}>
          {numbers.map(([name, value]) => (
            <View key={name} style={styles.number}>
              <Text style={styles.numberName}>{name}</Text>
              <Text style={styles.numberValue}>{value}</Text>
            </View>
          ))}
        </View>
        <Text style={styles.meta}>Updated {formatDate(profile.updatedAt)}</Text>
      </View>
    </LinkCard>
  );
}

const styles = StyleSheet.create({
  inner: { gap: space.sm },
  label: { ...typeScale.heading, color: colors.ink },
  notes: { ...typeScale.body, color: colors.inkMuted },
  numbers: { flexDirection: 'row', flexWrap: 'wrap', columnGap: space.xl, rowGap: space.sm },
  number: { gap: 2 },
  numberName: { ...typeScale.small, color: colors.inkMuted },
  numberValue: { ...typeScale.number, color: colors.ink },
  meta: { ...typeScale.small, color: colors.inkMuted },
});
