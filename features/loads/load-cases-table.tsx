import { StyleSheet, View } from 'react-native';

import { DataTable } from '@/components/data-table';
import { EnvelopeMark } from '@/components/status-mark';
import { Text } from '@/components/text';
import { space } from '@/components/theme';
import type { LoadCaseKind } from '@/features/loads/engine';
import { formatValue } from '@/features/loads/format';
import { type CaseSummary, LOAD_CASE_LABEL } from '@/features/loads/load-cases';
import type { UnitSystem } from '@/lib/units';

/** The load cases as a result shows them: the ride cycle and each stop, with the governing one named. */
export type CasesShown = { cases: readonly CaseSummary[]; governing: LoadCaseKind | null };

/**
 * The ride cycle and its stops side by side: each pivot's peak force and the largest drive torque in each
 * case, and the case's worst status; then which case governs the envelope (the envelope table names the
 * case of each line).
 */
export function LoadCasesTable({ cases, governing, system }: CasesShown & { system: UnitSystem }) {
  const joints = cases[0]?.joints ?? [];
  const hasStatus = cases.some((c) => c.status !== null);
  return (
    <View style={styles.root}>
      <DataTable
        label="Load cases"
        rows={[...cases]}
        rowKey={(c) => c.kind}
        columns={[
          {
            key: 'case',
            title: 'Case',
            render: (c) => (c.kind === governing ? `${c.label} (governs)` : c.label),
            flex: 1.4,
          },
          ...joints.map((j, i) => ({
            key: `force${i}`,
            title: `Pivot ${i + 1} force`,
            render: (c: CaseSummary) => formatValue(c.joints[i].peakForceN, 'force', system),
            numeric: true,
          })),
          {
            key: 'torque',
            title: 'Peak torque',
            render: (c) => peakTorque(c, system),
            numeric: true,
            flex: 1.2,
          },
          ...(hasStatus
            ? [
                {
                  key: 'status',
                  title: 'Worst status',
                  render: (c: CaseSummary) => (c.status ? <EnvelopeMark status={c.status} compact /> : '—'),
                  flex: 1.1,
                },
              ]
            : []),
        ]}
      />
      <Text variant="small" muted>
        {governing
          ? `Governing case: ${LOAD_CASE_LABEL[governing]}. Stops brake from full speed at the deceleration given, ramping to rest; a rotating joint is braked at its worst arm angle.`
          : 'Stops brake from full speed at the deceleration given, ramping to rest; a rotating joint is braked at its worst arm angle.'}
      </Text>
    </View>
  );
}

/** The largest drive torque of the case, with the pivot it acts on. */
function peakTorque(c: CaseSummary, system: UnitSystem): string {
  let at = 0;
  c.joints.forEach((j, i) => {
    if (Math.abs(j.peakTorqueNm) > Math.abs(c.joints[at].peakTorqueNm)) at = i;
  });
  const j = c.joints[at];
  return j ? `${formatValue(Math.abs(j.peakTorqueNm), 'moment', system)} (pivot ${at + 1})` : '—';
}

const styles = StyleSheet.create({ root: { gap: space.sm } });
