/**
 * The design-revision comparison: every limit kind of the design data raised, lowered, removed, added and
 * left alone, and the words and units a reviewer reads. Unit factors checked against outside definitions:
 * 1 in = 25.4 mm exactly (international inch, NIST SP 811 appendix B), 1 rpm = 2π/60 rad/s (definition
 * of the revolution), 1 MPa = 10⁶ Pa and 1 kN = 10³ N (SI prefixes, BIPM SI brochure).
 */
import * as fc from 'fast-check';

import type { DesignData, DesignMotion, DesignPivot } from '@/features/loads/design-schema';
import {
  type DesignChange,
  changeText,
  diffDesign,
  limitEffect,
  loosensALimit,
  quantityPair,
  summarise,
  summaryText,
} from '@/features/registry/design-diff';
import { skylarkDesign } from '@/server/seed/demo-design';

const base = skylarkDesign;
const main = base.pivots[0]; // "Main pivot shaft", joint 0
const withPivot = (patch: Partial<DesignPivot>): DesignData => ({
  ...base,
  pivots: base.pivots.map((p) => (p.joint === 0 ? ({ ...p, ...patch } as DesignPivot) : p)),
});
const withoutPivotKey = (key: keyof DesignPivot): DesignData => ({
  ...base,
  pivots: base.pivots.map((p) => {
    if (p.joint !== 0) return p;
    const copy: Partial<DesignPivot> = { ...p };
    delete copy[key];
    return copy as DesignPivot;
  }),
});
const withMotion = (patch: Partial<DesignMotion>, drop?: keyof DesignMotion): DesignData => ({
  ...base,
  motion: base.motion.map((m) => {
    if (m.joint !== 0) return m;
    const copy: Partial<DesignMotion> = { ...m, ...patch };
    if (drop) delete copy[drop];
    return copy as DesignMotion;
  }),
});
const only = (changes: DesignChange[]) => {
  expect(changes).toHaveLength(1);
  return changes[0];
};

describe('pivot limits', () => {
  // [field label, key, sense, value in SI]: a max loosens when raised, a min when lowered.
  const maxLimits = [
    ['Max clearance', 'maxClearanceM'],
    ['Allowable shear stress', 'maxShearStressPa'],
    ['Allowable bearing pressure', 'maxBearingPressurePa'],
    ['Max force', 'maxForceN'],
    ['Max torque', 'maxTorqueNm'],
  ] as const;

  test.each(maxLimits)('%s: raised loosens, lowered tightens, unchanged is no change', (label, key) => {
    const value = main[key] as number;
    const up = only(diffDesign(base, withPivot({ [key]: value * 1.5 })));
    expect(up).toMatchObject({ field: label, where: 'Main pivot shaft', effect: 'loosened', limit: true });
    expect(up.kind).toBe('changed');
    const down = only(diffDesign(base, withPivot({ [key]: value * 0.5 })));
    expect(down.effect).toBe('tightened');
    expect(diffDesign(base, withPivot({ [key]: value }))).toEqual([]);
  });

  test.each(maxLimits.filter(([, k]) => k !== 'maxClearanceM'))(
    '%s: removed loosens (no longer checked), added tightens',
    (label, key) => {
      const removed = only(diffDesign(base, withoutPivotKey(key)));
      expect(removed).toMatchObject({ field: label, kind: 'removed', effect: 'loosened', after: null });
      expect(changeText(removed)).toMatch(/removed \(loosened: no longer checked\)$/);
      const added = only(diffDesign(withoutPivotKey(key), base));
      expect(added).toMatchObject({ field: label, kind: 'added', effect: 'tightened', before: null });
    },
  );

  test('min pin diameter: lowered loosens, raised tightens', () => {
    const lower = only(diffDesign(base, withPivot({ minimumDiameterM: 0.158 })));
    expect(lower).toMatchObject({ field: 'Min pin diameter', effect: 'loosened' });
    expect(changeText(lower)).toBe('Min pin diameter at Main pivot shaft: 158.8 mm → 158 mm (loosened)');
    const raise = only(diffDesign(base, withPivot({ minimumDiameterM: 0.1592 })));
    expect(raise.effect).toBe('tightened');
  });

  test('the worked example reads in words with units', () => {
    // 0.6 mm → 0.8 mm clearance limit: raised, so loosened.
    const c = only(diffDesign(base, withPivot({ maxClearanceM: 0.0008 })));
    expect(changeText(c)).toBe('Max clearance at Main pivot shaft: 0.6 mm → 0.8 mm (loosened)');
    // Same change in US units: 0.6 / 25.4 = 0.023622… in, 0.8 / 25.4 = 0.031496… in.
    const us = only(diffDesign(base, withPivot({ maxClearanceM: 0.0008 }), 'us'));
    expect([us.before, us.after]).toEqual(['0.02362 in', '0.03150 in']);
  });

  test('stress and force units: 80 MPa → 90 MPa, 620 kN → 700 kN', () => {
    const changes = diffDesign(base, withPivot({ maxShearStressPa: 90e6, maxForceN: 700e3 }));
    expect(changes.map(changeText)).toEqual([
      'Allowable shear stress at Main pivot shaft: 80 MPa → 90 MPa (loosened)',
      'Max force at Main pivot shaft: 620 kN → 700 kN (loosened)',
    ]);
  });

  test('double shear halves the computed shear stress, so single → double loosens the pin check', () => {
    const spindle = (shear: 'single' | 'double'): DesignData => ({
      ...base,
      pivots: base.pivots.map((p) => (p.joint === 1 ? { ...p, shear } : p)),
    });
    expect(only(diffDesign(spindle('single'), spindle('double'))).effect).toBe('loosened');
    expect(only(diffDesign(spindle('double'), spindle('single'))).effect).toBe('tightened');
  });

  test('a nominal diameter or bearing length is a design value: changed, not a limit', () => {
    const c = only(diffDesign(base, withPivot({ nominalDiameterM: 0.17 })));
    expect(c).toMatchObject({ field: 'Nominal pin diameter', effect: 'changed', limit: false });
    expect(changeText(c)).toBe('Nominal pin diameter at Main pivot shaft: 160 mm → 170 mm');
  });
});

