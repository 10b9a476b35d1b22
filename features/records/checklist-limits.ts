/**
 * Checklist values against their limits. A template item that takes a value may name a limit: one of a
 * pivot's design limits (so each ride is checked against its own documents) or one written in the
 * template. The same rules run on the phone at entry, in the shared analysis (which adds the values to the
 * envelope) and in the server's ingest check, so the three never disagree. Pure TypeScript, no React.
 */
import {
  DEFAULT_NEAR_MARGIN,
  type CycleResult,
  type EnvelopeItem,
  type EnvelopeStatus,
  type Evaluation,
  type Limit,
  evaluateLimit,
  worstStatus,
} from '@/features/loads/engine';
import type { ChecklistAnswer, Reading, ReadingKind } from '@/features/records/schema';
import type { DesignData } from '@/features/loads/design-schema';
import {
  type ChecklistContent,
  type ChecklistItem,
  type DesignLimitQuantity,
  designLimitKind,
} from '@/features/registry/schema';
import type { QuantityKind } from '@/lib/units';

/** A limit made concrete for one ride: what it is, in SI, and where it comes from. */
type ResolvedLimit = {
  limit: Limit;
  quantity: QuantityKind;
  /** Words for the reviewer: "design data: Main pivot shaft" or "template". */
  source: string;
  joint: number | null;
};

/** Why an item with a limit could not be checked on this ride. */
type LimitGap = { gap: string };

export const isGap = <T extends object>(r: T | LimitGap): r is LimitGap => 'gap' in r;

const quantityWords: Record<DesignLimitQuantity, string> = {
  pin_diameter: 'pin minimum diameter',
  clearance: 'clearance limit',
  speed: 'speed limit',
  amplitude: 'swing amplitude limit',
};

/**
 * The item's limit for this ride, a gap saying why there is none, or null when the item has no limit.
 * Design limits follow the load engine's own checks (features/loads/engine/cycle.ts), so a pin diameter
 * is judged by the share of its wear allowance used, like the engine's pin item.
 */
export function resolveLimit(
  item: Pick<ChecklistItem, 'limit' | 'measurementKind'>,
  design: DesignData | null,
): ResolvedLimit | LimitGap | null {
  const l = item.limit;
  if (!l) return null;
  if (l.source === 'template') {
    const kind = item.measurementKind;
    if (!kind || kind === 'count') return { gap: 'The template gives this item no unit to check against' };
    const limit: Limit =
      l.min !== null && l.max !== null
        ? { kind: 'range', min: l.min, max: l.max }
        : l.max !== null
          ? { kind: 'upper', max: l.max }
          : { kind: 'lower', min: l.min as number };
    return { limit, quantity: kind, source: 'template', joint: l.joint };
  }
  if (!design) return { gap: 'No design data on hand for this ride' };
  const quantity = designLimitKind[l.quantity] as QuantityKind;
  const pivot = design.pivots.find((p) => p.joint === l.joint);
  const motion = design.motion.find((m) => m.joint === l.joint);
  const where = `design data: ${pivot?.name ?? `pivot ${l.joint + 1}`}`;
  const missing = {
    gap: `This ride’s design data has no ${quantityWords[l.quantity]} for pivot ${l.joint + 1}`,
  };
  switch (l.quantity) {
    case 'pin_diameter':
      if (!pivot) return missing;
      return {
        limit: { kind: 'lower', min: pivot.minimumDiameterM, nominal: pivot.nominalDiameterM },
        quantity,
        source: where,
        joint: l.joint,
      };
    case 'clearance':
      if (!pivot) return missing;
      return { limit: { kind: 'upper', max: pivot.maxClearanceM }, quantity, source: where, joint: l.joint };
    case 'speed':
      if (motion?.maxRateRadS === undefined) return missing;
      return { limit: { kind: 'upper', max: motion.maxRateRadS }, quantity, source: where, joint: l.joint };
    case 'amplitude':
      if (motion?.maxAmplitudeRad === undefined) return missing;
      return {
        limit: { kind: 'upper', max: motion.maxAmplitudeRad },
        quantity,
        source: where,
        joint: l.joint,
      };
  }
}

