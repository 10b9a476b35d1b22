/**
 * What a new design-data revision changes against the version in force, field by field, in words with
 * units — and which changes loosen a limit. Pure (no React): the import screen, the approval view, the
 * audit log and the server's "does this need a second person" rule all read the same list, so what the
 * reviewer sees is exactly what decided that a review was needed.
 *
 * A limit is loosened when a maximum is raised, a minimum is lowered, or a limit is removed (the check it
 * made no longer happens). Design values that feed the load model (masses, geometry, design motion) are
 * shown as changed without a verdict: their effect on a check depends on the whole model.
 */
import type {
  DesignData,
  DesignMotion,
  DesignPart,
  DesignPivot,
  DesignSeat,
} from '@/features/loads/design-schema';
import type { ChangeEffect, DesignChange } from '@/features/registry/design-change';
import { Collector, matchBy, plainPair, quantityPair } from '@/features/registry/design-diff-collector';
import { fatigueChanges, ndtChanges, pinCheckChanges } from '@/features/registry/design-diff-life';
import { motionKindLabel, partGeometry, partKindLabel, point } from '@/features/registry/design-format';
import { type UnitSystem, toSI } from '@/lib/units';

export { limitEffect, quantityPair } from '@/features/registry/design-diff-collector';
export {
  changeText,
  effectWord,
  sectionLabel,
  summarise,
  summaryText,
  type ChangeEffect,
  type ChangeKind,
  type DesignChange,
  type DesignDiffSummary,
  type DesignSection,
} from '@/features/registry/design-change';

/** The engine's near-limit margin when the design data gives none (features/loads/engine/envelope.ts). */
const ENGINE_NEAR_MARGIN = 0.9;

// ——— the whole design ———

function jointName(d: DesignData | null, joint: number): string | undefined {
  return d?.pivots.find((p) => p.joint === joint)?.name ?? d?.bodies[joint]?.name;
}

function pivotChanges(c: Collector, before: DesignPivot | undefined, after: DesignPivot | undefined) {
  const where = after?.name ?? before?.name ?? '';
  const b: Partial<DesignPivot> = before ?? {};
  const a: Partial<DesignPivot> = after ?? {};
  const planes = (s: DesignPivot['shear'] | undefined) =>
    s === undefined ? undefined : s === 'double' ? 'Double shear' : 'Single shear';
  c.text('pivots', where, 'Name', b.name, a.name);
  // Double shear carries the pin's load on two planes: declaring it halves the computed shear stress, so
  // it loosens the pin check as surely as a raised stress limit would.
  const shearEffect: ChangeEffect =
    b.shear === undefined
      ? 'changed'
      : a.shear === undefined || a.shear === 'double'
        ? 'loosened'
        : 'tightened';
  c.text(
    'pivots',
    where,
    'Shear planes',
    planes(b.shear),
    planes(a.shear),
    before && after ? shearEffect : 'changed',
  );
  c.quantity('pivots', where, 'Nominal pin diameter', b.nominalDiameterM, a.nominalDiameterM, 'lengthSmall');
  c.quantity('pivots', where, 'Bearing length', b.bearingLengthM, a.bearingLengthM, 'lengthSmall');
  c.quantity(
    'pivots',
    where,
    'Min pin diameter',
    b.minimumDiameterM,
    a.minimumDiameterM,
    'lengthSmall',
    'min',
  );
  c.quantity('pivots', where, 'Max clearance', b.maxClearanceM, a.maxClearanceM, 'lengthSmall', 'max');
  c.quantity(
    'pivots',
    where,
    'Allowable shear stress',
    b.maxShearStressPa,
    a.maxShearStressPa,
    'stress',
    'max',
  );
  c.quantity(
    'pivots',
    where,
    'Allowable bearing pressure',
    b.maxBearingPressurePa,
    a.maxBearingPressurePa,
    'stress',
    'max',
  );
  c.quantity('pivots', where, 'Max force', b.maxForceN, a.maxForceN, 'force', 'max');
  c.quantity('pivots', where, 'Max torque', b.maxTorqueNm, a.maxTorqueNm, 'moment', 'max');
}

