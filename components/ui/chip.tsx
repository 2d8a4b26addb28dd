import { StyleSheet, Text } from 'react-native';

import { colors, fonts, radius, space } from '@/constants/theme';

/** What a chip says about its subject: nothing yet, under way, done, to watch, failed, or the final word. */
export type ChipTone = 'neutral' | 'muted' | 'accent' | 'pass' | 'watch' | 'fail' | 'confirmed';

type ChipProps = {
  label: string;
  tone?: ChipTone;
  /** `verdict` for a check's outcome (short capitals), `large` for the owner's page. */
  look?: 'tag' | 'verdict' | 'large';
  testID?: string;
};

/** A compact tag: a job's stage, an order's stage, a check's verdict, an approval. */
export function Chip({ label, tone = 'accent', look = 'tag', testID }: ChipProps) {
  return (
    <Text style={[styles.chip, styles[look], tones[tone]]} testID={testID}>
      {label}
    </Text>
  );
}

const styles = StyleSheet.create({
  chip: {
    alignSelf: 'flex-start',
    flexShrink: 0,
    paddingHorizontal: space.sm,
    paddingVertical: 2,
    borderRadius: radius.pill,
    overflow: 'hidden',
  },
  tag: { fontFamily: fonts.semibold, fontSize: 13 },
  verdict: { fontFamily: fonts.bold, fontSize: 12, letterSpacing: 0.5, textTransform: 'uppercase', borderRadius: radius.sm },
  large: { fontFamily: fonts.bold, fontSize: 16 },
});

const tones = StyleSheet.create({
  neutral: { color: colors.ink, backgroundColor: colors.sunken },
  muted: { color: colors.inkMuted, backgroundColor: colors.sunken },
  accent: { color: colors.accent, backgroundColor: colors.accentSoft },
  pass: { color: colors.pass, backgroundColor: colors.passSoft },
  watch: { color: colors.watch, backgroundColor: colors.watchSoft },
  fail: { color: colors.fail, backgroundColor: colors.failSoft },
  confirmed: { color: colors.accentInk, backgroundColor: colors.pass },
});
