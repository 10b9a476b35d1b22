import { AccessibilityInfo, type ScrollView, type View, findNodeHandle } from 'react-native';

/**
 * Brings a part of the inspection into view and gives it the focus (native): scrolled so it sits a little
 * below the top of the page, then announced by the screen reader.
 */
export function jumpTo(target: View | null, scroll: ScrollView | null): boolean {
  if (!target) return false;
  const content = scroll?.getInnerViewNode?.();
  if (scroll && content)
    target.measureLayout(
      content,
      (_x, y) => scroll.scrollTo({ y: Math.max(0, y - 24), animated: true }),
      () => undefined,
    );
  const handle = findNodeHandle(target);
  if (handle) AccessibilityInfo.setAccessibilityFocus(handle);
  return true;
}
