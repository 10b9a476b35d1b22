import { DataTable } from '@/components/data-table';
import { EnvelopeMark } from '@/components/status-mark';
import type { EnvelopeItem } from '@/features/loads/engine';
import { formatEnvelopeItem, sortByConcern } from '@/features/loads/format';
import { LOAD_CASE_LABEL } from '@/features/loads/load-cases';
import type { UnitSystem } from '@/lib/units';
import type { MeasuredSource } from '@/lib/measured-format';

/**
 * Every checked value against its limit: value, limit, share of the limit used, status. Worst first.
 * `sources` (by envelope id, from `measuredSources`) lets measured values read as the inspector typed them.
 */
export function EnvelopeTable({
  items,
  system,
  sources,
}: {
  items: readonly EnvelopeItem[];
  system: UnitSystem;
  sources?: ReadonlyMap<string, MeasuredSource>;
}) {
  const shown = (i: EnvelopeItem) => formatEnvelopeItem(i, system, sources?.get(i.id));
  // When stops were run besides the ride cycle, each line says which case its value comes from.
  const byCase = items.some((i) => i.loadCase !== undefined);
  return (
    <DataTable
      label="Design envelope"
      rows={sortByConcern(items)}
      rowKey={(i) => i.id}
      columns={[
        { key: 'what', title: 'Checked', render: (i) => i.label, flex: 2 },
        { key: 'value', title: 'Value', render: (i) => shown(i).value, numeric: true, flex: 1.2 },
        { key: 'limit', title: 'Limit', render: (i) => shown(i).limit, numeric: true, flex: 1.2 },
        { key: 'ratio', title: 'Of limit', render: (i) => shown(i).ratio, numeric: true, flex: 0.8 },
        ...(byCase
          ? [
              {
                key: 'case',
                title: 'From',
                render: (i: EnvelopeItem) => (i.loadCase ? LOAD_CASE_LABEL[i.loadCase] : '—'),
                flex: 1.1,
              },
            ]
          : []),
        {
          key: 'status',
          title: 'Status',
          render: (i) => <EnvelopeMark status={i.status} compact />,
          flex: 1.1,
        },
      ]}
    />
  );
}
