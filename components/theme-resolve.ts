import type { ThemeName } from '@/lib/colors';

/**
 * The person's theme choice on this device: follow the system's setting, or always light or dark.
 * Kept per device (`components/theme-store*.ts`), never per account: a phone in the sun and a desk
 * screen at night want different things.
 */
export const themeChoices = ['system', 'light', 'dark'] as const;
export type ThemeChoice = (typeof themeChoices)[number];

export const THEME_CHOICE_KEY = 'pivotwatch:theme';

/** A stored value as a choice; anything else (nothing stored, an old or tampered value) follows the system. */
export function parseThemeChoice(raw: string | null | undefined): ThemeChoice {
  return raw === 'light' || raw === 'dark' ? raw : 'system';
}

/** The theme in force: the choice, or the system's scheme when following it (unknown counts as light). */
export function resolveTheme(choice: ThemeChoice, system: string | null | undefined): ThemeName {
  if (choice !== 'system') return choice;
  return system === 'dark' ? 'dark' : 'light';
}
