import { LIMIT_EQUAL_TOLERANCE, type Limit } from '@/lib/limits';
import { envelopeStatusVocabulary, labelsOf, type EnvelopeStatus } from '@/lib/vocabulary';
/**
 * Envelope evaluation: a value against its design limit → ratio and status. The ratio is the share of
 * the allowance used: 1 means at the limit, above 1 over it. The statuses, their words and marks are
 * the vocabulary's (lib/vocabulary.ts).
 */

export type { EnvelopeStatus };

export const ENVELOPE_STATUS_LABEL = labelsOf(envelopeStatusVocabulary);

/** Where 'near' starts, as a ratio of the limit, unless the ride's documents say otherwise. */
export const DEFAULT_NEAR_MARGIN = 0.9;

/** The value, set exactly onto a bound of the limit it equals within LIMIT_EQUAL_TOLERANCE. */
function onBound(value: number, limit: Limit): number {
  const bounds =
    limit.kind === 'upper' ? [limit.max] : limit.kind === 'lower' ? [limit.min] : [limit.min, limit.max];
  for (const b of bounds)
    if (
      b !== undefined &&
      Math.abs(value - b) <= LIMIT_EQUAL_TOLERANCE * Math.max(Math.abs(value), Math.abs(b))
    )
      return b;
  return value;
}

export type Evaluation = { value: number; limit: Limit; ratio: number; status: EnvelopeStatus };

export function limitRatio(value: number, limit: Limit): number {
  switch (limit.kind) {
    case 'upper':
      return value / limit.max;
    case 'lower':
      if (limit.nominal !== undefined) return (limit.nominal - value) / (limit.nominal - limit.min);
      return value > 0 ? limit.min / value : Infinity;
    case 'range': {
      const ref = rangeReference(limit);
      if (value >= ref) return limit.max === undefined ? 0 : ratioOrOver(value - ref, limit.max - ref);
      return limit.min === undefined ? 0 : ratioOrOver(ref - value, ref - limit.min);
    }
  }
}

function rangeReference(limit: { min?: number; max?: number; reference?: number }): number {
  if (limit.reference !== undefined) return limit.reference;
  const min = limit.min ?? -Infinity;
  const max = limit.max ?? Infinity;
  if (min <= 0 && 0 <= max) return 0;
  if (limit.min !== undefined && limit.max !== undefined) return (limit.min + limit.max) / 2;
  return limit.min ?? limit.max ?? 0;
}

/** used / allowance, where a zero allowance leaves only "none used" or "over". */
function ratioOrOver(used: number, allowance: number): number {
  if (allowance > 0) return used / allowance;
  return used > 0 ? Infinity : 0;
}

/** 'over' only beyond the limit: a value exactly at it is still allowed, so it is 'near'. */
export function envelopeStatus(ratio: number, margin: number = DEFAULT_NEAR_MARGIN): EnvelopeStatus {
  if (!(ratio <= 1)) return 'over'; // NaN counts as over: an unreadable result is not a pass
  if (ratio >= margin) return 'near';
  return 'within';
}

export function evaluateLimit(value: number, limit: Limit, margin: number = DEFAULT_NEAR_MARGIN): Evaluation {
  const ratio = limitRatio(onBound(value, limit), limit);
  return { value, limit, ratio, status: envelopeStatus(ratio, margin) };
}

/**
 * A history against a limit: the sample that uses most of the allowance (for a range, the highest
 * and the lowest values are both candidates).
 */
export function evaluateExtremes(
  min: number,
  max: number,
  limit: Limit,
  margin: number = DEFAULT_NEAR_MARGIN,
): Evaluation {
  const high = evaluateLimit(max, limit, margin);
  const low = evaluateLimit(min, limit, margin);
  return low.ratio > high.ratio ? low : high;
}

const severity: Record<EnvelopeStatus, number> = { within: 0, near: 1, over: 2 };

export function worstStatus(statuses: Iterable<EnvelopeStatus>): EnvelopeStatus {
  let worst: EnvelopeStatus = 'within';
  for (const s of statuses) if (severity[s] > severity[worst]) worst = s;
  return worst;
}

export { LIMIT_EQUAL_TOLERANCE, type Limit } from '@/lib/limits';