/** The limit's bounds, where a value may sit exactly. */
function bounds(limit: Limit): number[] {
  if (limit.kind === 'upper') return [limit.max];
  if (limit.kind === 'lower') return [limit.min];
  return [limit.min, limit.max].filter((v): v is number => v !== undefined);
}

/**
 * A value typed in the limit's own unit lands a hair off it after conversion to SI (158.8 mm becomes
 * 0.15880000000000002 m); such a value is taken as exactly at the limit, which still counts as allowed.
 */
function snapToBound(value: number, limit: Limit): number {
  for (const b of bounds(limit)) if (Math.abs(value - b) <= 1e-9 * Math.max(Math.abs(b), 1e-12)) return b;
  return value;
}

/** Near margin of the ride's documents, else the project's default (the engine uses the same). */
const nearMarginOf = (design: DesignData | null) => design?.nearMargin ?? DEFAULT_NEAR_MARGIN;

/** A value (SI) against a resolved limit; speeds are judged by magnitude, as the engine judges rates. */
function evaluateChecklistValue(valueSI: number, resolved: ResolvedLimit, margin: number): Evaluation {
  const v = resolved.quantity === 'rate' ? Math.abs(valueSI) : valueSI;
  return evaluateLimit(snapToBound(v, resolved.limit), resolved.limit, margin);
}

/** Shortcut for the phone: the status of a value for an item on this ride, null when it has no limit. */
export function checklistValueStatus(
  item: Pick<ChecklistItem, 'limit' | 'measurementKind'>,
  design: DesignData | null,
  valueSI: number,
): (Evaluation & { resolved: ResolvedLimit }) | LimitGap | null {
  const resolved = resolveLimit(item, design);
  if (!resolved || isGap(resolved)) return resolved;
  return { ...evaluateChecklistValue(valueSI, resolved, nearMarginOf(design)), resolved };
}

/**
 * The reading an item's value is, when the item measures a pivot's pin or bushing (the readings hold
 * those too). Speeds and amplitudes are not shared: a motion reading far from the design must first be
 * confirmed in the readings form (features/inspections/plausibility), so there they stay checklist values.
 */
export function readingLink(item: Pick<ChecklistItem, 'limit'>): { kind: ReadingKind; joint: number } | null {
  const l = item.limit;
  return l?.source === 'design' && (l.quantity === 'pin_diameter' || l.quantity === 'clearance')
    ? { kind: l.quantity, joint: l.joint }
    : null;
}

/** The engine's own envelope item for a pivot reading, where the engine checks that kind. */
function engineItemId(kind: ReadingKind, joint: number): string | null {
  switch (kind) {
    case 'pin_diameter':
      return `joints.${joint}.pin.diameter`;
    case 'clearance':
      return `joints.${joint}.pin.clearance`;
    case 'speed':
      return `joints.${joint}.rate`;
    case 'amplitude':
      return `joints.${joint}.amplitude`;
    default:
      return null;
  }
}

/** The latest reading of a kind for a joint: the one the analysis uses (features/inspections/analysis). */
function latestReading(readings: readonly Reading[], kind: ReadingKind, joint: number): Reading | undefined {
  let found: Reading | undefined;
  for (const r of readings) if (r.kind === kind && r.joint === joint) found = r;
  return found;
}

export const checklistItemId = (itemId: string) => `checklist:${itemId}`;

function itemsById(content: ChecklistContent | null): Map<string, ChecklistItem> {
  return new Map((content?.areas ?? []).flatMap((a) => a.items.map((i) => [i.id, i] as const)));
}

/**
 * The envelope items of an inspection's checklist values, `checklist:<itemId>`. A value that is the very
 * reading the engine already checked against the same design limit (its pivot's latest of that kind) is
 * left to the engine's item, so one value is never counted twice; every other value is added here.
 */
