import { DataTable } from '@/components/data-table';
import { EnvelopeMark } from '@/components/status-mark';
import type { EnvelopeItem } from '@/features/loads/engine';
import { formatLimit, formatRatio, formatValue, sortByConcern } from '@/features/loads/format';
import type { UnitSystem } from '@/features/units';

/** Every checked value against its limit: value, limit, share of the limit used, status. Worst first. */
export function EnvelopeTable({ items, system }: { items: readonly EnvelopeItem[]; system: UnitSystem }) {
  return (
    <DataTable
      label="Design envelope"
      rows={sortByConcern(items)}
      rowKey={(i) => i.id}
      columns={[
        { key: 'what', title: 'Checked', render: (i) => i.label, flex: 2 },
        {
          key: 'value',
          title: 'Value',
          render: (i) => formatValue(i.value, i.quantity, system),
          numeric: true,
        },
        {
          key: 'limit',
          title: 'Limit',
          render: (i) => formatLimit(i.limit, i.quantity, system),
          numeric: true,
          flex: 1.2,
        },
        { key: 'ratio', title: 'Of limit', render: (i) => formatRatio(i.ratio), numeric: true, flex: 0.8 },
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
