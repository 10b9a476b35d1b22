import { useEffect, useId, useRef, useState } from 'react';
import { Pressable, StyleSheet, TextInput, View } from 'react-native';

import Feather from '@/components/feather-icon';
import { FieldFrame, fieldBox } from '@/components/field-frame';
import { Text } from '@/components/text';
import { colors, fonts, layout, radius, space } from '@/components/theme';

export type SelectOption<T extends string> = { value: T; label: string; hint?: string };

/** From this many options up, the open list has a filter box to type into. */
export const FILTER_FROM = 8;

type KeyEvent = { key?: string; nativeEvent?: { key?: string }; preventDefault?: () => void };
const keyOf = (e: KeyEvent) => e.nativeEvent?.key ?? e.key ?? '';

/** The options whose label or hint holds every word typed, in their own order (case and accents ignored). */
export function filterOptions<O extends { label: string; hint?: string }>(
  options: readonly O[],
  text: string,
) {
  const fold = (s: string) =>
    s
      .normalize('NFD')
      .replace(/[\u0300-\u036f]/g, '')
      .toLowerCase();
  const words = fold(text).split(/\s+/).filter(Boolean);
  if (words.length === 0) return [...options];
  return options.filter((o) => {
    const hay = fold(`${o.label} ${o.hint ?? ''}`);
    return words.every((w) => hay.includes(w));
  });
}

/** Where a list key moves the active option among `count` (no wrap), or null for another key. */
export function listStep(key: string, from: number, count: number): number | null {
  if (count === 0) return null;
  switch (key) {
    case 'ArrowDown':
      return Math.min(count - 1, from + 1);
    case 'ArrowUp':
      return Math.max(0, from - 1);
    case 'Home':
      return 0;
    case 'End':
      return count - 1;
    default:
      return null;
  }
}

/**
 * A labelled choice from a list that may be long (sites, companies, templates, time zones): an ARIA
 * combobox. The list opens in place under the field rather than in a floating menu, so it never hides
 * other fields and scrolls with the page. By keyboard: Enter, Space or an arrow opens it; ArrowUp/Down,
 * Home and End move through it; Enter chooses; Escape or Tab closes it. A list of `FILTER_FROM` or more
 * options opens with a filter box (typing a letter on the closed field starts it), shorter lists jump to
 * the option a typed letter starts. By touch every option is a full-width 48 px row.
 */
