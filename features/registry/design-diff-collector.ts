/**
 * The pieces every part of the design-revision comparison uses (features/registry/design-diff.ts): values
 * of one quantity written so two different values never read the same, the rule for a limit's change, the
 * collector of changes, and the matching of list items between two versions.
 */
import type {
  ChangeEffect,
  ChangeKind,
  DesignChange,
  DesignSection,
} from '@/features/registry/design-change';
import { type QuantityKind, type UnitSystem, formatSignificant, fromSI, pickDisplayUnit } from '@/lib/units';

// ——— numbers ———

/** The fewest significant figures that give `v` back exactly (to 12 figures: float noise is not a digit). */
function exactFigures(v: number): number {
  const target = Number(v.toPrecision(12));
  for (let s = 1; s <= 12; s++) if (Number(v.toPrecision(s)) === target) return s;
  return 12;
}

const minus = (text: string) => text.replace(/^-/, '−');

/**
 * Two values of one quantity in one unit, as the design documents state them: exact when the number is
 * short (0.4 mm stays "0.4 mm", never "0.4000 mm"), otherwise four figures — and always enough figures
 * that two different values never read the same.
 */
function numberPair(
  a: number | undefined,
  b: number | undefined,
  render: (v: number, figures: number) => string,
): [string | null, string | null] {
  // Each value as stated when that is short; a long one (a unit conversion) to four figures, more when needed.
  const own = (v: number) => {
    const f = exactFigures(v);
    return f > 6 ? 4 : f;
  };
  let extra = 0;
  const text = (v: number | undefined) => (v === undefined ? null : render(v, Math.min(12, own(v) + extra)));
  while (a !== undefined && b !== undefined && a !== b && text(a) === text(b) && extra < 12) extra++;
  return [text(a), text(b)];
}

/** Two SI values of a quantity in the person's unit system, in the unit that suits the larger one. */
export function quantityPair(
  a: number | undefined,
  b: number | undefined,
  kind: QuantityKind,
  system: UnitSystem,
): [string | null, string | null] {
  const unit = pickDisplayUnit(Math.max(Math.abs(a ?? 0), Math.abs(b ?? 0)), kind, system);
  const sep = unit.label === '°' ? '' : ' ';
  const shown = (v: number | undefined) => (v === undefined ? undefined : fromSI(v, kind, unit.mathjs));
  return numberPair(shown(a), shown(b), (v, f) => `${minus(formatSignificant(v, f))}${sep}${unit.label}`);
}

export const plainPair = (a: number | undefined, b: number | undefined, unit: string) =>
  numberPair(a, b, (v, f) => `${minus(formatSignificant(v, f))}${unit}`);

// ——— one field ———

export type Sense = 'max' | 'min';

/** A limit's change: raising a maximum or lowering a minimum loosens it; so does removing it. */
export function limitEffect(
  sense: Sense,
  before: number | undefined,
  after: number | undefined,
): ChangeEffect {
  if (before === undefined) return 'tightened';
  if (after === undefined) return 'loosened';
  const raised = after > before;
  return (sense === 'max') === raised ? 'loosened' : 'tightened';
}

const kindOf = (before: unknown, after: unknown): ChangeKind =>
  before === undefined ? 'added' : after === undefined ? 'removed' : 'changed';

export class Collector {
  readonly changes: DesignChange[] = [];
  constructor(readonly system: UnitSystem) {}

  /** A numeric field; `sense` makes it a limit. */
  number(
    section: DesignSection,
    where: string,
    field: string,
    before: number | undefined,
    after: number | undefined,
    format: (a: number | undefined, b: number | undefined) => [string | null, string | null],
    sense?: Sense,
  ) {
    if (before === after) return;
    const [b, a] = format(before, after);
    this.changes.push({
      section,
      where,
      field,
      before: b,
      after: a,
      kind: kindOf(before, after),
      effect: sense ? limitEffect(sense, before, after) : 'changed',
      limit: sense !== undefined,
    });
  }

  quantity(
    section: DesignSection,
    where: string,
    field: string,
    before: number | undefined,
    after: number | undefined,
    kind: QuantityKind,
    sense?: Sense,
  ) {
    this.number(section, where, field, before, after, (a, b) => quantityPair(a, b, kind, this.system), sense);
  }

  /** A text field (names, kinds); `effect` for the few texts that act as a limit. */
  text(
    section: DesignSection,
    where: string,
    field: string,
    before: string | undefined,
    after: string | undefined,
    effect: ChangeEffect = 'changed',
  ) {
    if (before === after) return;
    this.changes.push({
      section,
      where,
      field,
      before: before ?? null,
      after: after ?? null,
      kind: kindOf(before, after),
      effect,
      limit: effect !== 'changed',
    });
  }
}

/** Items of a list matched by a key, in the new list's order, then those only the old list had. */
export function matchBy<T>(before: readonly T[], after: readonly T[], key: (t: T) => string) {
  const keyed = (list: readonly T[]) => {
    const seen = new Map<string, number>();
    return list.map((item) => {
      const k = key(item);
      const n = seen.get(k) ?? 0;
      seen.set(k, n + 1);
      return { k: `${k}#${n}`, item };
    });
  };
  const old = new Map(keyed(before).map(({ k, item }) => [k, item]));
  const pairs: { before?: T; after?: T }[] = [];
  for (const { k, item } of keyed(after)) {
    pairs.push({ before: old.get(k), after: item });
    old.delete(k);
  }
  for (const item of old.values()) pairs.push({ before: item });
  return pairs;
}
