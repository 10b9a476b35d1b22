import { StyleSheet, View } from 'react-native';

import { Text } from '@/components/text';
import { colors, radius, space } from '@/components/theme';

/** A big number with its label; `mark` carries the status shape and text where the number has one. */
export function StatTile({
  value,
  label,
  mark,
}: {
  value: number | string;
  label: string;
  mark?: React.ReactNode;
}) {
  return (
    <View style={styles.tile} accessibilityLabel={`${label}: ${value}`}>
      <Text variant="figureLarge">{value}</Text>
      {mark ?? (
        <Text variant="label" muted>
          {label.toUpperCase()}
        </Text>
      )}
    </View>
  );
}

export function StatRow({ children }: { children: React.ReactNode }) {
  return <View style={styles.row}>{children}</View>;
}

const styles = StyleSheet.create({
  row: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md },
  tile: {
    flexGrow: 1,
    // Wide enough that a one-word label ("ADMINISTRATORS") never breaks inside the word: two to a row on a phone.
    flexBasis: 140,
    backgroundColor: colors.surface,
    borderColor: colors.border,
    borderWidth: 1,
    borderRadius: radius.lg,
    padding: space.lg,
    gap: space.sm,
  },
});
