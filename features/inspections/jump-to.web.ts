import type { ScrollView, View } from 'react-native';

/**
 * Brings a part of the inspection into view and gives it the focus (web): the element is a DOM node here,
 * centred in its scrolling page and focused without a second scroll, so the keyboard and screen readers
 * continue from it.
 */
export function jumpTo(target: View | null, _scroll: ScrollView | null): boolean {
  const el = target as unknown as HTMLElement | null;
  if (!el || typeof el.scrollIntoView !== 'function') return false;
  el.scrollIntoView({ block: 'center', behavior: 'smooth' });
  el.focus({ preventScroll: true });
  return true;
}
