import { StyleSheet, Text } from 'react-native';

import { colors, fonts, radius, space } from '@/constants/theme';
import { jobStatusLabels, type JobStatus } from '@/shared/jobs';

/** The job's stage as a compact tag. */
export function StatusChip({ status }: { status: JobStatus }) {
  return <Text style={styles.chip}>{jobStatusLabels[status]}</Text>;
}

const styles = StyleSheet.create({
  chip: {
    alignSelf: 'flex-start',
    flexShrink: 0,
    fontFamily: fonts.semibold,
    fontSize: 13,
    color: colors.accent,
    backgroundColor: colors.accentSoft,
    paddingHorizontal: space.sm,
    paddingVertical: 2,
    borderRadius: radius.pill,
    overflow: 'hidden',
  },
});
