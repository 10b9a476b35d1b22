/**
 * Load-check numbers in the person's unit system, by the one rule of lib/measured-format.ts: computed
 * values to four significant figures, typed values as typed, never rounded across their limit.
 */
import type { CycleWarning, EnvelopeItem, Limit } from '@/features/loads/engine';
import { type QuantityKind, type UnitSystem } from '@/lib/units';
import {
  type MeasuredSource,
  formatAgainstLimit,
  formatLimitOnly,
  formatMeasured,
  formatShareOfLimit,
} from '@/lib/measured-format';

/** A computed value as the person reads it: number and unit in their unit system. */
export function formatValue(valueSI: number, kind: QuantityKind, system: UnitSystem): string {
  return formatMeasured(valueSI, kind, system).text;
}

/** A limit on its own, e.g. "≤ 210.0 kN", "≥ 79.00 mm", "-1.500 g to 6.000 g". */
export function formatLimit(limit: Limit, kind: QuantityKind, system: UnitSystem): string {
  return formatLimitOnly(limit, kind, system);
}

/** The ratio as a percentage of the limit used; "—" where it has no finite value; never rounded to 100 %. */
export function formatRatio(ratio: number | null): string {
  return formatShareOfLimit(ratio);
}

/** Envelope items whose value an inspector measured (typed), rather than one the engine computed. */
function isMeasuredItem(id: string): boolean {
  return /\.pin\.(diameter|clearance)$/.test(id) || id.startsWith('checklist:');
}

/**
 * An envelope item's value, limit and share of the limit, shown together so that the comparison read
 * is the true one; `source` is the typed text of a measured value, when the record has it.
 */
export function formatEnvelopeItem(
  item: Pick<EnvelopeItem, 'id' | 'value' | 'limit' | 'ratio' | 'quantity'>,
  system: UnitSystem,
  source?: MeasuredSource,
): { value: string; limit: string; ratio: string } {
  // A measured value without its typed text (older records) is recovered in the shown unit, not padded.
  const from = source ?? (isMeasuredItem(item.id) ? { unit: null, recover: true } : undefined);
  const shown = formatAgainstLimit(item.value, item.limit, item.quantity, system, from);
  return { value: shown.value, limit: shown.limit, ratio: formatShareOfLimit(item.ratio) };
}

/**
 * A value beside a one-sided limit (trend charts and their tables): shown so that its side of the limit
 * reads true, a measured value in its shortest exact form; `limit` is the limit's text to print with it.
 */
export function formatBesideLimit(
  valueSI: number,
  limit: { side: 'min' | 'max'; si: number } | null,
  kind: QuantityKind,
  system: UnitSystem,
  measured: boolean,
): { value: string; limit: string | null } {
  const source = measured ? { recover: true } : undefined;
  if (!limit) return { value: formatMeasured(valueSI, kind, system, source).text, limit: null };
  const l: Limit = limit.side === 'min' ? { kind: 'lower', min: limit.si } : { kind: 'upper', max: limit.si };
  const shown = formatAgainstLimit(valueSI, l, kind, system, source);
  return { value: shown.value, limit: shown.limit.replace(/^[≤≥] /, '') };
}

type ReadingLike = {
  id?: string;
  kind: string;
  joint: number | null;
  unit: string;
  entered?: string | null;
  spreadSI?: number | null;
};
type ChecklistLike = {
  itemId: string;
  measurement?: { unit: string; entered?: string; readingId?: string } | null;
};

/**
 * Where each measured envelope item's value was typed, by envelope id: a pivot's pin diameter and
 * clearance come from its latest reading of the kind (as features/inspections/analysis.ts takes them),
 * a checklist item's from its answer or the reading it shares.
 */
export function measuredSources(record: {
  readings: readonly ReadingLike[];
  checklist?: readonly ChecklistLike[];
}): Map<string, MeasuredSource> {
  const out = new Map<string, MeasuredSource>();
  const source = (r: ReadingLike): MeasuredSource => ({
    entered: r.entered ?? null,
    unit: r.unit,
    spreadSI: r.spreadSI ?? null,
  });
  for (const r of record.readings) {
    if (r.joint === null) continue;
    if (r.kind === 'pin_diameter') out.set(`joints.${r.joint}.pin.diameter`, source(r));
    if (r.kind === 'clearance') out.set(`joints.${r.joint}.pin.clearance`, source(r));
  }
  const byId = new Map(record.readings.filter((r) => r.id).map((r) => [r.id as string, r]));
  for (const a of record.checklist ?? []) {
    const m = a.measurement;
    if (!m) continue;
    const shared = m.readingId ? byId.get(m.readingId) : undefined;
    out.set(`checklist:${a.itemId}`, shared ? source(shared) : { entered: m.entered ?? null, unit: m.unit });
  }
  return out;
}

/** Envelope items, worst first: over, then near, then within; by ratio within each. */
export function sortByConcern(items: readonly EnvelopeItem[]): EnvelopeItem[] {
  const rank = { over: 0, near: 1, within: 2 } as const;
  return [...items].sort(
    (a, b) => rank[a.status] - rank[b.status] || (b.ratio ?? Infinity) - (a.ratio ?? Infinity),
  );
}

/**
 * A result's warnings, those asking for attention first, in the engine's order within each level. An
 * answer stored or sent before results carried warnings has none (missing reads as empty).
 */
export function sortWarnings(warnings: readonly CycleWarning[] | null | undefined): CycleWarning[] {
  const list = warnings ?? [];
  return [...list.filter((w) => w.level === 'warning'), ...list.filter((w) => w.level !== 'warning')];
}

/**
 * Warnings of the same kind about the same pivot or seat, as one line with how many more there are: the
 * runs of a stop case (one per start angle) each report theirs, and a list of near-copies would bury the
 * rest. The first of each kind is kept in full; order as `sortWarnings`.
 */
export function groupWarnings(
  warnings: readonly CycleWarning[] | null | undefined,
): { warning: CycleWarning; more: number }[] {
  const groups = new Map<string, { warning: CycleWarning; more: number }>();
  for (const w of sortWarnings(warnings)) {
    const key = `${w.level}|${w.code}|${w.joint ?? ''}|${w.seat ?? ''}`;
    const held = groups.get(key);
    if (held) held.more++;
    else groups.set(key, { warning: w, more: 0 });
  }
  return [...groups.values()];
}

/** What a warning concerns, in the words of the results: "Pivot 2 · Gondola", "Seat Front row"; or null. */
export function warningSubject(
  w: Pick<CycleWarning, 'joint' | 'seat'>,
  jointNames: readonly string[],
  seatNames: readonly string[],
): string | null {
  if (w.joint !== undefined)
    return `Pivot ${w.joint + 1}${jointNames[w.joint] ? ` · ${jointNames[w.joint]}` : ''}`;
  if (w.seat !== undefined) return seatNames[w.seat] ? `Seat ${seatNames[w.seat]}` : `Seat ${w.seat + 1}`;
  return null;
}
