import { Pressable, StyleSheet, Text, View } from 'react-native';

import { colors, fonts, radius, space, touchTarget, type as typeScale } from '@/constants/theme';

type Choice<T extends string> = { value: T; label: string };

type ChoiceGroupProps<T extends string> = {
  label: string;
  value: T;
  choices: readonly Choice<T>[];
  onChange: (value: T) => void;
  testID?: string;
};

/** A row of mutually exclusive options (a radio group), large enough for a gloved thumb. */
export function ChoiceGroup<T extends string>({ label, value, choices, onChange, testID }: ChoiceGroupProps<T>) {
  return (
    <View style={styles.group} role="radiogroup" aria-label={label} testID={testID}>
      <Text style={styles.label}>{label}</Text>
      <View style={styles.row}>
        {choices.map((choice) => {
          const selected = choice.value === value;
          return (
            <Pressable
              key={choice.value}
              role="radio"
              aria-checked={selected}
              onPress={() => onChange(choice.value)}
              style={[styles.choice, selected && styles.selected]}
              testID={testID ? `${testID}-${choice.value}` : undefined}
            >
              <Text style={[styles.choiceText, selected && styles.selectedText]}>{choice.label}</Text>
            </Pressable>
          );
        })}
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  group: { gap: space.xs },
  label: { ...typeScale.label, color: colors.ink },
  row: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  choice: {
    minHeight: touchTarget,
    paddingHorizontal: space.lg,
    justifyContent: 'center',
    borderRadius: radius.pill,
    borderWidth: 1.5,
    borderColor: colors.lineStrong,
    backgroundColor: colors.surface,
  },
  selected: { backgroundColor: colors.accent, borderColor: colors.accent },
  choiceText: { fontFamily: fonts.medium, fontSize: 15, color: colors.ink },
  selectedText: { color: colors.accentInk },
});
