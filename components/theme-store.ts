import Storage from 'expo-sqlite/kv-store';

import { THEME_CHOICE_KEY, type ThemeChoice, parseThemeChoice } from '@/components/theme-resolve';

// Native: the choice lives in expo-sqlite's key-value store on the phone (synchronous, so the palette is
// chosen before the first stylesheet is built). The keystore is kept for secrets.
export function readThemeChoice(): ThemeChoice {
  try {
    const raw: unknown = Storage.getItemSync(THEME_CHOICE_KEY);
    return parseThemeChoice(typeof raw === 'string' ? raw : null);
  } catch {
    return 'system';
  }
}

/** Stores the choice; false when the phone's storage refused it. */
export function writeThemeChoice(choice: ThemeChoice): boolean {
  try {
    if (choice === 'system') Storage.removeItemSync(THEME_CHOICE_KEY);
    else Storage.setItemSync(THEME_CHOICE_KEY, choice);
    return true;
  } catch {
    return false;
  }
}