export function checklistEnvelope(
  design: DesignData | null,
  content: ChecklistContent | null,
  checklist: readonly ChecklistAnswer[],
  readings: readonly Reading[],
  margin: number = nearMarginOf(design),
): EnvelopeItem[] {
  const items = itemsById(content);
  const out: EnvelopeItem[] = [];
  for (const answer of checklist) {
    const item = items.get(answer.itemId);
    const m = answer.measurement;
    if (!item || !m || answer.result === 'na') continue;
    const resolved = resolveLimit(item, design);
    if (!resolved || isGap(resolved)) continue;
    const link = readingLink(item);
    if (link && m.readingId && latestReading(readings, link.kind, link.joint)?.id === m.readingId) continue;
    out.push({
      id: checklistItemId(answer.itemId),
      label: `Checklist: ${answer.text}`,
      quantity: resolved.quantity,
      ...evaluateChecklistValue(m.valueSI, resolved, margin),
    });
  }
  return out;
}

/** The load check with the checklist values added to its envelope and its overall status. */
export function withChecklistLimits(
  result: CycleResult,
  design: DesignData | null,
  content: ChecklistContent | null,
  checklist: readonly ChecklistAnswer[],
  readings: readonly Reading[],
): CycleResult {
  const extra = checklistEnvelope(design, content, checklist, readings, result.nearMargin);
  if (extra.length === 0) return result;
  const envelope = [...result.envelope, ...extra];
  return { ...result, envelope, status: worstStatus(envelope.map((e) => e.status)) };
}

/**
 * Where an answer's value stands in an analysed envelope: its own item, or the engine's item for the
 * reading it shares. Undefined when the value was not checked.
 */
export function envelopeItemOf(
  answer: ChecklistAnswer,
  envelope: readonly EnvelopeItem[],
  readings: readonly Pick<Reading, 'id' | 'kind' | 'joint'>[],
): EnvelopeItem | undefined {
  const own = envelope.find((e) => e.id === checklistItemId(answer.itemId));
  if (own) return own;
  const reading = answer.measurement?.readingId
    ? readings.find((r) => r.id === answer.measurement?.readingId)
    : undefined;
  if (!reading || reading.joint === null) return undefined;
  const id = engineItemId(reading.kind, reading.joint);
  return id ? envelope.find((e) => e.id === id) : undefined;
}

type LimitIssue = {
  index: number;
  itemId: string;
  /** Null when only the phone's own verdict said "over" (no limit resolvable here). */
  evaluation: Evaluation | null;
  resolved: ResolvedLimit | null;
};

/**
 * Answers marked Pass whose value is over its limit with no written reason: the phone will not let one
 * through and the server refuses the record (issue path `checklist.<index>.overLimitReason`).
 */
export function passedOverLimitWithoutReason(
  design: DesignData | null,
  content: ChecklistContent | null,
  checklist: readonly ChecklistAnswer[],
): LimitIssue[] {
  const items = itemsById(content);
  const margin = nearMarginOf(design);
  const out: LimitIssue[] = [];
  checklist.forEach((answer, index) => {
    if (answer.result !== 'pass' || !answer.measurement || answer.overLimitReason?.trim()) return;
    const item = items.get(answer.itemId);
    const found = item ? resolveLimit(item, design) : null;
    const resolved = found && !isGap(found) ? found : null;
    const evaluation = resolved ? evaluateChecklistValue(answer.measurement.valueSI, resolved, margin) : null;
    // The phone's own verdict counts too: a record that says "over" is never passed without a reason.
    if (evaluation?.status === 'over' || answer.measurement.status === 'over')
      out.push({ index, itemId: answer.itemId, evaluation, resolved });
  });
  return out;
}

/**
 * Old records could hold a pivot quantity twice, once in the checklist and once in the readings. A value
 * not linked to a reading is compared with the readings of the same pivot and kind; any that differ by
 * more than rounding are returned.
 */
export function disagreeingReadings<R extends Pick<Reading, 'kind' | 'joint' | 'valueSI'>>(
  item: Pick<ChecklistItem, 'limit'> | undefined,
  answer: ChecklistAnswer,
  readings: readonly R[],
): R[] {
  const link = item ? readingLink(item) : null;
  const m = answer.measurement;
  if (!link || !m || m.readingId) return [];
  const tolerance = (v: number) => 1e-6 * Math.max(Math.abs(v), Math.abs(m.valueSI), 1e-9);
  return readings.filter(
    (r) =>
      r.kind === link.kind &&
      r.joint === link.joint &&
      Math.abs(r.valueSI - m.valueSI) > tolerance(r.valueSI),
  );
}

export type { EnvelopeStatus };
