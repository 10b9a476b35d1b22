/**
 * Pivotwatch design tokens: one place for colour, type, spacing and layout.
 * Palette: a deep harbour-blue base, a neutral slate scale and one copper accent.
 * Every text/background pair used in the UI meets WCAG AA (4.5:1 for body text); the
 * contrast test in tests/app/theme.test.ts checks the pairs listed in `contrastPairs`.
 */
export const colors = {
  base: '#102A38',
  baseRaised: '#1B3B4D',
  baseText: '#FFFFFF',
  baseMuted: '#B8CAD4',
  accent: '#B34A16',
  accentSoft: '#FBE9DE',
  bg: '#F3F5F6',
  surface: '#FFFFFF',
  surfaceSunk: '#E8ECEE',
  border: '#CBD4DA',
  text: '#15232C',
  textMuted: '#4F5F6A',
  focus: '#1D6FB8',
  within: '#18704A',
  withinSoft: '#E1F2E9',
  near: '#8A5A00',
  nearSoft: '#FCF0D6',
  over: '#B0231A',
  overSoft: '#FBE3E1',
  danger: '#B0231A',
} as const;

/** Text/background pairs the UI uses; each must reach 4.5:1. */
export const contrastPairs: [string, string][] = [
  [colors.text, colors.bg],
  [colors.text, colors.surface],
  [colors.textMuted, colors.surface],
  [colors.textMuted, colors.bg],
  [colors.baseText, colors.base],
  [colors.baseMuted, colors.base],
  [colors.baseText, colors.accent],
  [colors.accent, colors.surface],
  [colors.within, colors.withinSoft],
  [colors.near, colors.nearSoft],
  [colors.over, colors.overSoft],
  [colors.baseText, colors.baseRaised],
  [colors.text, colors.accentSoft],
  [colors.near, colors.nearSoft],
  [colors.baseMuted, colors.baseRaised],
];

export const fonts = {
  regular: 'PlexSans-Regular',
  semibold: 'PlexSans-SemiBold',
  bold: 'PlexSans-Bold',
  /** Monospaced figures so columns of numbers line up. */
  mono: 'PlexMono-Medium',
} as const;

export const fontFiles = {
  [fonts.regular]: require('@/fonts/IBMPlexSans_400Regular.ttf'),
  [fonts.semibold]: require('@/fonts/IBMPlexSans_600SemiBold.ttf'),
  [fonts.bold]: require('@/fonts/IBMPlexSans_700Bold.ttf'),
  [fonts.mono]: require('@/fonts/IBMPlexMono_500Medium.ttf'),
};

/** Type scale (px). Phone body text stays at 16 for outdoor legibility. */
export const type = {
  display: { fontFamily: fonts.bold, fontSize: 30, lineHeight: 36 },
  title: { fontFamily: fonts.bold, fontSize: 22, lineHeight: 28 },
  heading: { fontFamily: fonts.semibold, fontSize: 17, lineHeight: 24 },
  body: { fontFamily: fonts.regular, fontSize: 16, lineHeight: 23 },
  label: { fontFamily: fonts.semibold, fontSize: 13, lineHeight: 18, letterSpacing: 0.4 },
  small: { fontFamily: fonts.regular, fontSize: 13, lineHeight: 18 },
  figure: { fontFamily: fonts.mono, fontSize: 16, lineHeight: 22 },
  figureLarge: { fontFamily: fonts.mono, fontSize: 28, lineHeight: 34 },
} as const;
export type TypeVariant = keyof typeof type;

export const space = { xs: 4, sm: 8, md: 12, lg: 16, xl: 24, xxl: 32 } as const;
export const radius = { sm: 6, md: 10, lg: 14 } as const;

export const layout = {
  /** At or above this width the app switches to side navigation and multi-column content. */
  wideBreakpoint: 1024,
  maxContentWidth: 1200,
  /** Minimum touch target (px) for gloved hands. */
  touchTarget: 48,
  sideNavWidth: 248,
} as const;
