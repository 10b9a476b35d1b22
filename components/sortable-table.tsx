import { Link, type Href } from 'expo-router';
import { Pressable, StyleSheet, View } from 'react-native';

import { Text } from '@/components/text';
import { colors, radius, space } from '@/components/theme';

type SortableColumn<T, K extends string> = {
  key: string;
  title: string;
  render: (row: T) => React.ReactNode;
  flex?: number;
  numeric?: boolean;
  /** The server's sort key for this column; columns without one are not sortable. */
  sortKey?: K;
};

/** `key` ascending or `-key` descending, as the API's `?sort=` takes it. */
export type SortValue<K extends string> = K | `-${K}`;

/**
 * A dense desktop table whose column titles sort it (on the server: the table only says which key and
 * which way) and whose rows may each lead to a page. The sort state is spoken as well as drawn.
 */
export function SortableTable<T, K extends string>({
  rows,
  columns,
  rowKey,
  rowHref,
  rowLabel,
  sort,
  onSort,
  label,
}: {
  rows: T[];
  columns: SortableColumn<T, K>[];
  rowKey: (row: T) => string;
  rowHref?: (row: T) => Href;
  rowLabel?: (row: T) => string;
  sort?: SortValue<K>;
  onSort?: (sort: SortValue<K> | undefined) => void;
  label: string;
}) {
  const active = sort?.startsWith('-') ? sort.slice(1) : sort;
  const descending = sort?.startsWith('-') ?? false;
  return (
    <View style={styles.table} role="table" accessibilityLabel={label}>
      <View style={StyleSheet.flatten([styles.row, styles.headRow])} role="row">
        {columns.map((c) => {
          const isActive = c.sortKey !== undefined && c.sortKey === active;
          const title = (
            <Text
              variant="label"
              color={isActive ? colors.text : colors.textMuted}
              style={c.numeric ? styles.right : undefined}
            >
              {c.title.toUpperCase()}
              {isActive ? (descending ? ' ▼' : ' ▲') : ''}
            </Text>
          );
          return (
            <View
              key={c.key}
              style={StyleSheet.flatten([styles.cell, { flex: c.flex ?? 1 }])}
              role="columnheader"
              aria-sort={isActive ? (descending ? 'descending' : 'ascending') : 'none'}
            >
              {c.sortKey && onSort ? (
                <Pressable
                  role="button"
                  accessibilityLabel={`Sort by ${c.title}${isActive ? (descending ? ', now descending' : ', now ascending') : ''}`}
                  onPress={() => {
                    const key = c.sortKey as K;
                    // Third press returns to the server's own order.
                    onSort(!isActive ? key : !descending ? (`-${key}` as SortValue<K>) : undefined);
                  }}
                  style={styles.sortButton}
                >
                  {title}
                </Pressable>
              ) : (
                title
              )}
            </View>
          );
        })}
      </View>
      {rows.map((row, i) => {
        const cells = columns.map((c) => (
          <View key={c.key} style={StyleSheet.flatten([styles.cell, { flex: c.flex ?? 1 }])} role="cell">
            <Cell value={c.render(row)} numeric={c.numeric} />
          </View>
        ));
        const style = StyleSheet.flatten([styles.row, i % 2 === 1 && styles.zebra]);
        if (!rowHref) {
          return (
            <View key={rowKey(row)} style={style} role="row">
              {cells}
            </View>
          );
        }
        // Link (asChild) hands the style to the DOM node as-is on web: `style` is one flat object.
        return (
          <Link key={rowKey(row)} href={rowHref(row)} asChild>
            <Pressable role="link" accessibilityLabel={rowLabel?.(row)} style={style}>
              {cells}
            </Pressable>
          </Link>
        );
      })}
    </View>
  );
}

function Cell({ value, numeric }: { value: React.ReactNode; numeric?: boolean }) {
  if (typeof value === 'string' || typeof value === 'number') {
    return (
      <Text
        variant={numeric ? 'figure' : 'body'}
        style={numeric ? styles.right : undefined}
        numberOfLines={2}
      >
        {value}
      </Text>
    );
  }
  return <>{value}</>;
}

const styles = StyleSheet.create({
  table: {
    backgroundColor: colors.surface,
    borderRadius: radius.lg,
    borderWidth: 1,
    borderColor: colors.border,
    overflow: 'hidden',
  },
  row: {
    flexDirection: 'row',
    alignItems: 'center',
    minHeight: 48,
    paddingHorizontal: space.md,
    borderBottomWidth: 1,
    borderBottomColor: colors.surfaceSunk,
  },
  headRow: { backgroundColor: colors.surfaceSunk, minHeight: 44 },
  zebra: { backgroundColor: '#F8FAFB' },
  cell: { paddingHorizontal: space.sm, paddingVertical: space.sm, minWidth: 0 },
  sortButton: { minHeight: 36, justifyContent: 'center' },
  right: { textAlign: 'right' },
});
