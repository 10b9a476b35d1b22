import { StyleSheet, View } from 'react-native';

import { space } from '@/components/theme';
import { useWide } from '@/components/use-wide';

/**
 * Two panes: side by side on a desktop (main wider), one above the other on a phone, where the side pane
 * (status, identity, the next step) usually comes first. Columns' flex basis of 0 only works in a row,
 * so the phone stack uses plain blocks.
 */
export function Panes({
  main,
  side,
  sideFirstOnPhone = true,
  mainGrow = 2,
}: {
  main: React.ReactNode;
  side: React.ReactNode;
  sideFirstOnPhone?: boolean;
  mainGrow?: number;
}) {
  const wide = useWide();
  if (!wide) {
    return (
      <View style={styles.stack}>
        {sideFirstOnPhone ? side : main}
        {sideFirstOnPhone ? main : side}
      </View>
    );
  }
  return (
    <View style={styles.row}>
      <View style={[styles.pane, { flexGrow: mainGrow }]}>{main}</View>
      <View style={[styles.pane, styles.side]}>{side}</View>
    </View>
  );
}

const styles = StyleSheet.create({
  stack: { gap: space.lg },
  row: { flexDirection: 'row', gap: space.xl, alignItems: 'flex-start' },
  pane: { flexBasis: 0, gap: space.lg, minWidth: 0 },
  side: { flexGrow: 1 },
});
