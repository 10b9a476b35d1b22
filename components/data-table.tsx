import { StyleSheet, View } from 'react-native';

import { Card } from '@/components/card';
import { Text } from '@/components/text';
import { colors, radius, space } from '@/components/theme';
import { useWide } from '@/components/use-wide';

type Column<T> = {
  key: string;
  title: string;
  render: (row: T) => React.ReactNode;
  /** Relative width on desktop. */
  flex?: number;
  numeric?: boolean;
};

/** Dense rows on a desktop; one card per row on a phone, each value under its column title. */
export function DataTable<T>({
  rows,
  columns,
  rowKey,
  label,
}: {
  rows: T[];
  columns: Column<T>[];
  rowKey: (row: T) => string;
  label: string;
}) {
  const wide = useWide();
  if (!wide) {
    // Phone: the first column titles each card; the rest sit in a two-column grid beneath it.
    const [first, ...rest] = columns;
    return (
      <View style={styles.cards} accessibilityLabel={label}>
        {rows.map((row) => (
          <Card key={rowKey(row)} style={styles.card}>
            <Cell value={first.render(row)} heading />
            <View style={styles.cardGrid}>
              {rest.map((c) => (
                <View key={c.key} style={styles.cardLine}>
                  <Text variant="label" muted style={styles.cardLabel}>
                    {c.title.toUpperCase()}
                  </Text>
                  <Cell value={c.render(row)} numeric={c.numeric} inCard />
                </View>
              ))}
            </View>
          </Card>
        ))}
      </View>
    );
  }
  return (
    <View style={styles.table} role="table" accessibilityLabel={label}>
      <View style={[styles.row, styles.headRow]} role="row">
        {columns.map((c) => (
          <View key={c.key} style={[styles.cell, { flex: c.flex ?? 1 }]} role="columnheader">
            <Text variant="label" muted style={c.numeric ? styles.right : undefined}>
              {c.title.toUpperCase()}
            </Text>
          </View>
        ))}
      </View>
      {rows.map((row, i) => (
        <View key={rowKey(row)} style={[styles.row, i % 2 === 1 && styles.zebra]} role="row">
          {columns.map((c) => (
            <View key={c.key} style={[styles.cell, { flex: c.flex ?? 1 }]} role="cell">
              <Cell value={c.render(row)} numeric={c.numeric} />
            </View>
          ))}
        </View>
      ))}
    </View>
  );
}

function Cell({
  value,
  numeric,
  heading,
  inCard,
}: {
  value: React.ReactNode;
  numeric?: boolean;
  heading?: boolean;
  inCard?: boolean;
}) {
  if (typeof value === 'string' || typeof value === 'number') {
    return (
      <Text
        variant={heading ? 'heading' : numeric ? 'figure' : 'body'}
        style={numeric && !inCard ? styles.right : undefined}
      >
        {value}
      </Text>
    );
  }
  return <>{value}</>;
}

const styles = StyleSheet.create({
  cards: { gap: space.sm },
  card: { padding: space.md, gap: space.xs },
  cardGrid: { flexDirection: 'row', flexWrap: 'wrap', rowGap: space.sm, columnGap: space.md },
  cardLine: { gap: 2, flexBasis: '46%', flexGrow: 1 },
  cardLabel: { fontSize: 11 },
  table: {
    backgroundColor: colors.surface,
    borderRadius: radius.lg,
    borderWidth: 1,
    borderColor: colors.border,
    overflow: 'hidden',
  },
  row: { flexDirection: 'row', alignItems: 'center', minHeight: 44, paddingHorizontal: space.md },
  headRow: { backgroundColor: colors.surfaceSunk, minHeight: 38 },
  zebra: { backgroundColor: colors.surfaceAlt },
  cell: { paddingHorizontal: space.sm, paddingVertical: space.sm, minWidth: 0 },
  right: { textAlign: 'right' },
});
