/**
 * Pivotwatch design tokens: one place for colour, type, spacing and layout. The colours' values live in
 * lib/colors.ts (no React, so the server's PDFs and e-mails use the same light values); `colors` here is the
 * theme in force (`theme-colors.ts` on a phone: the palette chosen at start; `theme-colors.web.ts`: CSS
 * custom properties that follow the system's scheme or the person's choice).
 */
export { contrastPairs, type ColorToken } from '@/lib/colors';
export { colors } from '@/components/theme-colors';

/**
 * Font family names as the app registers them (`components/app-fonts.ts`): IBM Plex's TTF on a phone, its
 * WOFF2 subsets on the web.
 */
export const fonts = {
  regular: 'PivotwatchSans-Regular',
  semibold: 'PivotwatchSans-SemiBold',
  bold: 'PivotwatchSans-Bold',
  /** Monospaced figures so columns of numbers line up. */
  mono: 'PivotwatchMono-Medium',
} as const;

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
