import { StyleSheet, View } from 'react-native';

import { DataTable } from '@/components/data-table';
import { EnvelopeMark } from '@/components/status-mark';
import { Text } from '@/components/text';
import { space } from '@/components/theme';
import type { EnvelopeItem, LoadCaseKind } from '@/features/loads/engine';
import { formatValue } from '@/features/loads/format';
import { type CaseSummary, governingText } from '@/features/loads/load-cases';
import type { UnitSystem } from '@/lib/units';

/** A case as a table row: a fresh analysis's summary or a stored one (peaks only). */
type CaseRow = Pick<CaseSummary, 'kind' | 'label' | 'joints' | 'status'>;

/** The load cases as a result shows them: the ride cycle and each stop, with the governing one named. */
export type CasesShown = {
  cases: readonly CaseRow[];
  governing: LoadCaseKind | null;
  /** The merged envelope, to name the item that makes the governing case govern. */
  envelope?: readonly Pick<EnvelopeItem, 'label' | 'ratio'>[];
};

const STOPS_NOTE =
  'Stops brake from full speed at the design deceleration (service) and the maker’s (emergency), ramping to ' +
  'rest; a rotating joint is braked at its worst arm angle, a swing at the centre.';

/**
 * The ride cycle and its stops side by side: each pivot's peak force and the largest drive torque in each
 * case, and the case's worst status; then which case governs the envelope and by which item (the envelope
 * table names the case of each line).
 */
export function LoadCasesTable({ cases, governing, envelope, system }: CasesShown & { system: UnitSystem }) {
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
            render: (c: CaseRow) => formatValue(c.joints[i].peakForceN, 'force', system),
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
                  render: (c: CaseRow) => (c.status ? <EnvelopeMark status={c.status} compact /> : '—'),
                  flex: 1.1,
                },
              ]
            : []),
        ]}
      />
      <Text variant="small" muted>
        {[governingText(governing, envelope), STOPS_NOTE].filter(Boolean).join(' ')}
      </Text>
    </View>
  );
}

/** The largest drive torque of the case, with the pivot it acts on. */
function peakTorque(c: CaseRow, system: UnitSystem): string {
  let at = 0;
  c.joints.forEach((j, i) => {
    if (Math.abs(j.peakTorqueNm) > Math.abs(c.joints[at].peakTorqueNm)) at = i;
  });
  const j = c.joints[at];
  return j ? `${formatValue(Math.abs(j.peakTorqueNm), 'moment', system)} (pivot ${at + 1})` : '—';
}

const styles = StyleSheet.create({ root: { gap: space.sm } });
