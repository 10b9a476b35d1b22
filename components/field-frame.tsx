import { StyleSheet, View } from 'react-native';

import { Text } from '@/components/text';
import { colors, layout, radius, space } from '@/components/theme';

/** The box every one-line field draws around its value (text, date, select): one height, border and fill. */
export const fieldBox = {
  minHeight: layout.touchTarget,
  borderWidth: 1.5,
  borderColor: colors.border,
  borderRadius: radius.md,
  backgroundColor: colors.surface,
  paddingHorizontal: space.md,
} as const;

/** Under a field: its problem (announced politely), else its hint, else nothing. */
export function FieldNote({
  error,
  hint,
  nativeID,
}: {
  error?: string | null;
  hint?: string;
  nativeID?: string;
}) {
  if (error)
    return (
      <Text nativeID={nativeID} variant="small" color={colors.danger} accessibilityLiveRegion="polite">
        {error}
      </Text>
    );
  if (hint)
    return (
      <Text nativeID={nativeID} variant="small" muted>
        {hint}
      </Text>
    );
  return null;
}

/** A choice field's frame: its label above in capitals (unless hidden), the control, its problem below. */
export function FieldFrame({
  label,
  hideLabel,
  error,
  children,
}: {
  label: string;
  hideLabel?: boolean;
  error?: string;
  children: React.ReactNode;
}) {
  return (
    <View style={styles.field}>
      {hideLabel ? null : (
        <Text variant="label" muted>
          {label.toUpperCase()}
        </Text>
      )}
      {children}
      <FieldNote error={error} />
    </View>
  );
}

// minWidth 0: a select beside a search box in a filter row may shrink rather than push the row wider.
const styles = StyleSheet.create({ field: { gap: space.xs, minWidth: 0 } });
