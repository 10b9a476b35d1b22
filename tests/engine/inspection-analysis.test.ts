/**
 * Readings → load check. Reference: uniform slender rod driven at constant speed in a vertical plane,
 * peak pin force mg + m·ω²·L/2 (standard rigid-body result, e.g. Meriam & Kraige, Dynamics; from memory).
 * Wear ratio convention (diameter lost / allowance) is common practice in pin wear limits.
 */
import { analyseInspection, previewDifferences, previewOf } from '@/features/records/analysis';
import { addReading, answerItem, draftProblems, newDraft, toRecord } from '@/features/records/draft';
import type { Reading } from '@/features/records/schema';
import type { ChecklistTemplate } from '@/features/registry/schema';
import type { DesignData } from '@/features/loads/design-schema';

import { rodDesign } from '@/tests/support/rod-design';

const g = 9.80665;
const m = 300;
const L = 6;

const design = rodDesign(m, L);

const reading = (patch: Partial<Reading>): Reading => ({
  id: '5f0e6c1e-3b7a-4c55-9f59-0c8f2d3b9a11',
  kind: 'speed',
  joint: 0,
  label: 'Main arm speed',
  valueSI: 1,
  unit: 'rpm',
  method: 'typed',
  takenAt: '2026-12-01T10:00:00Z',
  ...patch,
});

const peakFor = (rpm: number) => {
  const w = (rpm * 2 * Math.PI) / 60;
  return m * g + (m * w * w * L) / 2;
};

test('without readings the design speed is analysed', () => {
  const r = analyseInspection(design, [], 720);
  expect(r.joints[0].peakForce.value).toBeCloseTo(peakFor(6), -1);
});

test('a measured speed replaces the design speed (textbook peak at the measured rpm)', () => {
  const rpm = 12;
  const r = analyseInspection(design, [reading({ valueSI: (rpm * 2 * Math.PI) / 60 })], 720);
  expect(r.joints[0].peakForce.value).toBeLessThanOrEqual(peakFor(rpm) * (1 + 1e-9));
  expect(r.joints[0].peakForce.value).toBeGreaterThan(peakFor(rpm) * (1 - 1e-4));
});

test('a timed period of one revolution gives the same result as the equivalent speed', () => {
  const byPeriod = analyseInspection(design, [reading({ kind: 'period', valueSI: 5 })], 720);
  const bySpeed = analyseInspection(design, [reading({ valueSI: (2 * Math.PI) / 5 })], 720);
  expect(byPeriod.joints[0].peakForce.value).toBeCloseTo(bySpeed.joints[0].peakForce.value, 6);
});

test('a measured pin diameter is checked against the wear allowance', () => {
  const r = analyseInspection(design, [
    reading({
      id: 'a7a3c9a4-0a7b-4a5e-8d0c-111111111111',
      kind: 'pin_diameter',
      valueSI: 0.0585,
      unit: 'mm',
    }),
  ]);
  const wear = r.envelope.find((e) => e.id === 'joints.0.pin.diameter');
  // 1.5 mm lost of a 2 mm allowance: 75 % used.
  expect(wear?.ratio).toBeCloseTo(0.75, 9);
  expect(wear?.status).toBe('within');
});

test('the server finds no difference from an honest preview, and names a tampered one', () => {
  const r = analyseInspection(design, []);
  const p = previewOf(r);
  expect(previewDifferences(p, p)).toEqual([]);
  const tampered = { ...p, peakForceN: [p.peakForceN[0] * 0.5] };
  expect(previewDifferences(tampered, p)[0]).toMatch(/Pivot 1 peak force/);
  expect(previewDifferences(null, p)).toEqual(['The phone sent no preview.']);
});

const template: ChecklistTemplate = {
  id: 'tpl-1',
  name: 'Pendulum',
  rideClass: 'pendulum_swing',
  inspectionType: null,
  createdAt: '2026-01-01T00:00:00Z',
  archivedAt: null,
  currentVersion: 1,
  updatedAt: '2026-01-01T00:00:00Z',
  updatedByName: 'x',
  areaCount: 1,
  itemCount: 2,
  version: {
    version: 1,
    createdAt: '2026-01-01T00:00:00Z',
    createdByName: 'x',
    reason: 'first',
    content: {
      areas: [
        {
          id: 'pins',
          title: 'Pins and bushings',
          items: [
            {
              id: 'pin-retainer',
              text: 'Pin retainers in place',
              guidance: null,
              photoRequired: true,
              measurementRequired: false,
              measurementKind: null,
              measurementLabel: null,
            },
            {
              id: 'play',
              text: 'No play at the main pivot',
              guidance: null,
              photoRequired: false,
              measurementRequired: false,
              measurementKind: null,
              measurementLabel: null,
            },
          ],
        },
      ],
    },
  },
};

test('a draft cannot be submitted until every item is answered, failures explained and photos taken', () => {
  const now = new Date('2026-12-01T09:00:00Z');
  let d = newDraft({
    id: '0b1f8d2e-7c6a-4f3b-9e2d-5a4c3b2a1f00',
    ride: { id: 'r1', name: 'Rod' },
    designVersionId: 'v1',
    template,
    type: 'daily_pre_opening',
    now,
  });
  expect(draftProblems(d, template).map((p) => p.message)).toEqual([
    'Not answered: Pin retainers in place',
    'Needs a photo: Pin retainers in place',
    'Not answered: No play at the main pivot',
  ]);
  d = answerItem(d, 'pin-retainer', { result: 'na' }, now);
  d = answerItem(d, 'play', { result: 'fail' }, now);
  expect(draftProblems(d, template).map((p) => p.message)).toEqual([
    'Say what failed: No play at the main pivot',
  ]);
  d = answerItem(d, 'play', { note: 'Knock felt at reversal' }, now);
  d = addReading(d, reading({}), now);
  expect(draftProblems(d, template)).toEqual([]);
  const record = toRecord(d, null, new Date('2026-12-01T09:30:00Z'));
  expect(record.templateVersion).toBe(1);
  expect(record.readings).toHaveLength(1);
  expect(record.submittedAt).toBe('2026-12-01T09:30:00.000Z');
});

