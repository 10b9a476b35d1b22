import { StyleSheet, View } from 'react-native';

import { Text } from '@/components/text';
import { colors, space } from '@/components/theme';
import { NdtDueMark, ndtDueWords } from '@/features/pivot-life/ndt-due-mark';
import { NDT_METHOD_WORDS } from '@/features/pivot-life/ndt-schema';
import type { NdtDue } from '@/features/pivot-life/schema';
import { formatDate } from '@/lib/dates';

/**
 * A pivot's planned NDT in a few lines, for the ride's Pivot life section: per method its interval, the
 * last test and when the next is due, with the state's mark. `asOf` is the day the server judged them on.
 */
export function NdtRows({ due, asOf }: { due: readonly NdtDue[]; asOf: string }) {
  if (due.length === 0)
    return (
      <Text variant="small" muted>
        No NDT planned at this pivot in the design data.
      </Text>
    );
  return (
    <View style={styles.list} accessibilityLabel="NDT due">
      {due.map((d) => (
        <View key={d.method} style={styles.row} testID={`ndt-due-${d.method}`}>
          <View style={styles.head}>
            <Text variant="heading">
              {d.method} <Text muted>{NDT_METHOD_WORDS[d.method]}</Text>
            </Text>
            <NdtDueMark due={d} asOf={asOf} />
          </View>
          <Text variant="small">
            Every {d.intervalDays} days · {d.lastOn ? `last ${formatDate(d.lastOn)}` : 'no test recorded'} ·{' '}
            {ndtDueWords(d, asOf)}
          </Text>
        </View>
      ))}
    </View>
  );
}

const styles = StyleSheet.create({
  list: { gap: space.sm },
  row: { gap: 2, borderLeftWidth: 3, borderLeftColor: colors.border, paddingLeft: space.sm },
  head: {
    flexDirection: 'row',
    alignItems: 'center',
    justifyContent: 'space-between',
    gap: space.sm,
    flexWrap: 'wrap',
  },
});