export function SelectField<T extends string>({
  label,
  value,
  options,
  onChange,
  placeholder = 'Choose…',
  error,
  compact,
}: {
  label: string;
  value: T | null;
  options: SelectOption<T>[];
  onChange: (value: T) => void;
  placeholder?: string;
  error?: string;
  /** Filter bars: no upper-case label above, the label is inside the button. */
  compact?: boolean;
}) {
  const [open, setOpen] = useState(false);
  const [query, setQuery] = useState('');
  const [active, setActive] = useState(0);
  const ids = useId().replace(/[^a-zA-Z0-9_-]/g, '');
  const listId = `select-${ids}-list`;
  const optionId = (i: number) => `select-${ids}-option-${i}`;
  const trigger = useRef<View>(null);
  const refocus = useRef(false);
  // Enter on the trigger is also its press (react-native-web presses on keyup): the key already acted.
  const skipPress = useRef(false);
  const typed = useRef({ text: '', at: 0 });

  const filterable = options.length >= FILTER_FROM;
  const shown = filterable ? filterOptions(options, query) : options;
  const current = options.find((o) => o.value === value);
  const activeIndex = Math.min(active, shown.length - 1);

  useEffect(() => {
    if (!open && refocus.current) {
      refocus.current = false;
      (trigger.current as { focus?: () => void } | null)?.focus?.();
    }
  }, [open]);

  const openList = (text = '') => {
    const list = filterable ? filterOptions(options, text) : options;
    const at = list.findIndex((o) => o.value === value);
    setQuery(text);
    setActive(at >= 0 && text === '' ? at : 0);
    setOpen(true);
  };
  const close = (focusField: boolean) => {
    refocus.current = focusField;
    setOpen(false);
    setQuery('');
  };
  const choose = (o: SelectOption<T>) => {
    onChange(o.value);
    close(true);
  };

  /** A short list's type-ahead: letters typed within a second make a prefix to jump to. */
  const jumpTo = (char: string) => {
    const now = Date.now();
    const text = (now - typed.current.at < 1000 ? typed.current.text : '') + char.toLowerCase();
    typed.current = { text, at: now };
    const at = options.findIndex((o) => o.label.toLowerCase().startsWith(text));
    if (at >= 0) setActive(at);
    return at >= 0;
  };

  /** The keys of the open list, from the filter box or the trigger; true when the key was used. */
  const listKey = (key: string): boolean => {
    const step = listStep(key, activeIndex, shown.length);
    if (step !== null) {
      setActive(step);
      return true;
    }
    if (key === 'Enter') {
      const o = shown[activeIndex];
      if (o) choose(o);
      return true;
    }
    if (key === 'Escape') {
      close(true);
      return true;
    }
    if (key === 'Tab') close(false);
    return false;
  };

  const triggerKey = (e: KeyEvent) => {
    const key = keyOf(e);
    if (open) {
      if (key === 'Enter') skipPress.current = true;
      const used = listKey(key) || (key.length === 1 && key !== ' ' && jumpTo(key));
      if (used || key === ' ') e.preventDefault?.();
      if (key === ' ' && shown[activeIndex]) choose(shown[activeIndex]);
      return;
    }
    if (key === 'ArrowDown' || key === 'ArrowUp' || key === ' ') {
      e.preventDefault?.();
      openList();
    } else if (key.length === 1) {
      e.preventDefault?.();
      if (filterable) openList(key);
      else {
        openList();
        jumpTo(key);
      }
    }
  };

  const listed = open && shown.length > 0;
  const activeDescendant = listed ? optionId(activeIndex) : undefined;
  // ARIA props react-native-web passes to the DOM; a phone's accessibility API has no use for them.
  const comboAria = {
    'aria-haspopup': 'listbox',
    'aria-controls': listed ? listId : undefined,
    'aria-activedescendant': activeDescendant,
    onKeyDown: triggerKey,
  } as object;
  const filterAria = {
    'aria-autocomplete': 'list',
    'aria-controls': listed ? listId : undefined,
    'aria-activedescendant': activeDescendant,
  } as object;

  // 'listbox' is not in React Native's role type; react-native-web writes it to the DOM.
  const listboxRole = { role: 'listbox' } as object;

  return (
    <FieldFrame label={label} hideLabel={compact} error={error}>
      {open && filterable ? (
        <View style={StyleSheet.flatten([styles.button, styles.filterBox])}>
          <TextInput
            role="combobox"
            aria-expanded
            accessibilityLabel={`${label}: type to filter`}
            {...filterAria}
            autoFocus
            value={query}
            onChangeText={(t) => {
              setQuery(t);
              setActive(0);
            }}
            onKeyPress={(e) => {
              if (listKey(keyOf(e as KeyEvent))) (e as KeyEvent).preventDefault?.();
            }}
            submitBehavior="submit"
            placeholder={current ? `${current.label} — type to filter` : 'Type to filter'}
            placeholderTextColor={colors.textMuted}
            autoCapitalize="none"
            autoCorrect={false}
            style={styles.filterInput}
          />
          <Pressable
            role="button"
            accessibilityLabel={`Close the ${label.toLowerCase()} list`}
            focusable={false}
            onPress={() => close(true)}
            style={styles.closeButton}
          >
            <Feather name="chevron-up" size={18} color={colors.textMuted} />
          </Pressable>
        </View>
      ) : (
        <Pressable
          ref={trigger}
          role="combobox"
          accessibilityLabel={`${label}: ${current?.label ?? placeholder}`}
          aria-expanded={open}
          {...comboAria}
          onPress={() => {
            if (skipPress.current) {
              skipPress.current = false;
              return;
            }
            if (open) close(false);
            else openList();
          }}
          style={StyleSheet.flatten([styles.button, error ? styles.buttonError : null])}
        >
          <Text numberOfLines={1} style={styles.buttonText} muted={!current}>
            {compact ? `${label}: ` : ''}
            {current?.label ?? placeholder}
          </Text>
          <Feather name={open ? 'chevron-up' : 'chevron-down'} size={18} color={colors.textMuted} />
        </Pressable>
      )}
      {open && !listed ? (
        <Text variant="small" muted accessibilityLiveRegion="polite" style={styles.empty}>
          Nothing matches “{query.trim()}”.
        </Text>
      ) : null}
      {listed ? (
        <View style={styles.list} {...listboxRole} nativeID={listId} accessibilityLabel={label}>
          {shown.map((o, i) => {
            const chosen = o.value === value;
            const isActive = i === activeIndex;
            return (
              <Pressable
                key={o.value}
                nativeID={optionId(i)}
                role="option"
                aria-selected={isActive}
                accessibilityLabel={o.hint ? `${o.label}, ${o.hint}` : o.label}
                // Options are reached with the arrow keys (aria-activedescendant), never by Tab.
                focusable={false}
                onHoverIn={() => setActive(i)}
                onPress={() => choose(o)}
                style={StyleSheet.flatten([
                  styles.option,
                  chosen && styles.optionChosen,
                  isActive && styles.optionActive,
                ])}
              >
                <View style={styles.optionText}>
                  <Text variant={chosen ? 'heading' : 'body'}>{o.label}</Text>
                  {o.hint ? (
                    <Text variant="small" muted>
                      {o.hint}
                    </Text>
                  ) : null}
                </View>
                {chosen ? <Feather name="check" size={18} color={colors.base} /> : null}
              </Pressable>
            );
          })}
        </View>
      ) : null}
    </FieldFrame>
  );
}

const styles = StyleSheet.create({
  button: {
    flexDirection: 'row',
    alignItems: 'center',
    justifyContent: 'space-between',
    gap: space.sm,
    ...fieldBox,
  },
  buttonError: { borderColor: colors.danger },
  buttonText: { flexShrink: 1 },
  filterBox: { borderColor: colors.focus, paddingRight: 0 },
  filterInput: {
    flex: 1,
    minWidth: 0,
    fontFamily: fonts.regular,
    fontSize: 16,
    color: colors.text,
    paddingVertical: space.sm,
  },
  closeButton: {
    minWidth: layout.touchTarget,
    minHeight: layout.touchTarget,
    alignItems: 'center',
    justifyContent: 'center',
  },
  list: {
    borderWidth: 1,
    borderColor: colors.border,
    borderRadius: radius.md,
    backgroundColor: colors.surface,
    overflow: 'hidden',
  },
  empty: { paddingHorizontal: space.md },
  option: {
    flexDirection: 'row',
    alignItems: 'center',
    justifyContent: 'space-between',
    minHeight: layout.touchTarget,
    paddingHorizontal: space.md,
    paddingVertical: space.xs,
    borderBottomWidth: 1,
    borderBottomColor: colors.surfaceSunk,
  },
  optionChosen: { backgroundColor: colors.accentSoft },
  // A bar at the left marks the option the keys are on (not colour alone: the bar is a shape).
  optionActive: {
    borderLeftWidth: 4,
    borderLeftColor: colors.focus,
    paddingLeft: space.md - 4,
    backgroundColor: colors.surfaceSunk,
  },
  optionText: { flexShrink: 1 },
});
