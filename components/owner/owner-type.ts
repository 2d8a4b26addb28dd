import { fonts } from '@/constants/theme';

/** Larger type for the owner's page: read on a phone, often outdoors, by someone who is not in the trade. */
export const ownerType = {
  display: { fontFamily: fonts.bold, fontSize: 32, lineHeight: 38 },
  heading: { fontFamily: fonts.bold, fontSize: 24, lineHeight: 30 },
  strong: { fontFamily: fonts.semibold, fontSize: 20, lineHeight: 28 },
  body: { fontFamily: fonts.regular, fontSize: 19, lineHeight: 28 },
  small: { fontFamily: fonts.regular, fontSize: 16, lineHeight: 22 },
} as const;