/**
 * A free-swinging rod (pendulum arm drawn along −y, so a swing centred on 0 hangs down). Reference: the
 * free rigid pendulum's exact period 4·√(I_O/(m·g·r_G))·K(sin(A/2)), K the complete elliptic integral of
 * the first kind computed by the arithmetic–geometric mean, and the pin force at the bottom
 * m·g + m·r_G·ω² with ω² = 2·m·g·r_G·(1 − cos A)/I_O from energy (any dynamics textbook; from memory).
 */
describe('a ride whose design marks the swing as free', () => {
  const A = 1.4;
  const pendulum: DesignData = {
    ...rodDesign(m, L, 'Free pendulum'),
    parts: [{ kind: 'rod', body: 0, name: 'Arm', massKg: m, fromM: [0, 0], toM: [0, -L] }],
    motion: [
      {
        joint: 0,
        kind: 'swing',
        amplitudeRad: 1.2,
        periodS: 4.5,
        freeSwing: true,
        serviceDecelRadS2: 1.5,
        emergencyDecelRadS2: 2.5,
      },
    ],
  };
  pendulum.pivots = [{ ...pendulum.pivots[0], maxForceN: 20_000, maxTorqueNm: 1e6 }];
  const IO = (m * L * L) / 3;
  const rG = L / 2;
  const agm = (a: number, b: number) => {
    while (Math.abs(a - b) > 1e-15 * a) [a, b] = [(a + b) / 2, Math.sqrt(a * b)];
    return a;
  };
  const K = (k: number) => Math.PI / (2 * agm(1, Math.sqrt(1 - k * k)));
  const exactPeriod = 4 * Math.sqrt(IO / (m * g * rG)) * K(Math.sin(A / 2));
  const amplitude = reading({ kind: 'amplitude', valueSI: A, unit: '°' });

  test('an amplitude reading runs the free swing from rest: exact period and bottom pin force', () => {
    const r = analyseInspection(pendulum, [amplitude], 2001);
    expect(r.models).toEqual([{ joint: 0, name: 'Rod', model: 'free_swing', source: 'readings' }]);
    expect(r.joints[0].freePeriodS).toBeCloseTo(exactPeriod, 5);
    const omega2 = (2 * m * g * rG * (1 - Math.cos(A))) / IO;
    // Sampled near the bottom: within 1e-4 of the exact peak, never above it.
    expect(r.joints[0].peakForce.value / (m * g + m * rG * omega2)).toBeCloseTo(1, 4);
    // A free pin carries no torque.
    expect(Math.abs(r.joints[0].peakTorque.value)).toBeLessThan(1e-6 * m * g * L);
  });

  test('the computed period is compared with a measured one: a warning beyond 5 %, a note within', () => {
    const slow = analyseInspection(pendulum, [
      amplitude,
      reading({ kind: 'period', valueSI: exactPeriod * 1.08 }),
    ]);
    expect(slow.periodChecks).toHaveLength(1);
    expect(slow.periodChecks[0].difference).toBeCloseTo(1 / 1.08 - 1, 4);
    expect(slow.periodChecks[0].amplitudeFrom).toBe('readings');
    const warning = slow.warnings.find((w) => w.code === 'period_check');
    expect(warning?.level).toBe('warning');
    expect(warning?.message).toMatch(/dragging bearing, a drive fault or wrong design data/);

    const close = analyseInspection(pendulum, [
      amplitude,
      reading({ kind: 'period', valueSI: exactPeriod * 1.02 }),
    ]);
    expect(close.warnings.find((w) => w.code === 'period_check')?.level).toBe('info');
  });

  test('a period reading alone swings from the design amplitude and says so', () => {
    const r = analyseInspection(pendulum, [reading({ kind: 'period', valueSI: 4 })]);
    expect(r.models[0]).toMatchObject({ model: 'free_swing', source: 'design' });
    expect(r.periodChecks[0].amplitudeFrom).toBe('design');
  });

  test('without the free mark the same reading is a harmonic swing, with no period check', () => {
    const harmonic: DesignData = { ...pendulum, motion: [{ ...pendulum.motion[0], freeSwing: undefined }] };
    const r = analyseInspection(harmonic, [amplitude, reading({ kind: 'period', valueSI: 4 })]);
    expect(r.models[0]).toMatchObject({ model: 'harmonic_swing', source: 'readings' });
    expect(r.periodChecks).toEqual([]);
  });

  test('every analysis includes the design’s stops; the envelope names the case of each value', () => {
    const r = analyseInspection(pendulum, [amplitude]);
    expect(r.loadCases.map((c) => c.kind)).toEqual(['operating', 'service_stop', 'emergency_stop']);
    const force = r.envelope.find((e) => e.id === 'joints.0.force');
    const worst = Math.max(...r.loadCases.map((c) => c.joints[0].peakForceN));
    expect(force?.value).toBe(worst);
    expect(force?.loadCase).toBe(r.loadCases.find((c) => c.joints[0].peakForceN === worst)?.kind);
    // The phone's preview carries the merged status, so phone and server agree on it.
    expect(previewOf(r).status).toBe(r.status);
  });
});
