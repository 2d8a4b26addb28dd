import { Pressable, StyleSheet, Text, View } from 'react-native';

import { colors, fonts, radius, seriesColors, space, touchTarget } from '@/constants/theme';
import type { Profile } from '@/shared/profile';

type ProfilePickerProps = { profiles: readonly Profile[]; chosen: readonly string[]; onToggle: (id: string) => void };

/** Pick up to three profiles; the order picked sets the columns, and the first is the baseline for deltas. */
export function ProfilePicker({ profiles, chosen, onToggle }: ProfilePickerProps) {
  return (
    <View style={styles.row} role="group" aria-label="Profiles to compare (up to three)">
      {profiles.map((p) => {
        const position = chosen.indexOf(p.id);
        const on = position >= 0;
        return (
          <Pressable
            key={p.id}
            role="checkbox"
            aria-checked={on}
            onPress={() => onToggle(p.id)}
            style={[styles.chip, on && { borderColor: seriesColors[position] ?? colors.accent, backgroundColor: colors.surface }]}
            testID={`pick-${p.id}`}
          >
            <Text style={[styles.mark, on && { backgroundColor: seriesColors[position] ?? colors.accent, color: colors.accentInk }]}>
              {on ? position + 1 : ''}
            </Text>
            <Text style={styles.label}>{p.label}</Text>
          </Pressable>
        );
      })}
    </View>
  );
}

const styles = StyleSheet.create({
  row: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  chip: {
    minHeight: touchTarget,
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.sm,
    paddingHorizontal: space.md,
    borderRadius: radius.pill,
    borderWidth: 2,
    borderColor: colors.line,
    backgroundColor: colors.sunken,
  },
  mark: {
    width: 22,
    height: 22,
    borderRadius: 11,
    textAlign: 'center',
    lineHeight: 22,
    fontFamily: fonts.bold,
    fontSize: 13,
    borderWidth: 1.5,
    borderColor: colors.lineStrong,
    overflow: 'hidden',
  },
  label: { fontFamily: fonts.medium, fontSize: 15, color: colors.ink },
});
