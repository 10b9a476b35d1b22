/**
 * The calculator's form model: typed strings in display units → the engine's request → result.
 * Reference values: uniform slender rod driven at constant speed in a vertical plane (standard
 * rigid-body result, e.g. Meriam & Kraige, Dynamics; from memory): peak pin force mg + m·ω²·L/2.
 */
import { manualRequest, profileFromRow, runCalculator } from '@/features/calculator/calculator-model';

const g = 9.80665;
const motion = (patch: Partial<Parameters<typeof profileFromRow>[0]>) => ({
  kind: 'fixed' as const,
  rpm: '',
  amplitudeDeg: '',
  periodS: '',
  angleDeg: '0',
  rampS: '',
  ...patch,
});

test('a rod typed in by hand, turning steadily, peaks at mg + mω²L/2 (textbook)', () => {
  const m = 200;
  const L = 4;
  const rpm = 12;
  const w = (rpm * 2 * Math.PI) / 60;
  const out = runCalculator(
    manualRequest(
      [
        {
          name: 'Rod',
          massKg: String(m),
          cgX: String(L / 2),
          cgY: '0',
          inertia: String((m * L * L) / 12),
          tipX: '',
          tipY: '',
        },
      ],
      [motion({ kind: 'constant', rpm: String(rpm) })],
    ),
  );
  if (!out.ok) throw new Error(JSON.stringify(out.issues));
  expect(out.xAxis).toBe('angle');
  const exact = m * g + (m * w * w * L) / 2;
  expect(out.result.joints[0].peakForce.value).toBeGreaterThan(exact * (1 - 1e-4));
  expect(out.result.joints[0].peakForce.value).toBeLessThanOrEqual(exact * (1 + 1e-9));
});

test('degrees typed for a swing become radians for the engine', () => {
  const p = profileFromRow(motion({ kind: 'swing', amplitudeDeg: '90', periodS: '6' }));
  expect(p).toEqual({ kind: 'swing', amplitudeRad: Math.PI / 2, periodS: 6 });
});

test('an empty or non-numeric field is reported on its own path, not read as zero', () => {
  const out = runCalculator(
    manualRequest(
      [
        { name: 'Arm', massKg: '', cgX: '1', cgY: '0', inertia: '10', tipX: '2', tipY: '0' },
        { name: 'Cab', massKg: 'abc', cgX: '0', cgY: '-1', inertia: '5', tipX: '', tipY: '' },
      ],
      [motion({ kind: 'constant', rpm: '5' }), motion({})],
    ),
  );
  expect(out.ok).toBe(false);
  if (!out.ok) {
    const paths = out.issues.map((i) => i.path);
    expect(paths).toContain('bodies.0.massKg');
    expect(paths).toContain('bodies.1.massKg');
  }
});

test('a missing next pivot on an inner body is named', () => {
  const out = runCalculator(
    manualRequest(
      [
        { name: 'Arm', massKg: '10', cgX: '1', cgY: '0', inertia: '10', tipX: '', tipY: '' },
        { name: 'Cab', massKg: '5', cgX: '0', cgY: '-1', inertia: '5', tipX: '', tipY: '' },
      ],
      [motion({ kind: 'constant', rpm: '5' }), motion({})],
    ),
  );
  expect(out.ok).toBe(false);
  if (!out.ok) expect(out.issues.map((i) => i.path)).toContain('bodies.0.tipM');
});
