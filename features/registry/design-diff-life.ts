/**
 * What a revision changes in the data behind a pivot's life: its pin-check data (EN 1993-1-8), its NDT
 * plans and the ride's fatigue details (EN 1993-1-9). Which changes loosen a check:
 * - pin check: a higher steel strength, a lower partial factor, no longer replaceable (its serviceability
 *   checks stop), or the pin check removed; plate thicknesses and the gap are geometry (changed);
 * - NDT: a longer interval, or a plan removed;
 * - fatigue: a higher detail category, a lower stress per load, lower γFf or γMf, a higher damage limit,
 *   a detail removed; the ride cycle and the stops per ride cycle describe how the ride runs (changed).
 * A partial factor or damage limit the data leaves out counts at its default (EN 1993-1-8's recommended
 * values, γFf = γMf = 1, damage limit 1), so writing the default out changes nothing.
 */
import type {
  DesignData,
  DesignPivot,
  FatigueDetail,
  NdtPlan,
  PinCheckData,
} from '@/features/loads/design-schema';
import type { ChangeEffect } from '@/features/registry/design-change';
import { type Collector, limitEffect, matchBy, plainPair } from '@/features/registry/design-diff-collector';
import {
  PIN_FACTOR_DEFAULTS,
  categoryText,
  curveText,
  detailLoadText,
  fatigueKindLabel,
  ndtMethodLabel,
  pinSteelText,
  platesText,
  stressFactorText,
  stressPerLoad,
} from '@/features/registry/design-life-format';

/** Added: a new check (tightened); removed: a check no longer made (loosened). */
const presenceEffect = (before: unknown, after: unknown): ChangeEffect =>
  before === undefined ? 'tightened' : after === undefined ? 'loosened' : 'changed';

export function pinCheckChanges(
  c: Collector,
  where: string,
  before: DesignPivot | undefined,
  after: DesignPivot | undefined,
) {
  const b = before?.pinCheck;
  const a = after?.pinCheck;
  if (!b || !a) {
    if (b === a) return;
    const whole = (p: PinCheckData | undefined, pivot: DesignPivot | undefined) =>
      p && pivot ? `${pinSteelText(p, c.system)}; ${platesText(p, pivot.shear, c.system)}` : undefined;
    c.text('pinChecks', where, 'Pin check data', whole(b, before), whole(a, after), presenceEffect(b, a));
    return;
  }
  c.text('pinChecks', where, 'Pin steel', b.pinGrade, a.pinGrade);
  c.quantity('pinChecks', where, 'Pin yield strength f_y', b.pinFyPa, a.pinFyPa, 'stress', 'max');
  c.quantity('pinChecks', where, 'Pin ultimate strength f_u', b.pinFuPa, a.pinFuPa, 'stress', 'max');
  c.text('pinChecks', where, 'Plate steel', b.plateGrade, a.plateGrade);
  c.quantity('pinChecks', where, 'Plate yield strength f_y', b.plateFyPa, a.plateFyPa, 'stress', 'max');
  c.quantity('pinChecks', where, 'Inner plate (lug)', b.innerPlateM, a.innerPlateM, 'lengthSmall');
  c.quantity('pinChecks', where, 'Outer plate (cheek)', b.outerPlateM, a.outerPlateM, 'lengthSmall');
  c.quantity('pinChecks', where, 'Gap', b.gapM, a.gapM, 'lengthSmall');
  const replaceable = (v: boolean | undefined) => (v ? 'Replaceable' : 'Not replaceable');
  if (Boolean(b.replaceable) !== Boolean(a.replaceable))
    c.text(
      'pinChecks',
      where,
      'Pin',
      replaceable(b.replaceable),
      replaceable(a.replaceable),
      a.replaceable ? 'tightened' : 'loosened',
    );
  const factors = [
    ['γM0', 'gammaM0'],
    ['γM2', 'gammaM2'],
    ['γM6,ser', 'gammaM6ser'],
    ['γF', 'gammaF'],
  ] as const;
  for (const [label, key] of factors)
    c.number(
      'pinChecks',
      where,
      `Partial factor ${label}`,
      b[key] ?? PIN_FACTOR_DEFAULTS[key],
      a[key] ?? PIN_FACTOR_DEFAULTS[key],
      (x, y) => plainPair(x, y, ''),
      'min',
    );
}

