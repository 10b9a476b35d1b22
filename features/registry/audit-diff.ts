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

/** How deep nested records are opened up, so a changed revision reads "data.source.revision". */
const MAX_DEPTH = 3;

/**
 * The fields that differ between the record before and after the change (a create has no "before", a
 * delete no "after"), in the record's own field order. Nested records are opened up to a few levels
 * ("data.source.revision"); a changed list is named with its length rather than printed whole. Fields
 * that only identify the record (id, dates of creation) are left out.
 */
export function changedFields(before: unknown, after: unknown): FieldChange[] {
  const out: FieldChange[] = [];
  const hasBefore = isRecord(before);
  const hasAfter = isRecord(after);
  const walk = (prefix: string, b: Record<string, unknown>, a: Record<string, unknown>, depth: number) => {
    const keys = [...new Set([...Object.keys(b), ...Object.keys(a)])].filter(
      (k) => depth > 0 || (k !== 'id' && k !== 'createdAt'),
    );
    for (const k of keys) {
      const field = prefix ? `${prefix}.${k}` : k;
      const bv = b[k];
      const av = a[k];
      if (JSON.stringify(bv) === JSON.stringify(av)) continue;
      if (isRecord(bv) && isRecord(av) && depth < MAX_DEPTH) {
        walk(field, bv, av, depth + 1);
        continue;
      }
      out.push({
        field,
        before: hasBefore ? listOrValue(bv) : null,
        after: hasAfter ? listOrValue(av) : null,
      });
    }
  };
  walk('', hasBefore ? before : {}, hasAfter ? after : {}, 0);
  return out;
}

/** A list of records as its length ("14 entries"); anything else as one line. */
function listOrValue(v: unknown): string {
  if (Array.isArray(v) && v.some((x) => typeof x === 'object' && x !== null))
    return `${v.length} ${v.length === 1 ? 'entry' : 'entries'}`;
  return valueText(v);
}
