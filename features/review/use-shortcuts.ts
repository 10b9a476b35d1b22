import type { ShortcutAction, ShortcutPage } from '@/features/review/shortcuts';

/** A phone has no keyboard to speak of: no shortcuts, no help button (`use-shortcuts.web.ts` has them). */
export const keyboardShortcuts = false;

export type ShortcutHandlers = Partial<Record<ShortcutAction, () => void>>;

export function useShortcuts(_page: ShortcutPage, _handlers: ShortcutHandlers): void {}

export function setShortcutsOn(_on: boolean): void {}

export function useShortcutsOn(): boolean {
  return false;
}
