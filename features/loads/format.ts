import type { EnvelopeItem, Limit } from '@/features/loads/engine';
import { type QuantityKind, type UnitSystem, formatQuantity, formatSignificant } from '@/features/units';

/** A value as the person reads it: number and unit in their unit system. */
export function formatValue(valueSI: number, kind: QuantityKind, system: UnitSystem): string {
  return formatQuantity(valueSI, kind, system).text;
}

/** The limit side that applies, e.g. "≤ 210 kN", "≥ 79.0 mm", "−1.5 to 6 g". */
export function formatLimit(limit: Limit, kind: QuantityKind, system: UnitSystem): string {
  const f = (v: number) => formatQuantity(v, kind, system).text;
  switch (limit.kind) {
    case 'upper':
      return `≤ ${f(limit.max)}`;
    case 'lower':
      return `≥ ${f(limit.min)}`;
    case 'range':
      if (limit.min !== undefined && limit.max !== undefined) return `${f(limit.min)} to ${f(limit.max)}`;
      return limit.min !== undefined ? `≥ ${f(limit.min)}` : `≤ ${f(limit.max ?? 0)}`;
  }
}

/** The ratio as a percentage of the limit used; "—" where it has no finite value. */
export function formatRatio(ratio: number | null): string {
  if (ratio === null || !Number.isFinite(ratio)) return '—';
  return `${formatSignificant(ratio * 100, 3)} %`;
}

/** Envelope items, worst first: over, then near, then within; by ratio within each. */
export function sortByConcern(items: readonly EnvelopeItem[]): EnvelopeItem[] {
  const rank = { over: 0, near: 1, within: 2 } as const;
  return [...items].sort(
    (a, b) => rank[a.status] - rank[b.status] || (b.ratio ?? Infinity) - (a.ratio ?? Infinity),
  );
}
