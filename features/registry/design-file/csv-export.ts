import type { DesignData } from '@/features/loads/design-schema';
import {
  type Cells,
  DESIGN_CSV_COLUMNS,
  type RecordKind,
  cellsOf,
  fieldsOf,
} from '@/features/registry/design-file/columns';
import { csvCell } from '@/features/registry/design-file/csv-text';

/** The design data as CSV text (header first, CRLF line ends, as spreadsheets expect). */
export function designToCsv(d: DesignData): string {
  const rows: [RecordKind, Cells][] = [];
  const add = (
    record: RecordKind,
    value: Record<string, unknown>,
    key: Cells = {},
    fields = fieldsOf(record),
  ) => rows.push([record, { ...key, ...cellsOf(fields, value) }]);
  add('source', d.source);
  // The analysis record's fields are the data's own top-level fields.
  if (d.gravityMS2 !== undefined || d.nearMargin !== undefined) add('analysis', d);
  d.bodies.forEach((b, i) => add('body', b, { body: String(i) }));
  d.parts.forEach((p) => add('part', p, {}, fieldsOf('part', p.kind)));
  d.pivots.forEach((p) => add('pivot', p));
  d.pivots.forEach((p) => p.ndt?.forEach((plan) => add('ndt', plan, { joint: String(p.joint) })));
  d.seats.forEach((s) => add('seat', s));
  d.motion.forEach((m) => add('motion', m));
  for (const axis of ['gx', 'gz'] as const) {
    const limit = d.rider[axis];
    if (limit) add('rider', limit, { axis });
  }
  if (d.fatigue) {
    add('fatigue', d.fatigue);
    d.fatigue.details.forEach((f) => add('fatigue_detail', f));
  }
  const lines = [DESIGN_CSV_COLUMNS.join(',')];
  for (const [record, cells] of rows)
    lines.push(DESIGN_CSV_COLUMNS.map((c) => (c === 'record' ? record : csvCell(cells[c] ?? ''))).join(','));
  return `${lines.join('\r\n')}\r\n`;
}
