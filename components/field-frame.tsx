import { StyleSheet, View } from 'react-native';

import { Text } from '@/components/text';
import { colors, space } from '@/components/theme';

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
      {error ? (
        <Text variant="small" color={colors.danger} accessibilityLiveRegion="polite">
          {error}
        </Text>
      ) : null}
    </View>
  );
}

// minWidth 0: a select beside a search box in a filter row may shrink rather than push the row wider.
const styles = StyleSheet.create({ field: { gap: space.xs, minWidth: 0 } });
