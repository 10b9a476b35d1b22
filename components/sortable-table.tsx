import { Link, router, type Href } from 'expo-router';
import { useEffect, useRef } from 'react';
import { Pressable, StyleSheet, View } from 'react-native';

import { pressedOnLink } from '@/components/link-card';
import { Text } from '@/components/text';
import { colors, radius, space } from '@/components/theme';

type SortableColumn<T, K extends string> = {
  key: string;
  title: string;
  render: (row: T) => React.ReactNode;
  /**
   * A second line under the value, outside the row's link when this is the link's column: a link is named
   * by its visible words, so the link holds the name alone (WCAG 2.5.3) and details sit beside it.
   */
  detail?: (row: T) => React.ReactNode;
  flex?: number;
  /** The width the column never shrinks below (a date on one line, a badge whole). */
  minWidth?: number;
  numeric?: boolean;
  /** The server's sort key for this column; columns without one are not sortable. */
  sortKey?: K;
};

/** `key` ascending or `-key` descending, as the API's `?sort=` takes it. */
export type SortValue<K extends string> = K | `-${K}`;

/**
 * A dense desktop table whose column titles sort it (on the server: the table only says which key and
 * which way) and whose rows may each lead to a page. The sort state is spoken as well as drawn.
 *
 * A row that leads somewhere is a table row like any other (a row holds cells, a cell holds the link):
 * the link is the value of `linkColumn` (the first column unless named), named `rowLabel`, which must
 * begin with or hold that value's words; a click anywhere else on the row follows it too, for a mouse,
 * while the keyboard and assistive technology meet one link per row.
 */
export function SortableTable<T, K extends string>({
  rows,
  columns,
  rowKey,
  rowHref,
  rowLabel,
  linkColumn,
  sort,
  onSort,
  label,
  highlighted = -1,
}: {
  rows: T[];
  columns: SortableColumn<T, K>[];
  rowKey: (row: T) => string;
  rowHref?: (row: T) => Href;
  rowLabel?: (row: T) => string;
  /** The key of the column whose value is the row's link; the first column's by default. */
  linkColumn?: string;
  sort?: SortValue<K>;
  onSort?: (sort: SortValue<K> | undefined) => void;
  label: string;
  /** The row a keyboard shortcut has moved to: drawn, marked current, focused and scrolled into view. */
  highlighted?: number;
}) {
  const highlightedRow = useRef<View>(null);
  useEffect(() => {
    if (highlighted >= 0) focusAndReveal(highlightedRow.current);
  }, [highlighted]);
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
              style={StyleSheet.flatten([styles.cell, columnSize(c)])}
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
        const href = rowHref?.(row);
        const linkKey = linkColumn ?? columns[0]?.key;
        const cells = columns.map((c) => {
          const value = <Cell value={c.render(row)} numeric={c.numeric} />;
          return (
            <View key={c.key} style={StyleSheet.flatten([styles.cell, columnSize(c)])} role="cell">
              {href !== undefined && c.key === linkKey ? (
                <Link href={href} asChild>
                  <Pressable role="link" accessibilityLabel={rowLabel?.(row)} style={styles.link}>
                    {value}
                  </Pressable>
                </Link>
              ) : (
                value
              )}
              {c.detail ? c.detail(row) : null}
            </View>
          );
        });
        const on = i === highlighted;
        const style = StyleSheet.flatten([styles.row, i % 2 === 1 && styles.zebra, on && styles.highlighted]);
        const current = on ? ('true' as const) : undefined;
        if (href === undefined) {
          return (
            <View
              key={rowKey(row)}
              style={style}
              role="row"
              aria-current={current}
              ref={on ? highlightedRow : undefined}
            >
              {cells}
            </View>
          );
        }
        // The row itself is no tab stop (its link is); a click on it elsewhere than the link goes there too.
        return (
          <Pressable
            key={rowKey(row)}
            role="row"
            focusable={false}
            style={StyleSheet.flatten([style, styles.linkRow])}
            aria-current={current}
            ref={on ? highlightedRow : undefined}
            onPress={(e) => {
              if (!pressedOnLink(e)) router.push(href);
            }}
          >
            {cells}
          </Pressable>
        );
      })}
    </View>
  );
}

const columnSize = (c: { flex?: number; minWidth?: number }) =>
  c.minWidth === undefined ? { flex: c.flex ?? 1 } : { flex: c.flex ?? 1, minWidth: c.minWidth };

type WebNode = {
  focus?: () => void;
  scrollIntoView?: (options: { block: 'nearest' }) => void;
  querySelector?: (selector: string) => WebNode | null;
};

/**
 * Focus moves to the row's link (the row itself when it has none) and the page to the row, on the web; a
 * call the platform lacks is simply not made.
 */
function focusAndReveal(node: View | null) {
  const row = node as unknown as WebNode | null;
  const target = row?.querySelector?.('[role="link"], a') ?? row;
  target?.focus?.();
  row?.scrollIntoView?.({ block: 'nearest' });
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
  zebra: { backgroundColor: colors.surfaceAlt },
  // A bar on the left as well as the tint: the highlight is not shown by colour alone.
  highlighted: {
    backgroundColor: colors.infoSoft,
    borderLeftWidth: 4,
    borderLeftColor: colors.focus,
    paddingLeft: space.md - 4,
  },
  cell: { paddingHorizontal: space.sm, paddingVertical: space.sm, minWidth: 0 },
  sortButton: { minHeight: 36, justifyContent: 'center' },
  link: { alignSelf: 'flex-start', maxWidth: '100%', minHeight: 24, justifyContent: 'center' },
  linkRow: { cursor: 'pointer' },
  right: { textAlign: 'right' },
});
