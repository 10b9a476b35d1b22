import { StyleSheet, View } from 'react-native';

import { Caution } from '@/components/caution';
import { DataTable } from '@/components/data-table';
import { Text } from '@/components/text';
import { space } from '@/components/theme';
import {
  FATIGUE_BASIS,
  FATIGUE_CASE_WORDS,
  categoryText,
  cyclesToLimitText,
  formatDamage,
  governingFatigueCase,
} from '@/features/fatigue';
import { formatValue } from '@/features/loads';
import type { StoredFatigueDetail } from '@/features/records/analysis-schema';
import { pivotName } from '@/features/review/review-format';
import type { UnitSystem } from '@/lib/units';

const MPA = 1e6;

/**
 * Each fatigue detail of the design over this inspection's load check: the largest stress range of each
 * case, the damage of one ride cycle and the case that governs it, the ride cycles to the detail's limit,
 * and an emergency stop's damage per stop. The standards are named under the table, with the caution.
 */
export function FatigueTable({
  fatigue,
  pivots,
  system,
}: {
  fatigue: readonly StoredFatigueDetail[];
  pivots: readonly string[];
  system: UnitSystem;
}) {
  const rows = fatigue.map((d) => ({ d, governing: governingFatigueCase(d) }));
  return (
    <View style={styles.root}>
      <DataTable
        label="Fatigue per detail"
        rows={rows}
        rowKey={({ d }) => String(d.detail)}
        columns={[
          {
            key: 'detail',
            title: 'Detail',
            render: ({ d }) => `${pivotName(d.joint, pivots)} · ${d.name}\n${categoryText(d)}`,
            flex: 1.7,
          },
          {
            key: 'ranges',
            title: 'Largest stress range',
            render: ({ d }) =>
              d.cases
                .map(
                  (c) =>
                    `${FATIGUE_CASE_WORDS[c.kind]}: ${formatValue(c.maxRangeMPa * MPA, 'stress', system)}`,
                )
                .join('\n'),
            flex: 1.7,
          },
          {
            key: 'perRide',
            title: 'Damage per ride cycle',
            render: ({ d }) => formatDamage(d.damagePerRideCycle),
            numeric: true,
            flex: 1.1,
          },
          {
            key: 'governing',
            title: 'Governing case',
            render: ({ governing }) => (governing ? FATIGUE_CASE_WORDS[governing] : 'None: no damage'),
            flex: 1.2,
          },
          {
            key: 'toLimit',
            title: 'Ride cycles to limit',
            // The limit is said where the design sets one other than EN 1993-1-9's D = 1.
            render: ({ d }) =>
              cyclesToLimitText(d.damagePerRideCycle, d.damageLimit) +
              (d.damageLimit === 1 ? '' : `\n(limit D = ${formatDamage(d.damageLimit)})`),
            numeric: true,
            flex: 1.1,
          },
          {
            key: 'emergency',
            title: 'Per emergency stop',
            render: ({ d }) => {
              const e = d.cases.find((c) => c.kind === 'emergency_stop');
              return e ? formatDamage(e.damage) : 'No emergency stop in the design';
            },
            numeric: true,
            flex: 1.2,
          },
        ]}
      />
      <Text variant="small" muted>
        {FATIGUE_BASIS}
      </Text>
      <Caution />
    </View>
  );
}

const styles = StyleSheet.create({ root: { gap: space.sm } });