describe('motion limits', () => {
  test('rate limit: raised loosens, lowered tightens, removed loosens, added tightens', () => {
    // 1.6 rad/s = 15.28 rpm; 2 rad/s = 19.10 rpm (× 60 / 2π).
    const up = only(diffDesign(base, withMotion({ maxRateRadS: 2 })));
    expect(changeText(up)).toBe('Rate limit at Main pivot shaft: 15.28 rpm → 19.10 rpm (loosened)');
    expect(only(diffDesign(base, withMotion({ maxRateRadS: 1.2 }))).effect).toBe('tightened');
    expect(only(diffDesign(base, withMotion({}, 'maxRateRadS')))).toMatchObject({
      kind: 'removed',
      effect: 'loosened',
    });
    expect(only(diffDesign(withMotion({}, 'maxRateRadS'), base)).effect).toBe('tightened');
  });

  test('amplitude limit: 130° → 140° loosens; removal loosens', () => {
    const up = only(diffDesign(base, withMotion({ maxAmplitudeRad: (140 * Math.PI) / 180 })));
    expect(changeText(up)).toBe('Amplitude limit at Main pivot shaft: 130° → 140° (loosened)');
    expect(only(diffDesign(base, withMotion({}, 'maxAmplitudeRad'))).effect).toBe('loosened');
    expect(only(diffDesign(base, withMotion({ maxAmplitudeRad: (120 * Math.PI) / 180 }))).effect).toBe(
      'tightened',
    );
  });

  test('design motion values are changes without a verdict', () => {
    const c = only(diffDesign(base, withMotion({ periodS: 10 })));
    expect(c).toMatchObject({ field: 'Design period', effect: 'changed', limit: false });
    expect(changeText(c)).toBe('Design period at Main pivot shaft: 9.5 s → 10 s');
  });

  test('stop decelerations and the free swing are shown when they change', () => {
    const stop = only(diffDesign(base, withMotion({ emergencyDecelRadS2: 0.8 })));
    expect(stop).toMatchObject({ field: 'Emergency stop', effect: 'changed' });
    expect(changeText(stop)).toBe('Emergency stop at Main pivot shaft: 0.65 rad/s² → 0.8 rad/s²');
    const driven = only(diffDesign(base, withMotion({ freeSwing: false })));
    expect(changeText(driven)).toBe('Motion at Main pivot shaft: Free swing → Swing');
  });
});

