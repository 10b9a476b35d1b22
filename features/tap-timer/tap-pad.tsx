/**
 * The tap timer's pad on a phone: a tap counts when the finger lands (onTouchStart fires at once, before
 * the responder system or Pressable decide anything), and a screen reader's activation counts as a tap.
 */
import type { ReactNode } from 'react';
import { type StyleProp, View, type ViewStyle } from 'react-native';

export type TapPadProps = {
  /** Called once per tap, with the tap's time in milliseconds (one clock for every tap of a session). */
  onTap: (atMs: number) => void;
  label: string;
  hint: string;
  style: StyleProp<ViewStyle>;
  children: ReactNode;
};

export function TapPad({ onTap, label, hint, style, children }: TapPadProps) {
  return (
    <View
      accessible
      accessibilityRole="button"
      accessibilityLabel={label}
      accessibilityHint={hint}
      accessibilityActions={[{ name: 'activate' }]}
      onAccessibilityAction={(e) => {
        if (e.nativeEvent.actionName === 'activate') onTap(Date.now());
      }}
      // One count per finger that lands: a second finger is a second tap, as it is on the web.
      onTouchStart={() => onTap(Date.now())}
      style={style}
    >
      {children}
    </View>
  );
}
