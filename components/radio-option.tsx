import { createContext, type ReactNode, useContext, useRef } from 'react';
import { Pressable, type StyleProp, StyleSheet, View, type ViewStyle } from 'react-native';

import { colors, layout, radius, space } from '@/components/theme';

type Focusable = { focus?: () => void };
type KeyEvent = { key?: string; nativeEvent?: { key?: string }; preventDefault?: () => void };

type Group = {
  value: string | null;
  /** The option that takes Tab's focus: the chosen one, or the first when none is. */
  tabStop: string | null;
  choose: (value: string) => void;
  onKey: (from: string, e: KeyEvent) => void;
  register: (value: string, node: Focusable | null) => void;
};

const GroupContext = createContext<Group | null>(null);

/** Where an arrow, Home or End key moves in a group of `count` options (wrapping), or null if it does not. */
export function radioStep(key: string, from: number, count: number): number | null {
  if (count === 0) return null;
  switch (key) {
    case 'ArrowDown':
    case 'ArrowRight':
      return (from + 1) % count;
    case 'ArrowUp':
    case 'ArrowLeft':
      return (from - 1 + count) % count;
    case 'Home':
      return 0;
    case 'End':
      return count - 1;
    default:
      return null;
  }
}

/**
 * A group of radio options (ARIA radiogroup). One option is a Tab stop (the chosen one, else the first);
 * the arrow keys, Home and End move to another option and choose it, as a platform radio group does.
 * `values` is the options' order, which the keys follow.
 */
export function RadioGroup<T extends string>({
  label,
  value,
  values,
  onChange,
  style,
  children,
}: {
  label: string;
  value: T | null | undefined;
  values: readonly T[];
  onChange: (value: T) => void;
  style?: StyleProp<ViewStyle>;
  children: ReactNode;
}) {
  const nodes = useRef(new Map<string, Focusable>());
  const current = value ?? null;
  const group: Group = {
    value: current,
    tabStop: current !== null && values.includes(current) ? current : (values[0] ?? null),
    choose: (v) => onChange(v as T),
    onKey: (from, e) => {
      const key = e.nativeEvent?.key ?? e.key ?? '';
      const next = radioStep(key, values.indexOf(from as T), values.length);
      if (next === null) return;
      e.preventDefault?.();
      const target = values[next];
      onChange(target);
      nodes.current.get(target)?.focus?.();
    },
    register: (v, node) => {
      if (node) nodes.current.set(v, node);
      else nodes.current.delete(v);
    },
  };
  return (
    <GroupContext.Provider value={group}>
      <View role="radiogroup" accessibilityLabel={label} style={style}>
        {children}
      </View>
    </GroupContext.Provider>
  );
}

/**
 * One option of a `RadioGroup` whose options carry more than a word (a status mark, a note): a ring with
 * a filled dot and a heavier border mark the chosen one, so it does not rest on colour alone. The whole
 * row is the touch target (at least 48 px high).
 */
export function RadioOption({
  value,
  label,
  children,
  invalid,
  style,
}: {
  value: string;
  /** Read for the option; what it shows is `children`. */
  label: string;
  children: ReactNode;
  /** The group has an error and this option is not chosen: a red border. */
  invalid?: boolean;
  style?: StyleProp<ViewStyle>;
}) {
  const group = useContext(GroupContext);
  if (!group) throw new Error('RadioOption must be inside a RadioGroup');
  const on = group.value === value;
  // onKeyDown reaches the DOM on the web (react-native-web); a phone has no arrow keys.
  const keys = { onKeyDown: (e: KeyEvent) => group.onKey(value, e) } as object;
  return (
    <Pressable
      ref={(node) => group.register(value, node as Focusable | null)}
      role="radio"
      aria-checked={on}
      accessibilityState={{ checked: on }}
      accessibilityLabel={label}
      focusable={group.tabStop === value}
      onPress={() => group.choose(value)}
      {...keys}
      style={StyleSheet.flatten([
        styles.choice,
        on && styles.choiceOn,
        invalid && !on && styles.choiceError,
        style,
      ])}
    >
      <View style={StyleSheet.flatten([styles.ring, on && styles.ringOn])}>
        {on ? <View style={styles.dot} /> : null}
      </View>
      {children}
    </Pressable>
  );
}

const styles = StyleSheet.create({
  choice: {
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.sm,
    minHeight: layout.touchTarget,
    paddingHorizontal: space.md,
    paddingVertical: space.xs,
    borderRadius: radius.md,
    borderWidth: 1.5,
    borderColor: colors.border,
    backgroundColor: colors.surface,
  },
  choiceOn: { borderColor: colors.base, borderWidth: 2.5 },
  choiceError: { borderColor: colors.danger },
  ring: {
    width: 22,
    height: 22,
    borderRadius: 11,
    borderWidth: 2,
    borderColor: colors.textMuted,
    alignItems: 'center',
    justifyContent: 'center',
  },
  ringOn: { borderColor: colors.base },
  dot: { width: 12, height: 12, borderRadius: 6, backgroundColor: colors.base },
});
