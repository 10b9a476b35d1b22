/**
 * The tap timer's pad in a browser. Pressable's press-in arrives late there (react-native-web holds it
 * back by 50 ms and replays it on release only in some cases), so a short touch or click could be lost.
 * Here the pad listens to the DOM's own pointerdown, which fires the moment a finger, pen or mouse button
 * goes down, and to Space/Enter for keyboard users. The event's own timestamp is the tap's time, so a busy
 * main thread does not shift it.
 */
import { type ReactNode, useEffect, useLayoutEffect, useRef } from 'react';
import { type StyleProp, View, type ViewStyle } from 'react-native';

export type TapPadProps = {
  onTap: (atMs: number) => void;
  label: string;
  hint: string;
  style: StyleProp<ViewStyle>;
  children: ReactNode;
};

/** The hint is shown on the pad itself, so it is not repeated for assistive technology here. */
export function TapPad({ onTap, label, style, children }: TapPadProps) {
  const ref = useRef<View>(null);
  const tap = useRef(onTap);
  // The listeners are added once; they call the latest handler through this ref.
  useLayoutEffect(() => {
    tap.current = onTap;
  });
  useEffect(() => {
    const el = ref.current as unknown as HTMLElement | null;
    if (!el) return;
    const down = (e: PointerEvent) => {
      // Secondary mouse buttons open menus; they are not taps.
      if (e.pointerType === 'mouse' && e.button !== 0) return;
      tap.current(e.timeStamp);
    };
    const key = (e: KeyboardEvent) => {
      if (e.repeat || (e.key !== ' ' && e.key !== 'Enter')) return;
      // Space would otherwise scroll the page.
      e.preventDefault();
      tap.current(e.timeStamp);
    };
    el.addEventListener('pointerdown', down);
    el.addEventListener('keydown', key);
    return () => {
      el.removeEventListener('pointerdown', down);
      el.removeEventListener('keydown', key);
    };
  }, []);
  return (
    <View
      ref={ref}
      // A button role makes react-native-web give the pad a tab stop for keyboard users.
      role="button"
      aria-label={label}
      // No double-tap zoom and no panning from the pad: every touch on it is a tap.
      style={[style, { touchAction: 'none', userSelect: 'none', cursor: 'pointer' } as ViewStyle]}
    >
      {children}
    </View>
  );
}