function motionChanges(
  c: Collector,
  where: string,
  before: DesignMotion | undefined,
  after: DesignMotion | undefined,
) {
  const b: Partial<DesignMotion> = before ?? {};
  const a: Partial<DesignMotion> = after ?? {};
  const kind = (m: Partial<DesignMotion>) =>
    m.kind === 'swing' && m.freeSwing ? 'Free swing' : m.kind ? motionKindLabel[m.kind] : undefined;
  const rpm = (v: number | undefined) => (v === undefined ? undefined : toSI(v, 'rate', 'rpm'));
  c.text('motion', where, 'Motion', kind(b), kind(a));
  c.quantity('motion', where, 'Design speed', rpm(b.rpm), rpm(a.rpm), 'rate');
  c.quantity('motion', where, 'Design amplitude', b.amplitudeRad, a.amplitudeRad, 'angle');
  c.quantity('motion', where, 'Design period', b.periodS, a.periodS, 'time');
  c.quantity('motion', where, 'Held at', b.angleRad, a.angleRad, 'angle');
  c.quantity('motion', where, 'Rate limit', b.maxRateRadS, a.maxRateRadS, 'rate', 'max');
  c.quantity('motion', where, 'Amplitude limit', b.maxAmplitudeRad, a.maxAmplitudeRad, 'angle', 'max');
  c.quantity('motion', where, 'Service stop', b.serviceDecelRadS2, a.serviceDecelRadS2, 'angularAccel');
  c.quantity('motion', where, 'Emergency stop', b.emergencyDecelRadS2, a.emergencyDecelRadS2, 'angularAccel');
}

function partText(p: DesignPart, system: UnitSystem): string {
  const [mass] = quantityPair(p.massKg, undefined, 'mass', system);
  return `${partKindLabel[p.kind]}, ${mass}, ${partGeometry(p, system)}`;
}

function seatText(s: DesignSeat, system: UnitSystem): string {
  return `at ${point(s.positionM, system)}`;
}

/**
 * Every difference from `before` (the version in force; null for a ride's first version) to `after`, in
 * the order the design data is read: source, whole-ride values, bodies, parts, pivots, seats, motion,
 * rider limits. Values are in `system`'s units; the effects do not depend on it.
 */
export function diffDesign(
  before: DesignData | null,
  after: DesignData,
  system: UnitSystem = 'si',
): DesignChange[] {
  const c = new Collector(system);
  generalChanges(c, before, after);
  bodyChanges(c, before, after, system);
  partChanges(c, before, after, system);
  const joints = new Set([...(before?.pivots ?? []), ...after.pivots].map((p) => p.joint));
  for (const j of [...joints].sort((x, y) => x - y)) {
    const b = before?.pivots.find((p) => p.joint === j);
    const a = after.pivots.find((p) => p.joint === j);
    pivotChanges(c, b, a);
    const where = a?.name ?? b?.name ?? '';
    pinCheckChanges(c, where, b, a);
    ndtChanges(c, where, b?.ndt, a?.ndt);
  }
  seatChanges(c, before, after, system);
  const motionJoints = new Set([...(before?.motion ?? []), ...after.motion].map((m) => m.joint));
  for (const j of [...motionJoints].sort((x, y) => x - y))
    motionChanges(
      c,
      jointName(after, j) ?? jointName(before, j) ?? `Joint ${j + 1}`,
      before?.motion.find((m) => m.joint === j),
      after.motion.find((m) => m.joint === j),
    );
  riderChanges(c, before, after);
  fatigueChanges(c, before, after);
  // A ride's first version has nothing to loosen: every limit it sets is new.
  return c.changes;
}

/** The source document and the values of the whole ride. */
function generalChanges(c: Collector, b: DesignData | null, after: DesignData) {
  c.text('source', '', 'Document', b?.source.document, after.source.document);
  c.text('source', '', 'Revision', b?.source.revision, after.source.revision);

  c.number('general', '', 'Gravity', b?.gravityMS2, after.gravityMS2, (x, y) => plainPair(x, y, ' m/s²'));
  // The margin says where "near limit" begins: a higher one warns later, so raising it loosens the warning.
  const margin = (d: DesignData | null) => (d ? (d.nearMargin ?? ENGINE_NEAR_MARGIN) : undefined);
  c.number(
    'general',
    '',
    'Near-limit warning from',
    margin(b),
    margin(after),
    (x, y) => plainPair(x === undefined ? x : x * 100, y === undefined ? y : y * 100, ' % of a limit'),
    'max',
  );
}

