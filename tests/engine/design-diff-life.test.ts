/**
 * A revision's changes to pin-check data, NDT plans and fatigue details: each listed with its values and
 * units, and each that makes a check less demanding marked loosened (so the server holds the revision for
 * a second person). Which way is looser follows the formulas: EN 1993-1-8 Table 3.10 resistances grow with
 * f_y and f_u and shrink with the partial factors γM; EN 1993-1-9 §7 lives grow with the category Δσ_C and
 * shrink with γFf·γMf and with the stress per load; a Miner sum passes more easily under a higher limit; a
 * longer NDT interval tests less often (common practice). Unit factor: 1 ksi = 6.894757 MPa (NIST SP 811).
 */
import type { DesignData, DesignPivot, FatigueData } from '@/features/loads/design-schema';
import { changeText, diffDesign, loosensALimit } from '@/features/registry/design-diff';
import { tidebreakerDesign } from '@/server/seed/demo-design';

const base = tidebreakerDesign;
const fatigue = base.fatigue as FatigueData;
const main = base.pivots[0];
const pin = main.pinCheck as NonNullable<DesignPivot['pinCheck']>;

const withMain = (patch: Partial<DesignPivot>): DesignData => ({
  ...base,
  pivots: base.pivots.map((p) => (p.joint === 0 ? { ...p, ...patch } : p)),
});
const withDetail = (k: number, patch: object): DesignData => ({
  ...base,
  fatigue: { ...fatigue, details: fatigue.details.map((d, i) => (i === k ? { ...d, ...patch } : d)) },
});
const only = (after: DesignData, system: 'si' | 'us' = 'si') => {
  const changes = diffDesign(base, after, system);
  expect(changes).toHaveLength(1);
  return changes[0];
};

describe('pin-check data', () => {
  test('a higher pin yield strength loosens, a lower one tightens; in the person’s units', () => {
    const up = only(withMain({ pinCheck: { ...pin, pinFyPa: 550e6 } }));
    expect(up).toMatchObject({
      section: 'pinChecks',
      where: 'Main arm shaft',
      effect: 'loosened',
      limit: true,
    });
    expect(changeText(up)).toBe('Pin yield strength f_y at Main arm shaft: 500 MPa → 550 MPa (loosened)');
    expect(only(withMain({ pinCheck: { ...pin, plateFyPa: 300e6 } })).effect).toBe('tightened');
    // 500 MPa / 6.894757 = 72.52 ksi; 550 MPa = 79.77 ksi.
    const us = only(withMain({ pinCheck: { ...pin, pinFyPa: 550e6 } }), 'us');
    expect([us.before, us.after]).toEqual(['72.52 ksi', '79.77 ksi']);
  });

  test('partial factors: lowered loosens; writing out the recommended value changes nothing', () => {
    expect(only(withMain({ pinCheck: { ...pin, gammaM2: 1.1 } }))).toMatchObject({
      field: 'Partial factor γM2',
      before: '1.25',
      after: '1.1',
      effect: 'loosened',
    });
    expect(diffDesign(base, withMain({ pinCheck: { ...pin, gammaM2: 1.25, gammaM0: 1 } }))).toEqual([]);
  });

  test('plates and gap are geometry: changed without a verdict; a pin no longer replaceable loosens', () => {
    const gap = only(withMain({ pinCheck: { ...pin, gapM: 0.01 } }));
    expect(gap).toMatchObject({
      field: 'Gap',
      before: '5 mm',
      after: '10 mm',
      effect: 'changed',
      limit: false,
    });
    const small = base.pivots[2].pinCheck as NonNullable<DesignPivot['pinCheck']>;
    const after: DesignData = {
      ...base,
      pivots: base.pivots.map((p) =>
        p.joint === 2 ? { ...p, pinCheck: { ...small, replaceable: false } } : p,
      ),
    };
    expect(only(after)).toMatchObject({
      before: 'Replaceable',
      after: 'Not replaceable',
      effect: 'loosened',
    });
  });

  test('the pin check removed loosens (no longer checked); added tightens', () => {
    const { pinCheck: _dropped, ...bare } = main;
    const removed = diffDesign(base, { ...base, pivots: [bare, ...base.pivots.slice(1)] });
    expect(removed).toHaveLength(1);
    expect(removed[0]).toMatchObject({ kind: 'removed', effect: 'loosened', field: 'Pin check data' });
    expect(loosensALimit(base, { ...base, pivots: [bare, ...base.pivots.slice(1)] })).toBe(true);
    const added = diffDesign({ ...base, pivots: [bare, ...base.pivots.slice(1)] }, base);
    expect(added[0]).toMatchObject({ kind: 'added', effect: 'tightened' });
  });
});

