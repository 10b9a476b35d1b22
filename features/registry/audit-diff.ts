/**
 * What an audit entry changed, field by field, in words short enough for a list. Pure, so the wording of
 * the log is tested without a screen.
 */
import { type DesignData, designDataSchema } from '@/features/loads/design-schema';
import { type ChangeEffect, changeText, diffDesign } from '@/features/registry/design-diff';
import type { UnitSystem } from '@/lib/units';
import { designDocumentKindVocabulary, type DesignDocumentKind } from '@/lib/vocabulary';

/** `effect` is set for design-data limits: whether the change loosened or tightened the limit. */
type FieldChange = {
  field: string;
  before: string | null;
  after: string | null;
  effect?: ChangeEffect;
};

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

// ——— design data entries ———

const designFieldLabel: Record<string, string> = {
  version: 'Version',
  reason: 'Why',
  origin: 'How it came in',
  approvalState: 'Approval',
  decisionReason: 'Decision reason',
  // A document attached to or removed from a version (server/registry/design-documents.ts).
  kind: 'Document',
  title: 'Title',
  revision: 'Document revision',
  issuedOn: 'Issued on',
  sha256: 'File (SHA-256)',
};
const approvalWords: Record<string, string> = {
  pending: 'Waiting for a second person',
  in_force: 'In force',
  rejected: 'Rejected',
};
const originWords: Record<string, string> = {
  editor: 'Typed in the app',
  import_csv: 'Imported from CSV',
  import_json: 'Imported from JSON',
  seed: 'Demo data',
};

/** The design data an entry holds on one side, if it is there and still reads as design data. */
function designOf(side: unknown): DesignData | null {
  if (!isRecord(side) || side.data === undefined || side.data === null) return null;
  const parsed = designDataSchema.safeParse(side.data);
  return parsed.success ? parsed.data : null;
}

/**
 * A design-data entry's changes in words: the version's own fields with their names ("Approval: Waiting
 * for a second person") and the design comparison with units ("Max clearance at Main pivot: 0.4 mm →
 * 0.6 mm (loosened)"). null when the entry holds no design data after the change (a rejection).
 */
function designChanges(before: unknown, after: unknown, system: UnitSystem): FieldChange[] | null {
  const next = designOf(after);
  if (!next) return null;
  const prev = designOf(before);
  if (!prev)
    return [
      {
        field: 'Design data',
        before: null,
        after: `First version: ${next.source.document}, revision ${next.source.revision}`,
      },
    ];
  return diffDesign(prev, next, system).map((c) => ({
    field: c.where ? `${c.field} at ${c.where}` : c.field,
    before: c.before,
    after: c.after,
    ...(c.limit ? { effect: c.effect } : {}),
  }));
}

/** The design comparison of an entry as sentences, or null when it holds no design data after the change. */
export function designAuditLines(before: unknown, after: unknown, system: UnitSystem): string[] | null {
  const next = designOf(after);
  const prev = designOf(before);
  if (!next || !prev) return null;
  return diffDesign(prev, next, system).map(changeText);
}

/**
 * What an entry changed, as the log shows it. Design-data entries read in words and units; every other
 * entity (and any old design entry whose data no longer parses) falls back to `changedFields`.
 */
export function entryChanges(
  entity: string,
  before: unknown,
  after: unknown,
  system: UnitSystem,
): FieldChange[] {
  const generic = changedFields(before, after);
  if (entity !== 'design') return generic;
  const design = designChanges(before, after, system);
  const words = (field: string, v: string | null) =>
    v === null
      ? null
      : field === 'approvalState'
        ? (approvalWords[v] ?? v)
        : field === 'origin'
          ? (originWords[v] ?? v)
          : field === 'kind' && v in designDocumentKindVocabulary
            ? designDocumentKindVocabulary[v as DesignDocumentKind].label
            : v;
  const own = generic
    .filter((c) => !(design && (c.field === 'data' || c.field.startsWith('data.'))))
    .map((c) => ({
      field: designFieldLabel[c.field] ?? c.field,
      before: words(c.field, c.before),
      after: words(c.field, c.after),
    }));
  return [...own, ...(design ?? [])];
}
