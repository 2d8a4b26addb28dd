import { useRouter, type Href } from 'expo-router';
import { ActivityIndicator, Pressable, StyleSheet, Text, type PressableProps } from 'react-native';

import { colors, fonts, radius, space, touchTarget } from '@/constants/theme';

type Variant = 'primary' | 'secondary' | 'quiet' | 'danger';

type ButtonProps = Omit<PressableProps, 'children' | 'style'> & {
  label: string;
  variant?: Variant;
  busy?: boolean;
  /** Navigate here when pressed (announced as a link). */
  href?: Href;
  testID?: string;
};

/** A labelled button; shows a spinner and stays disabled while `busy`. */
export function Button({ label, variant = 'primary', busy = false, disabled, href, onPress, ...rest }: ButtonProps) {
  const router = useRouter();
  const off = disabled || busy;
  return (
    <Pressable
      accessibilityRole={href ? 'link' : 'button'}
      onPress={href ? () => router.push(href) : onPress}
      accessibilityState={{ disabled: off, busy }}
      disabled={off}
      style={({ pressed }) => [styles.base, styles[variant], pressed && !off && pressedStyles[variant], off && styles.off]}
      {...rest}
    >
      {busy ? <ActivityIndicator size="small" color={textColor[variant]} /> : null}
      <Text style={[styles.label, { color: textColor[variant] }]}>{label}</Text>
    </Pressable>
  );
}

const textColor: Record<Variant, string> = {
  primary: colors.accentInk,
  secondary: colors.accent,
  quiet: colors.ink,
  danger: colors.fail,
};

const styles = StyleSheet.create({
  base: {
    alignSelf: 'flex-start',
    minHeight: touchTarget,
    paddingHorizontal: space.lg,
    borderRadius: radius.md,
    flexDirection: 'row',
    alignItems: 'center',
    justifyContent: 'center',
    gap: space.sm,
    borderWidth: 2,
  },
  primary: { backgroundColor: colors.accent, borderColor: colors.accent },
  secondary: { backgroundColor: colors.surface, borderColor: colors.accent },
  quiet: { backgroundColor: 'transparent', borderColor: 'transparent' },
  danger: { backgroundColor: colors.surface, borderColor: colors.fail },
  off: { opacity: 0.55 },
  label: { fontFamily: fonts.semibold, fontSize: 16, letterSpacing: 0.3 },
});

const pressedStyles = StyleSheet.create({
  primary: { backgroundColor: colors.accentPressed, borderColor: colors.accentPressed },
  secondary: { backgroundColor: colors.accentSoft },
  quiet: { backgroundColor: colors.sunken },
  danger: { backgroundColor: colors.failSoft },
});