describe('NDT plans', () => {
  const plans = main.ndt ?? [];
  test('a longer interval loosens, a shorter tightens; a plan dropped loosens, one added tightens', () => {
    const longer = only(withMain({ ndt: [{ ...plans[0], intervalDays: 540 }, plans[1]] }));
    expect(longer).toMatchObject({
      section: 'ndt',
      before: '365 days',
      after: '540 days',
      effect: 'loosened',
    });
    expect(longer.field).toBe('MT (Magnetic particle testing) interval');
    expect(only(withMain({ ndt: [plans[0], { ...plans[1], intervalDays: 365 }] })).effect).toBe('tightened');
    const dropped = only(withMain({ ndt: [plans[0]] }));
    expect(dropped).toMatchObject({ kind: 'removed', effect: 'loosened', before: 'every 730 days' });
    const added = only(withMain({ ndt: [...plans, { method: 'PT', intervalDays: 180 }] }));
    expect(added).toMatchObject({ kind: 'added', effect: 'tightened', after: 'every 180 days' });
  });
});

describe('fatigue data', () => {
  test('a higher detail category loosens; lower γMf loosens; a higher damage limit loosens', () => {
    const weld = fatigue.details.findIndex((d) => d.kind === 'weld_toe');
    expect(only(withDetail(weld, { categoryMPa: 80 }))).toMatchObject({
      section: 'fatigue',
      field: 'Detail category',
      before: '71 MPa',
      after: '80 MPa',
      effect: 'loosened',
    });
    expect(only(withDetail(weld, { gammaMf: 1 })).effect).toBe('loosened');
    expect(only(withDetail(weld, { damageLimit: 0.5 }))).toMatchObject({
      before: '1',
      after: '0.5',
      effect: 'tightened',
    });
  });

  test('a lower stress per load loosens; the same stress from a section instead of a factor is no verdict', () => {
    const weld = fatigue.details.findIndex((d) => d.kind === 'weld_toe');
    const lower = only(withDetail(weld, { stressPerKnMPa: 0.05 }));
    expect(lower).toMatchObject({ field: 'Stress per load', effect: 'loosened' });
    expect(lower.before).toBe('0.07 MPa/kN');
    // 0.07 MPa per kN is a section of 1000 / 0.07 ≈ 14 286 mm²: the same stress, said another way.
    const same = only(withDetail(weld, { stressPerKnMPa: undefined, sectionAreaMm2: 1000 / 0.07 }));
    expect(same.effect).toBe('changed');
  });

  test('ride cycle time and stops are how the ride runs: changed; a detail removed loosens', () => {
    const cycle = only({ ...base, fatigue: { ...fatigue, rideCycleS: 200 } });
    expect(cycle).toMatchObject({ field: 'Ride cycle time', before: '150 s', after: '200 s', limit: false });
    const removed = only({ ...base, fatigue: { ...fatigue, details: fatigue.details.slice(1) } });
    expect(removed).toMatchObject({ kind: 'removed', effect: 'loosened', field: 'Fatigue detail' });
    expect(removed.where).toBe(`${fatigue.details[0].name} (P1 · Main arm shaft)`);
  });

  test('fatigue data added to a design without it: every detail is a new check', () => {
    const { fatigue: _f, ...without } = base;
    const changes = diffDesign(without, base);
    expect(changes.filter((c) => c.field === 'Fatigue detail')).toHaveLength(fatigue.details.length);
    expect(changes.every((c) => c.effect !== 'loosened')).toBe(true);
    expect(loosensALimit(without, base)).toBe(false);
  });
});
