import Feather from '@expo/vector-icons/Feather';
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { Card } from '@/components/card';
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
  active,
}: {
  search: React.ReactNode;
  /** Selects that sit beside the search on a desktop. */
  beside?: React.ReactNode;
  filters: React.ReactNode;
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
        </View>
      ) : null}
    </Card>
  );
}

const styles = StyleSheet.create({
  card: { gap: space.md },
  row: { flexDirection: 'row', alignItems: 'flex-start', gap: space.md },
  phoneRow: { flexDirection: 'row', alignItems: 'flex-end', gap: space.sm },
  search: { flex: 2, minWidth: 0 },
  stack: { gap: space.md },
  button: { paddingHorizontal: space.md },
});
