import type { TextStyle } from 'react-native';

import { colors, radius, space, type as typeScale } from '@/constants/theme';

/** A several-line note typed beside a sheet or an order: tall enough for three lines, text from the top. */
export const noteInput: TextStyle = {
  ...typeScale.body,
  minHeight: 80,
  padding: space.sm,
  borderWidth: 1.5,
  borderColor: colors.lineStrong,
  borderRadius: radius.md,
  backgroundColor: colors.surface,
  color: colors.ink,
  textAlignVertical: 'top',
};
