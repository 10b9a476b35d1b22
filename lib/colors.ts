/**
 * Pivotwatch's colour tokens, with no React, so the app's theme (`components/theme.ts`), the vocabulary's
 * marks (`lib/vocabulary.ts`) and the server's PDFs and e-mails all read the same values.
 * Palette: a deep harbour-blue base, a neutral slate scale and one copper accent, plus the status colours.
 * Every text/background pair used in the UI meets WCAG AA (4.5:1 for body text); the contrast test in
 * tests/app/theme.test.ts checks the pairs listed in `contrastPairs`.
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
} as const;

export type ColorToken = keyof typeof colors;

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
