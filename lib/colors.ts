/**
 * Pivotwatch's colour tokens, with no React, so the app's theme (`components/theme.ts`), the vocabulary's
 * marks (`lib/vocabulary.ts`) and the server's PDFs and e-mails all read the same values.
 * Palette: a deep harbour-blue base, a neutral slate scale and one copper accent, plus the status colours.
 * `colors` is the light palette: the server's PDFs and e-mails always use it (paper and mail are light).
 * `darkColors` holds the same tokens for the app's dark theme (`components/theme-colors*.ts` choose).
 * Every text/background pair used in the UI meets WCAG AA (4.5:1 for body text) in both palettes; the
 * contrast test in tests/app/theme.test.ts checks the pairs listed in `textPairs`.
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
  /** Every other row of a table (zebra stripes). */
  surfaceAlt: '#F8FAFB',
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
  // Mark colours of the vocabulary's other states (lib/vocabulary.ts), each with its soft background.
  /** In progress: a corrective action reported, an e-mail being sent. */
  info: '#1A5F9E',
  infoSoft: '#E3EEF8',
  /** The urgency "failed items". */
  failed: '#9B1D58',
  failedSoft: '#F9E3EE',
  /** The urgency "overdue" (an inspection past its date). */
  overdue: '#4A3B98',
  overdueSoft: '#ECE9F8',
  /** The urgency "findings past due" (on `accentSoft`). */
  pastDue: '#9A3D0F',
  /** The urgency "awaiting sign-off" (on `surfaceSunk`). */
  awaiting: '#35505F',
  // The app's frame: side rail, phone top bar, sign-in page, splash, photo viewer. Dark in both themes,
  // whereas `base` turns light in the dark theme (it is also a foreground: selected borders, chart lines).
  // In the light theme these equal base, baseRaised, baseText, baseMuted and accentSoft.
  chrome: '#102A38',
  chromeRaised: '#1B3B4D',
  chromeText: '#FFFFFF',
  chromeMuted: '#B8CAD4',
  /** The current item's edge on the side rail. */
  chromeAccent: '#FBE9DE',
} as const;

export type ColorToken = keyof typeof colors;
export type Palette = Record<ColorToken, string>;
export type ThemeName = 'light' | 'dark';

/**
 * The dark theme. The roles stay: `base`, `accent` and the status colours are foregrounds on surfaces and
 * fills under `baseText`, so here they are light tints and `baseText` is dark (as the light theme's fills
 * are dark under white); the soft backgrounds are deep shades of their hue; the frame stays dark.
 */
export const darkColors = {
  base: '#9CC6DE',
  baseRaised: '#C0DCEB',
  baseText: '#0C1A22',
  baseMuted: '#2F4A59',
  accent: '#F29A66',
  accentSoft: '#3D2619',
  bg: '#0F181D',
  surface: '#172329',
  surfaceSunk: '#22313A',
  surfaceAlt: '#1B282F',
  border: '#3B4C57',
  text: '#E4ECF0',
  textMuted: '#A4B4BE',
  focus: '#6FB7F2',
  within: '#6FD3A2',
  withinSoft: '#123526',
  near: '#E9B44C',
  nearSoft: '#3A2B0C',
  over: '#FF8F85',
  overSoft: '#45191A',
  danger: '#FF8F85',
  info: '#8DC3F2',
  infoSoft: '#142F47',
  failed: '#F08DBE',
  failedSoft: '#3F1A2D',
  overdue: '#B8AEF4',
  overdueSoft: '#272248',
  pastDue: '#F4A877',
  awaiting: '#B3C6D1',
  chrome: '#0A1A23',
  chromeRaised: '#17323F',
  chromeText: '#F2F6F8',
  chromeMuted: '#A9BFCB',
  chromeAccent: '#F29A66',
} as const satisfies Palette;

export const palettes: Record<ThemeName, Palette> = { light: colors, dark: darkColors };

/**
 * Text (or icon) token on background token, as the UI pairs them; each must reach 4.5:1 in both palettes.
 * The vocabulary's marks (word colour on badge colour) are checked from lib/vocabulary.ts itself.
 */
export const textPairs: [ColorToken, ColorToken][] = [
  ['text', 'bg'],
  ['text', 'surface'],
  ['text', 'surfaceSunk'],
  ['text', 'surfaceAlt'],
  ['text', 'accentSoft'],
  ['text', 'nearSoft'],
  ['text', 'overSoft'],
  ['text', 'withinSoft'],
  ['textMuted', 'surface'],
  ['textMuted', 'bg'],
  ['textMuted', 'surfaceSunk'],
  ['textMuted', 'surfaceAlt'],
  ['baseText', 'base'],
  ['baseMuted', 'base'],
  ['baseText', 'baseRaised'],
  ['baseMuted', 'baseRaised'],
  ['baseText', 'accent'],
  // Filled checklist answers (pass, fail, not applicable).
  ['baseText', 'within'],
  ['baseText', 'over'],
  ['baseText', 'textMuted'],
  ['base', 'surface'],
  ['base', 'bg'],
  ['base', 'accentSoft'],
  ['accent', 'surface'],
  ['accent', 'bg'],
  ['within', 'surface'],
  ['within', 'bg'],
  ['within', 'withinSoft'],
  ['near', 'surface'],
  ['near', 'bg'],
  ['near', 'nearSoft'],
  ['over', 'surface'],
  ['over', 'overSoft'],
  ['danger', 'surface'],
  ['danger', 'bg'],
  ['danger', 'overSoft'],
  ['info', 'surface'],
  ['focus', 'surface'],
  ['chromeText', 'chrome'],
  ['chromeMuted', 'chrome'],
  ['chromeText', 'chromeRaised'],
  ['chromeMuted', 'chromeRaised'],
];

/** A palette's `textPairs` as colour values. */
export const contrastPairsOf = (palette: Palette): [string, string][] =>
  textPairs.map(([fg, bg]) => [palette[fg], palette[bg]]);

/** Text/background pairs of the light palette (what the PDFs and e-mails use too). */
export const contrastPairs = contrastPairsOf(colors);
