import { Appearance } from 'react-native';

import { type ThemeChoice, resolveTheme } from '@/components/theme-resolve';
import { readThemeChoice, writeThemeChoice } from '@/components/theme-store';
import { type Palette, type ThemeName, palettes } from '@/lib/colors';

/**
 * Native: the app's ~160 stylesheets read `colors` once, when their modules load, so the palette is chosen
 * here before any of them: the stored choice, else the system's scheme at start. A new choice, or a change
 * of the system's setting, takes effect when the app next starts.
 */
const choiceAtStart = readThemeChoice();

// Native pickers and alerts follow the app's choice rather than the system's.
try {
  Appearance.setColorScheme(choiceAtStart === 'system' ? 'unspecified' : choiceAtStart);
} catch {
  // An old runtime without setColorScheme: the system's scheme then.
}

export const activeTheme: ThemeName = resolveTheme(choiceAtStart, Appearance.getColorScheme());

export const colors: Palette = palettes[activeTheme];

/** Whether a new choice shows at once (web) or at the next start (phones). */
export const themeChoiceShowsAtOnce = false;

/** Stores the choice for the next start; false when it could not be stored. */
export function applyThemeChoice(choice: ThemeChoice): boolean {
  return writeThemeChoice(choice);
}