function bodyChanges(c: Collector, b: DesignData | null, after: DesignData, system: UnitSystem) {
  const bodyCount = Math.max(b?.bodies.length ?? 0, after.bodies.length);
  for (let i = 0; i < bodyCount; i++) {
    const ob = b?.bodies[i];
    const nb = after.bodies[i];
    const where = `Body ${i + 1}`;
    c.text('bodies', where, 'Name', ob?.name, nb?.name);
    const tip = (t: readonly [number, number] | undefined) => (t ? point(t, system) : undefined);
    c.text('bodies', `${where} · ${nb?.name ?? ob?.name}`, 'Next pivot at', tip(ob?.tipM), tip(nb?.tipM));
  }
}

const bodyName = (d: DesignData | null, i: number) => d?.bodies[i]?.name ?? `Body ${i + 1}`;

/** Parts matched by body and name: one added or removed is said whole, one kept field by field. */
function partChanges(c: Collector, b: DesignData | null, after: DesignData, system: UnitSystem) {
  for (const pair of matchBy(b?.parts ?? [], after.parts, (p) => `${p.body}|${p.name}`)) {
    const p = pair.after ?? pair.before;
    if (!p) continue;
    const where = `${p.name} (${bodyName(pair.after ? after : b, p.body)})`;
    if (!pair.before || !pair.after) {
      c.text(
        'parts',
        where,
        'Part',
        pair.before && partText(pair.before, system),
        pair.after && partText(pair.after, system),
      );
      continue;
    }
    c.text('parts', where, 'Kind', partKindLabel[pair.before.kind], partKindLabel[pair.after.kind]);
    c.quantity('parts', where, 'Mass', pair.before.massKg, pair.after.massKg, 'mass');
    c.text(
      'parts',
      where,
      'Position and size',
      partGeometry(pair.before, system),
      partGeometry(pair.after, system),
    );
  }
}

/** Seats matched by body and name, as parts are. */
function seatChanges(c: Collector, b: DesignData | null, after: DesignData, system: UnitSystem) {
  for (const pair of matchBy(b?.seats ?? [], after.seats, (s) => `${s.body}|${s.name}`)) {
    const s = pair.after ?? pair.before;
    if (!s) continue;
    const where = `${s.name} (${bodyName(pair.after ? after : b, s.body)})`;
    if (!pair.before || !pair.after) {
      c.text(
        'seats',
        where,
        'Seat',
        pair.before && seatText(pair.before, system),
        pair.after && seatText(pair.after, system),
      );
      continue;
    }
    c.text(
      'seats',
      where,
      'Position',
      point(pair.before.positionM, system),
      point(pair.after.positionM, system),
    );
    c.quantity(
      'seats',
      where,
      'Spine direction',
      pair.before.spineAngleRad,
      pair.after.spineAngleRad,
      'angle',
    );
    const facing = (f: DesignSeat['facing']) => (f === 'ccw' ? 'Spine + 90° (mirrored)' : 'Spine − 90°');
    c.text('seats', where, 'Chest faces', facing(pair.before.facing), facing(pair.after.facing));
  }
}

function riderChanges(c: Collector, b: DesignData | null, after: DesignData) {
  const axes = [
    ['gz', 'Gz (along the spine)'],
    ['gx', 'Gx (chest to back)'],
  ] as const;
  for (const [axis, label] of axes) {
    const ob = b?.rider[axis];
    const na = after.rider[axis];
    c.number(
      'rider',
      'Riders',
      `${label} upper limit`,
      ob?.max,
      na?.max,
      (x, y) => plainPair(x, y, ' g'),
      'max',
    );
    c.number(
      'rider',
      'Riders',
      `${label} lower limit`,
      ob?.min,
      na?.min,
      (x, y) => plainPair(x, y, ' g'),
      'min',
    );
  }
}

/** True when any limit of `after` is looser than in `before` (the version in force). */
export function loosensALimit(before: DesignData | null, after: DesignData): boolean {
  return before !== null && diffDesign(before, after).some((ch) => ch.effect === 'loosened');
}
