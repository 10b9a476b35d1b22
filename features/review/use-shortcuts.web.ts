import { useEffect, useRef, useSyncExternalStore } from 'react';

import {
  type ShortcutAction,
  type ShortcutPage,
  shortcutFor,
  shortcutHelpTitle,
} from '@/features/review/shortcuts';

/** The web has a keyboard: the desk shows its shortcuts and their help. */
export const keyboardShortcuts = true;

export type ShortcutHandlers = Partial<Record<ShortcutAction, () => void>>;

/**
 * Whether the letter keys are on. WCAG 2.1 SC 2.1.4 (Character Key Shortcuts) asks that single-character
 * shortcuts can be turned off, for people who drive the page by voice; the choice is kept in this browser.
 */
const OFF_KEY = 'pivotwatch.review-shortcuts';
const listeners = new Set<() => void>();

function readOn(): boolean {
  try {
    return globalThis.localStorage?.getItem(OFF_KEY) !== 'off';
  } catch {
    return true;
  }
}

export function setShortcutsOn(on: boolean): void {
  try {
    if (on) globalThis.localStorage?.removeItem(OFF_KEY);
    else globalThis.localStorage?.setItem(OFF_KEY, 'off');
  } catch {
    // Storage refused (private mode): the choice lasts until the page is left.
  }
  memory = on;
  listeners.forEach((l) => l());
}

let memory: boolean | null = null;
const subscribe = (l: () => void) => {
  listeners.add(l);
  return () => listeners.delete(l);
};
const snapshot = () => (memory ??= readOn());

/** The letter keys' switch, for the help overlay. */
export function useShortcutsOn(): boolean {
  return useSyncExternalStore(subscribe, snapshot, () => true);
}

type Closest = { closest?: (selector: string) => unknown };

/** A key that goes to another dialog (a photo at full size) is that dialog's, not the page's beneath it. */
function inOtherDialog(target: unknown): boolean {
  const t = target as Closest | null;
  if (!t || typeof t.closest !== 'function') return false;
  // The help itself is the one dialog whose keys (? to close it) the shortcuts still read.
  return !!t.closest('[aria-modal="true"]') && !t.closest(`[aria-label="${shortcutHelpTitle}"]`);
}

/**
 * Listens for the page's shortcut keys (`features/review/shortcuts.ts`) on the document while mounted and
 * runs the handler given for each; a key with no handler is left to the browser. The handlers may change
 * on every render (they close over the screen's state) without listening again.
 */
export function useShortcuts(page: ShortcutPage, handlers: ShortcutHandlers): void {
  const latest = useRef(handlers);
  useEffect(() => {
    latest.current = handlers;
  });
  useEffect(() => {
    const onKey = (event: KeyboardEvent) => {
      if (!snapshot()) return;
      const action = shortcutFor(event, page);
      const run = action ? latest.current[action] : undefined;
      if (!run || inOtherDialog(event.target)) return;
      event.preventDefault();
      run();
    };
    document.addEventListener('keydown', onKey);
    return () => document.removeEventListener('keydown', onKey);
  }, [page]);
}
