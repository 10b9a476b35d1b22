/**
 * What an audit entry changed, field by field, in words short enough for a list. Pure, so the wording of
 * the log is tested without a screen.
 */
export type FieldChange = { field: string; before: string | null; after: string | null };

const MAX_TEXT = 140;

/** A stored value as one line: text as it is, numbers and flags plainly, structures as compact JSON. */
export function valueText(value: unknown): string {
  if (value === null || value === undefined) return '—';
  if (typeof value === 'string') return value === '' ? '—' : clip(value);
  if (typeof value === 'number' || typeof value === 'boolean') return String(value);
  return clip(JSON.stringify(value));
}

function clip(text: string): string {
  const one = text.replace(/\s+/g, ' ');
  return one.length > MAX_TEXT ? `${one.slice(0, MAX_TEXT - 1)}…` : one;
}

const isRecord = (v: unknown): v is Record<string, unknown> =>
  typeof v === 'object' && v !== null && !Array.isArray(v);

/**
 * The fields that differ between the record before and after the change (a create has no "before", a
 * delete no "after"), in the record's own field order. Fields that only identify the record (id, dates
 * of creation) are left out.
 */
export function changedFields(before: unknown, after: unknown): FieldChange[] {
  const b = isRecord(before) ? before : {};
  const a = isRecord(after) ? after : {};
  const keys = [...new Set([...Object.keys(b), ...Object.keys(a)])].filter(
    (k) => k !== 'id' && k !== 'createdAt',
  );
  return keys
    .filter((k) => JSON.stringify(b[k]) !== JSON.stringify(a[k]))
    .map((k) => ({
      field: k,
      before: isRecord(before) ? valueText(b[k]) : null,
      after: isRecord(after) ? valueText(a[k]) : null,
    }));
}
