import { useState } from 'react';
import { Pressable, StyleSheet, View } from 'react-native';

import Feather from '@/components/feather-icon';
import { FieldFrame } from '@/components/field-frame';
import { Text } from '@/components/text';
import { colors, layout, radius, space } from '@/components/theme';

type SelectOption<T extends string> = { value: T; label: string; hint?: string };

/**
 * A labelled choice from a list that may be long (sites, companies, inspectors). The list opens in place
 * under the field rather than in a floating menu, so it never hides other fields and scrolls with the page.
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
  const current = options.find((o) => o.value === value);
  return (
    <FieldFrame label={label} hideLabel={compact} error={error}>
      <Pressable
        role="button"
        accessibilityLabel={`${label}: ${current?.label ?? placeholder}`}
        aria-expanded={open}
        onPress={() => setOpen((o) => !o)}
        style={StyleSheet.flatten([styles.button, error ? styles.buttonError : null])}
      >
        <Text numberOfLines={1} style={styles.buttonText} muted={!current}>
          {compact ? `${label}: ` : ''}
          {current?.label ?? placeholder}
        </Text>
        <Feather name={open ? 'chevron-up' : 'chevron-down'} size={18} color={colors.textMuted} />
      </Pressable>
      {open ? (
        <View style={styles.list} role="radiogroup" accessibilityLabel={label}>
          {options.map((o) => {
            const selected = o.value === value;
            return (
              <Pressable
                key={o.value}
                role="radio"
                aria-checked={selected}
                accessibilityState={{ checked: selected }}
                onPress={() => {
                  onChange(o.value);
                  setOpen(false);
                }}
                style={StyleSheet.flatten([styles.option, selected && styles.optionSelected])}
              >
                <View style={styles.optionText}>
                  <Text variant={selected ? 'heading' : 'body'}>{o.label}</Text>
                  {o.hint ? (
                    <Text variant="small" muted>
                      {o.hint}
                    </Text>
                  ) : null}
                </View>
                {selected ? <Feather name="check" size={18} color={colors.base} /> : null}
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
    minHeight: layout.touchTarget,
    borderWidth: 1.5,
    borderColor: colors.border,
    borderRadius: radius.md,
    backgroundColor: colors.surface,
    paddingHorizontal: space.md,
  },
  buttonError: { borderColor: colors.danger },
  buttonText: { flexShrink: 1 },
  list: {
    borderWidth: 1,
    borderColor: colors.border,
    borderRadius: radius.md,
    backgroundColor: colors.surface,
    overflow: 'hidden',
  },
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
  optionSelected: { backgroundColor: colors.accentSoft },
  optionText: { flexShrink: 1 },
});
