import { useId } from 'react';
import { StyleSheet, Text, TextInput, View, type TextInputProps } from 'react-native';

import { colors, fonts, radius, space, touchTarget, type as typeScale } from '@/constants/theme';

type TextFieldProps = Omit<TextInputProps, 'style'> & {
  label: string;
  /** Shown after the label, for example "in" or "miles". */
  unit?: string;
  hint?: string;
  error?: string;
  testID?: string;
};

/** A labelled text input with its unit, an optional hint and an inline error that says what to fix. */
export function TextField({ label, unit, hint, error, multiline, testID, ...rest }: TextFieldProps) {
  const id = useId();
  const messageId = `${id}-message`;
  return (
    <View style={styles.field}>
      <Text nativeID={`${id}-label`} style={styles.label}>
        {label}
        {unit ? <Text style={styles.unit}> ({unit})</Text> : null}
      </Text>
      <TextInput
        accessibilityLabel={unit ? `${label} (${unit})` : label}
        aria-labelledby={`${id}-label`}
        aria-describedby={error || hint ? messageId : undefined}
        aria-invalid={error ? true : undefined}
        multiline={multiline}
        placeholderTextColor={colors.inkMuted}
        style={[styles.input, multiline && styles.multiline, error ? styles.inputError : null]}
        testID={testID}
        {...rest}
      />
      {error ? (
        <Text nativeID={messageId} role="alert" style={styles.error} testID={testID ? `${testID}-error` : undefined}>
          {error}
        </Text>
      ) : hint ? (
        <Text nativeID={messageId} style={styles.hint}>
          {hint}
        </Text>
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  field: { gap: space.xs },
  label: { ...typeScale.label, color: colors.ink },
  unit: { fontFamily: fonts.regular, color: colors.inkMuted },
  input: {
    ...typeScale.body,
    minHeight: touchTarget,
    paddingHorizontal: space.md,
    paddingVertical: space.sm,
    backgroundColor: colors.surface,
    borderWidth: 1.5,
    borderColor: colors.lineStrong,
    borderRadius: radius.md,
    color: colors.ink,
  },
  multiline: { minHeight: 96, textAlignVertical: 'top' },
  inputError: { borderColor: colors.fail, borderWidth: 2 },
  error: { ...typeScale.small, color: colors.fail, fontFamily: fonts.medium },
  hint: { ...typeScale.small, color: colors.inkMuted },
});