describe('rider and warning limits', () => {
  const rider = (r: DesignData['rider']): DesignData => ({ ...base, rider: r });
  test.each([
    ['Gz (along the spine) upper limit', { gz: { min: -1, max: 6 }, gx: base.rider.gx }, 'loosened'],
    ['Gz (along the spine) upper limit', { gz: { min: -1, max: 4.5 }, gx: base.rider.gx }, 'tightened'],
    ['Gz (along the spine) lower limit', { gz: { min: -1.5, max: 5 }, gx: base.rider.gx }, 'loosened'],
    ['Gz (along the spine) lower limit', { gz: { min: -0.5, max: 5 }, gx: base.rider.gx }, 'tightened'],
    ['Gx (chest to back) upper limit', { gz: base.rider.gz, gx: { min: -2, max: 2.5 } }, 'loosened'],
    ['Gx (chest to back) lower limit', { gz: base.rider.gz, gx: { min: -3, max: 2 } }, 'loosened'],
    ['Gx (chest to back) lower limit', { gz: base.rider.gz, gx: { max: 2 } }, 'loosened'],
  ] as const)('%s → %s', (field, r, effect) => {
    expect(only(diffDesign(base, rider(r)))).toMatchObject({ field, effect, where: 'Riders', limit: true });
  });

  test('a rider limit in g with a minus sign, and a whole axis removed loosens both sides', () => {
    const c = only(diffDesign(base, rider({ gz: { min: -1.5, max: 5 }, gx: base.rider.gx })));
    expect(changeText(c)).toBe('Gz (along the spine) lower limit at Riders: −1 g → −1.5 g (loosened)');
    const gone = diffDesign(base, rider({ gz: base.rider.gz }));
    expect(gone.map((x) => [x.field, x.effect])).toEqual([
      ['Gx (chest to back) upper limit', 'loosened'],
      ['Gx (chest to back) lower limit', 'loosened'],
    ]);
  });

  test('near-limit margin: a later warning loosens; removing it falls back to the engine default 90 %', () => {
    const later = only(diffDesign(base, { ...base, nearMargin: 0.95 }));
    expect(changeText(later)).toBe('Near-limit warning from: 90 % of a limit → 95 % of a limit (loosened)');
    expect(only(diffDesign(base, { ...base, nearMargin: 0.8 })).effect).toBe('tightened');
    // The demo's 0.9 equals the engine default: dropping it changes nothing.
    const { nearMargin: _drop, ...noMargin } = base;
    expect(diffDesign(base, noMargin)).toEqual([]);
    expect(only(diffDesign({ ...base, nearMargin: 0.8 }, noMargin)).effect).toBe('loosened');
  });
});

describe('the rest of the design', () => {
  test('a part mass change, a renamed revision and an added seat are changes, not limits', () => {
    const next: DesignData = {
      ...base,
      source: { ...base.source, revision: 'E' },
      parts: base.parts.map((p, i) => (i === 0 ? { ...p, massKg: p.massKg + 100 } : p)),
      seats: [...base.seats, { body: 1, name: 'Seat 24', positionM: [1, -0.9], spineAngleRad: Math.PI / 2 }],
    };
    const changes = diffDesign(base, next);
    expect(changes.map((c) => [c.section, c.field, c.effect])).toEqual([
      ['source', 'Revision', 'changed'],
      ['parts', 'Mass', 'changed'],
      ['seats', 'Seat', 'changed'],
    ]);
    expect(loosensALimit(base, next)).toBe(false);
    expect(summaryText(summarise(changes))).toBe('3 changes, no limit changed.');
  });

  test('a ride’s first version loosens nothing; identical data has no changes', () => {
    expect(loosensALimit(null, base)).toBe(false);
    expect(diffDesign(null, base).every((c) => c.effect !== 'loosened')).toBe(true);
    expect(diffDesign(base, structuredClone(base))).toEqual([]);
  });

  test('summary counts loosened and tightened limits', () => {
    const next = withPivot({ maxClearanceM: 0.0008, maxForceN: 600e3 });
    expect(summaryText(summarise(diffDesign(base, next)))).toBe(
      '2 changes: 1 limit loosened, 1 limit tightened.',
    );
  });
});

describe('numbers never hide a change', () => {
  test('design values are shown as stated, not padded: 0.4 mm, not 0.4000 mm', () => {
    expect(quantityPair(0.0004, 0.0006, 'lengthSmall', 'si')).toEqual(['0.4 mm', '0.6 mm']);
    // 25.4 mm is exactly 1 in.
    expect(quantityPair(0.0254, 0.0508, 'lengthSmall', 'us')).toEqual(['1 in', '2 in']);
  });

  test('close values get the figures that tell them apart', () => {
    expect(quantityPair(0.0004, 0.0004001, 'lengthSmall', 'si')).toEqual(['0.4 mm', '0.4001 mm']);
    // 0.4 mm = 0.0157480 in, 0.4001 mm = 0.0157520 in: four figures would read 0.01575 twice.
    const [a, b] = quantityPair(0.0004, 0.0004001, 'lengthSmall', 'us');
    expect(a).not.toBe(b);
    expect([a, b]).toEqual(['0.015748 in', '0.015752 in']);
  });

  test('property: two different limits never read the same, and the verdict follows the numbers', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1e-5, max: 1e-2, noNaN: true }),
        fc.double({ min: 1e-5, max: 1e-2, noNaN: true }),
        fc.constantFrom('si' as const, 'us' as const),
        (a, b, system) => {
          fc.pre(Math.abs(a - b) > Math.abs(a) * 1e-9);
          const [ta, tb] = quantityPair(a, b, 'lengthSmall', system);
          expect(ta).not.toBe(tb);
          expect(limitEffect('max', a, b)).toBe(b > a ? 'loosened' : 'tightened');
          expect(limitEffect('min', a, b)).toBe(b < a ? 'loosened' : 'tightened');
        },
      ),
    );
  });
});
