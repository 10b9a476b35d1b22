import { useEffect } from 'react';

/** Calls `onEscape` when Escape is pressed anywhere on the page while `active`. */
export function useEscapeKey(active: boolean, onEscape: () => void): void {
  useEffect(() => {
    if (!active) return;
    const onKey = (e: KeyboardEvent) => {
      if (e.key === 'Escape') {
        e.preventDefault();
        onEscape();
      }
    };
    document.addEventListener('keydown', onKey);
    return () => document.removeEventListener('keydown', onKey);
  }, [active, onEscape]);
}

/** Moves the keyboard's focus to the first button inside `node` (a View, which is an element on the web). */
export function focusFirstButton(node: unknown): void {
  if (node instanceof HTMLElement) node.querySelector<HTMLElement>('[role="button"], button')?.focus();
}
