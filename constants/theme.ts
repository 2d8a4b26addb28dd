/**
 * Lobewright's look: warm paper and graphite ink for a bright shop floor, a deep
 * spruce accent for actions, and signal colours for check results that stay
 * readable in print. Text colours meet WCAG AA (4.5:1) on both surfaces.
 */
export const colors = {
  paper: '#F5F2EA',
  surface: '#FFFFFF',
  sunken: '#ECE7DB',
  ink: '#1C1F22',
  inkMuted: '#4D535A',
  line: '#C9C2B2',
  lineStrong: '#8C8574',
  accent: '#145C52',
  accentPressed: '#0E453D',
  accentInk: '#FFFFFF',
  accentSoft: '#DCEBE6',
  focus: '#B4510F',
  pass: '#1D6B34',
  passSoft: '#DFF0E2',
  watch: '#855400',
  watchSoft: '#FBEBC8',
  fail: '#A6261C',
  failSoft: '#F8DEDA',
  intake: '#1F5F9E',
  exhaust: '#A6261C',
  overlay: 'rgba(28,31,34,0.45)',
  overlapShade: 'rgba(180,81,15,0.12)',
  grid: '#DDD6C6',
} as const;

/** Line colours for the profiles on a plot, in order (first = the baseline profile). */
export const seriesColors = ['#145C52', '#9A4B0B', '#5B3E96'] as const;

export const space = { xs: 4, sm: 8, md: 12, lg: 16, xl: 24, xxl: 32, xxxl: 48 } as const;

export const radius = { sm: 4, md: 8, lg: 14, pill: 999 } as const;

export const fonts = {
  regular: 'Barlow_400Regular',
  medium: 'Barlow_500Medium',
  semibold: 'Barlow_600SemiBold',
  bold: 'Barlow_700Bold',
  mono: 'JetBrainsMono_400Regular',
  monoBold: 'JetBrainsMono_700Bold',
} as const;

export const type = {
  display: { fontFamily: fonts.bold, fontSize: 30, lineHeight: 36, letterSpacing: -0.3 },
  title: { fontFamily: fonts.semibold, fontSize: 22, lineHeight: 28 },
  heading: { fontFamily: fonts.semibold, fontSize: 18, lineHeight: 24 },
  body: { fontFamily: fonts.regular, fontSize: 16, lineHeight: 23 },
  bodyStrong: { fontFamily: fonts.semibold, fontSize: 16, lineHeight: 23 },
  label: { fontFamily: fonts.medium, fontSize: 14, lineHeight: 19, letterSpacing: 0.2 },
  small: { fontFamily: fonts.regular, fontSize: 13, lineHeight: 18 },
  number: { fontFamily: fonts.mono, fontSize: 15, lineHeight: 21 },
} as const;

export const breakpoints = { wide: 900, page: 1180 } as const;

/** Smallest comfortable touch target, in px. */
export const touchTarget = 44;
