import { useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { Card } from '@/components/card';
import Feather from '@/components/feather-icon';
import { Text } from '@/components/text';
import { colors, space } from '@/components/theme';
import { useWide } from '@/components/use-wide';

/**
 * A list's search and filters. Desktop: all in view, the search beside its selects. Phone: the search
 * and one "Filters" button, so the list itself stays on the first screen.
 */
export function FilterPanel({
  search,
  beside,
  filters,
  phoneOnly,
  active,
}: {
  search: React.ReactNode;
  /** Selects that sit beside the search on a desktop. */
  beside?: React.ReactNode;
  filters: React.ReactNode;
  /** Phone only, after the filters: what a desktop offers elsewhere (the table's headers sort it). */
  phoneOnly?: React.ReactNode;
  /** How many filters are set, shown on the phone's button. */
  active: number;
}) {
  const wide = useWide();
  const [open, setOpen] = useState(false);
  if (wide) {
    return (
      <Card style={styles.card}>
        <View style={styles.row}>
          <View style={styles.search}>{search}</View>
          {beside}
        </View>
        {filters}
      </Card>
    );
  }
  return (
    <Card style={styles.card}>
      <View style={styles.phoneRow}>
        <View style={styles.search}>{search}</View>
        <Button
          label={active > 0 ? `Filters (${active})` : 'Filters'}
          tone="quiet"
          aria-expanded={open}
          onPress={() => setOpen((o) => !o)}
          icon={<Feather name="sliders" size={18} color={colors.text} />}
          style={styles.button}
        />
      </View>
      {open ? (
        <View style={styles.stack}>
          {beside}
          {filters}
          {phoneOnly}
        </View>
      ) : null}
    </Card>
  );
}

/**
 * A panel's chip groups: side by side on a desktop, stacked on a phone. `alignEnd` lines them up at the
 * bottom, for a button that sits among them.
 */
export function FilterGroups({ alignEnd, children }: { alignEnd?: boolean; children: React.ReactNode }) {
  const wide = useWide();
  return (
    <View style={wide ? (alignEnd ? styles.groupsWideEnd : styles.groupsWide) : styles.stack}>
      {children}
    </View>
  );
}

/** One filter's chips under its label. */
export function FilterGroup({ label, children }: { label: string; children: React.ReactNode }) {
  return (
    <View style={styles.group}>
      <Text variant="label" muted>
        {label.toUpperCase()}
      </Text>
      {children}
    </View>
  );
}

const styles = StyleSheet.create({
  card: { gap: space.md },
  row: { flexDirection: 'row', alignItems: 'flex-start', gap: space.md },
  phoneRow: { flexDirection: 'row', alignItems: 'flex-end', gap: space.sm },
  search: { flex: 2, minWidth: 0 },
  stack: { gap: space.md },
  button: { paddingHorizontal: space.md },
  groupsWide: { flexDirection: 'row', flexWrap: 'wrap', columnGap: space.xl, rowGap: space.md },
  groupsWideEnd: {
    flexDirection: 'row',
    flexWrap: 'wrap',
    alignItems: 'flex-end',
    columnGap: space.xl,
    rowGap: space.md,
  },
  // A long chip list wraps inside the card instead of running past its edge.
  group: { gap: space.xs, flexShrink: 1, maxWidth: '100%' },
});
