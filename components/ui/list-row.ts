import type { ViewStyle } from 'react-native';

import { colors, radius, space } from '@/constants/theme';

/** One entry of a settings list: what it is on the left, its actions on the right, wrapping below on a phone. */
export const listRow: ViewStyle = {
  flexDirection: 'row',
  flexWrap: 'wrap',
  alignItems: 'center',
  justifyContent: 'space-between',
  gap: space.sm,
  padding: space.md,
  backgroundColor: colors.surface,
  borderColor: colors.line,
  borderWidth: 1,
  borderRadius: radius.md,
};