/** NDT plans matched by method: an interval lengthened or a plan dropped loosens. */
export function ndtChanges(
  c: Collector,
  where: string,
  before: readonly NdtPlan[] | undefined,
  after: readonly NdtPlan[] | undefined,
) {
  for (const pair of matchBy(before ?? [], after ?? [], (p) => p.method)) {
    const p = pair.after ?? pair.before;
    if (!p) continue;
    const field = `${p.method} (${ndtMethodLabel[p.method]})`;
    const days = (plan: NdtPlan | undefined) => plan && `every ${plan.intervalDays} days`;
    if (!pair.before || !pair.after) {
      c.text(
        'ndt',
        where,
        field,
        days(pair.before),
        days(pair.after),
        presenceEffect(pair.before, pair.after),
      );
      continue;
    }
    c.number(
      'ndt',
      where,
      `${field} interval`,
      pair.before.intervalDays,
      pair.after.intervalDays,
      (x, y) => plainPair(x, y, ' days'),
      'max',
    );
    c.text('ndt', where, `${field} where`, pair.before.note, pair.after.note);
  }
}

/** The ride cycle and each detail, matched by pivot and name. */
export function fatigueChanges(c: Collector, before: DesignData | null, after: DesignData) {
  const b = before?.fatigue;
  const a = after.fatigue;
  if (!b && !a) return;
  c.quantity('fatigue', 'Ride cycle', 'Ride cycle time', b?.rideCycleS, a?.rideCycleS, 'time');
  c.number(
    'fatigue',
    'Ride cycle',
    'Service stops per ride cycle',
    b ? (b.stopsPerRideCycle ?? 1) : undefined,
    a ? (a.stopsPerRideCycle ?? 1) : undefined,
    (x, y) => plainPair(x, y, ''),
  );
  const label = (d: DesignData | null, f: FatigueDetail) => {
    const pivot = d?.pivots.find((p) => p.joint === f.joint);
    return `${f.name} (P${f.joint + 1}${pivot ? ` · ${pivot.name}` : ''})`;
  };
  for (const pair of matchBy(b?.details ?? [], a?.details ?? [], (f) => `${f.joint}|${f.name}`)) {
    const f = pair.after ?? pair.before;
    if (!f) continue;
    const where = label(pair.after ? after : before, f);
    if (!pair.before || !pair.after) {
      const whole = (x: FatigueDetail | undefined) =>
        x && `${fatigueKindLabel[x.kind]}, category ${categoryText(x, c.system)}`;
      c.text(
        'fatigue',
        where,
        'Fatigue detail',
        whole(pair.before),
        whole(pair.after),
        presenceEffect(pair.before, pair.after),
      );
      continue;
    }
    detailChanges(c, where, pair.before, pair.after, before, after);
  }
}

function detailChanges(
  c: Collector,
  where: string,
  b: FatigueDetail,
  a: FatigueDetail,
  before: DesignData | null,
  after: DesignData,
) {
  c.text('fatigue', where, 'Kind', fatigueKindLabel[b.kind], fatigueKindLabel[a.kind]);
  c.text(
    'fatigue',
    where,
    'Load followed',
    before ? detailLoadText(b, before) : undefined,
    detailLoadText(a, after),
  );
  // A lower stress per load gives lower stresses: the check is looser.
  const sb = stressFactorText(b, c.system);
  const sa = stressFactorText(a, c.system);
  const fb = stressPerLoad(b);
  const fa = stressPerLoad(a);
  if (sb !== sa || fb !== fa)
    c.text('fatigue', where, 'Stress per load', sb, sa, fb === fa ? 'changed' : limitEffect('min', fb, fa));
  c.number(
    'fatigue',
    where,
    'Detail category',
    b.categoryMPa,
    a.categoryMPa,
    (x, y) => plainPair(x, y, ' MPa'),
    'max',
  );
  c.text('fatigue', where, 'S-N curve', curveText(b), curveText(a));
  const pf = (x: number | undefined, y: number | undefined) => plainPair(x, y, '');
  c.number('fatigue', where, 'γFf', b.gammaFf ?? 1, a.gammaFf ?? 1, pf, 'min');
  c.number('fatigue', where, 'γMf', b.gammaMf ?? 1, a.gammaMf ?? 1, pf, 'min');
  c.number('fatigue', where, 'Damage limit', b.damageLimit ?? 1, a.damageLimit ?? 1, pf, 'max');
}
