import { THEME_CHOICE_KEY, type ThemeChoice, parseThemeChoice } from '@/components/theme-resolve';

// Web: the choice lives in this browser's localStorage, read synchronously before the first render.
export function readThemeChoice(): ThemeChoice {
  try {
    return parseThemeChoice(globalThis.localStorage?.getItem(THEME_CHOICE_KEY));
  } catch {
    return 'system';
  }
}

/** Stores the choice; false when the browser refused (private mode, storage full): it lasts this page only. */
export function writeThemeChoice(choice: ThemeChoice): boolean {
  try {
    if (choice === 'system') globalThis.localStorage?.removeItem(THEME_CHOICE_KEY);
    else globalThis.localStorage?.setItem(THEME_CHOICE_KEY, choice);
    return true;
  } catch {
    return false;
  }
}
