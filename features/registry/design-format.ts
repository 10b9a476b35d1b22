/**
 * Design data values as people read them: SI values from the design data shown in the person's unit
 * system through features/units (never converted by hand here). Pure, so the tables' text is tested.
 */
import type { DesignMotion, DesignPart } from '@/features/loads/design-schema';
import type { DesignOrigin } from '@/features/registry/schema';
import {
  type QuantityKind,
  type UnitSystem,
  displayUnits,
  formatQuantity,
  formatSignificant,
  fromSI,
  toSI,
} from '@/lib/units';

export const q = (value: number | undefined, kind: QuantityKind, system: UnitSystem): string =>
  value === undefined ? '—' : formatQuantity(value, kind, system).text;

/** A point as "(x, y) m" in the system's length unit, one unit for both numbers. */
export function point(p: readonly [number, number], system: UnitSystem): string {
  const unit = displayUnits('length', system)[0];
  const f = (v: number) => formatSignificant(fromSI(v, 'length', unit.mathjs), 4);
  return `(${f(p[0])}, ${f(p[1])}) ${unit.label}`;
}

export const partKindLabel: Record<DesignPart['kind'], string> = {
  rod: 'Rod or beam',
  point: 'Point mass',
  disc: 'Disc',
  ring: 'Ring',
  sphere: 'Sphere',
  plate: 'Plate',
  counterweight: 'Counterweight',
  custom: 'Custom (given CG and inertia)',
};

/** Where a part sits and how big it is, in words. */
export function partGeometry(p: DesignPart, system: UnitSystem): string {
  switch (p.kind) {
    case 'rod':
      return `${point(p.fromM, system)} to ${point(p.toM, system)}`;
    case 'point':
      return `at ${point(p.atM, system)}`;
    case 'custom':
      return `CG ${point(p.cgM, system)}, I ${formatSignificant(p.inertiaCgKgM2, 4)} kg·m²`;
    case 'disc':
    case 'ring':
    case 'sphere':
      return `centre ${point(p.centreM, system)}, radius ${q(p.radiusM, 'length', system)}`;
    case 'plate':
      return `centre ${point(p.centreM, system)}, ${q(p.widthM, 'length', system)} × ${q(p.heightM, 'length', system)}`;
    case 'counterweight':
      return p.widthM !== undefined && p.heightM !== undefined
        ? `centre ${point(p.centreM, system)}, ${q(p.widthM, 'length', system)} × ${q(p.heightM, 'length', system)}`
        : `centre ${point(p.centreM, system)}`;
  }
}

export const motionKindLabel: Record<DesignMotion['kind'], string> = {
  constant: 'Steady rotation',
  swing: 'Swing',
  fixed: 'Held at an angle',
};

/** The design motion of one joint in words: "12 rpm", "± 110° every 9.5 s", "held at 0°". */
export function motionText(m: DesignMotion, system: UnitSystem): string {
  if (m.kind === 'constant') return q(toSI(m.rpm ?? 0, 'rate', 'rpm'), 'rate', system);
  if (m.kind === 'swing')
    return `± ${q(m.amplitudeRad, 'angle', system)} every ${q(m.periodS, 'time', system)}`;
  return `held at ${q(m.angleRad ?? 0, 'angle', system)}`;
}

/** "Free swing" for a swing the design marks as a free pin, else the motion kind's label. */
export function motionKindText(m: DesignMotion): string {
  return m.kind === 'swing' && m.freeSwing ? 'Free swing' : motionKindLabel[m.kind];
}

/** The stop decelerations of one joint: "service 0.5 rad/s², emergency 0.65 rad/s²", or "—". */
export function motionStopText(m: DesignMotion, system: UnitSystem): string {
  const parts = [
    m.serviceDecelRadS2 !== undefined ? `service ${q(m.serviceDecelRadS2, 'angularAccel', system)}` : null,
    m.emergencyDecelRadS2 !== undefined
      ? `emergency ${q(m.emergencyDecelRadS2, 'angularAccel', system)}`
      : null,
  ].filter(Boolean);
  return parts.length ? parts.join(', ') : '—';
}

/** The rate and amplitude limits of one joint, or "—". */
export function motionLimitText(m: DesignMotion, system: UnitSystem): string {
  const parts = [
    m.maxRateRadS !== undefined ? `rate ≤ ${q(m.maxRateRadS, 'rate', system)}` : null,
    m.maxAmplitudeRad !== undefined ? `amplitude ≤ ${q(m.maxAmplitudeRad, 'angle', system)}` : null,
  ].filter(Boolean);
  return parts.length ? parts.join(', ') : '—';
}

/** A rider limit on one axis, in g: "−1 to 5 g", "≤ 2 g", "—". */
export function gRange(limit: { min?: number; max?: number } | undefined): string {
  if (!limit || (limit.min === undefined && limit.max === undefined)) return '—';
  // Limits are round numbers in the documents (−1, 5, 1.5): no padding zeros.
  const f = (v: number) => String(Number(v.toPrecision(3))).replace('-', '−');
  if (limit.min !== undefined && limit.max !== undefined) return `${f(limit.min)} to ${f(limit.max)} g`;
  return limit.min !== undefined ? `≥ ${f(limit.min)} g` : `≤ ${f(limit.max ?? 0)} g`;
}

export const designOriginLabel: Record<DesignOrigin, string> = {
  editor: 'Edited in Pivotwatch',
  import_csv: 'Imported from CSV',
  import_json: 'Imported from JSON',
  seed: 'Demo data',
};
