/**
 * Stopping cases against closed forms. Source: rigid-body rotation about a fixed axis (any dynamics
 * textbook, e.g. Meriam & Kraige, Engineering Mechanics: Dynamics, kinetics of rigid bodies in fixed-axis
 * rotation; from memory): the pivot force on the body is F = m·a_G − m·g⃗, with a_G the vector sum of the
 * centripetal r_G·ω² toward the pivot and the tangential r_G·α, and the torque about the pivot is
 * τ = I_O·α + the gravity moment. For a uniform rod of length L: r_G = L/2, I_O = m·L²/3.
 */
import { type ChainBody, type CycleInput, analyseCycle } from '@/features/loads/engine';
import { START_ANGLES, analyseLoadCases, designStops } from '@/features/loads/load-cases';
import { designToCycleInput } from '@/features/loads/design-schema';

import { rodDesign } from '@/tests/support/rod-design';

const g = 9.81;
const m = 400;
const L = 5;
const rG = L / 2;
const IO = (m * L * L) / 3;
const rod: ChainBody = { name: 'Arm', massKg: m, cgM: [rG, 0], inertiaCgKgM2: (m * L * L) / 12 };
const rpm = 10;
const w = (rpm * 2 * Math.PI) / 60;

const steady = (limits?: CycleInput['limits']): CycleInput => ({
  bodies: [rod],
  profiles: [{ kind: 'constant', rpm }],
  gravityMS2: g,
  samples: 361,
  limits,
});

describe('a rod braked at constant deceleration from steady rotation (closed form)', () => {
  const a = 0.8;

  it('through the stop, force = weight + centripetal + tangential as vectors, τ = I_O·α + gravity moment', () => {
    // Arm starting along +x, turning counter-clockwise, decelerating at a: ω(t) = ω0 − a·t, θ = ω0·t − a·t²/2.
    const r = analyseCycle({
      bodies: [rod],
      profiles: [{ kind: 'ramp', fromRpm: rpm, toRpm: 0, rampTimeS: w / a, shape: 'linear' }],
      gravityMS2: g,
      samples: 201,
    });
    const j = r.joints[0];
    // Sample 0 is the instant before the brake bites (the profile's convention); the rest are braking.
    for (let k = 1; k < 200; k++) {
      const t = r.timeS[k];
      const om = w - a * t;
      const th = w * t - 0.5 * a * t * t;
      expect(j.rateRadS[k]).toBeCloseTo(om, 9);
      expect(j.angleRad[k]).toBeCloseTo(th, 9);
      // a_G = r_G·(−ω²·cosθ + a·sinθ, −ω²·sinθ − a·cosθ); F = m·a_G − m·(0, −g).
      expect(j.forceXN[k]).toBeCloseTo(m * rG * (-om * om * Math.cos(th) + a * Math.sin(th)), 6);
      expect(j.forceYN[k]).toBeCloseTo(m * rG * (-om * om * Math.sin(th) - a * Math.cos(th)) + m * g, 6);
      expect(j.torqueNm[k]).toBeCloseTo(-IO * a + m * g * rG * Math.cos(th), 6);
    }
    expect(j.rateRadS[200]).toBeCloseTo(0, 9);
  });

  it('worst over the start angle: |F| = m·r_G·√(ω⁴ + α²) + m·g, |τ| = I_O·α + m·g·r_G', () => {
    const cases = analyseLoadCases(steady(), [
      { joint: 0, serviceDecelRadS2: a, emergencyDecelRadS2: 3 * a },
    ]);
    expect(cases.cases.map((c) => c.kind)).toEqual(['operating', 'service_stop', 'emergency_stop']);
    for (const [c, alpha] of [
      [cases.cases[1], a],
      [cases.cases[2], 3 * a],
    ] as const) {
      const force = m * rG * Math.sqrt(w ** 4 + alpha ** 2) + m * g;
      // Golden-section refinement of the start angle: within 1e-6 of the aligned worst.
      expect(c.joints[0].peakForceN / force).toBeCloseTo(1, 6);
      expect(c.joints[0].peakForceN).toBeLessThanOrEqual(force * (1 + 1e-12));
      expect(Math.abs(c.joints[0].peakTorqueNm)).toBeCloseTo(IO * alpha + m * g * rG, 4);
      expect(c.decelRadS2).toEqual([alpha]);
      expect(c.durationS).toBeCloseTo(w / alpha, 12);
      expect(c.runs).toBeGreaterThan(START_ANGLES);
    }
    // The operating case is steady rotation: m·g + m·r_G·ω² (same textbook).
    expect(cases.cases[0].joints[0].peakForceN).toBeCloseTo(m * g + m * rG * w * w, 3);
  });

  it('merges the envelope: each item at its worst case, naming it', () => {
    const operatingForce = m * g + m * rG * w * w;
    const eForce = m * rG * Math.sqrt(w ** 4 + 9 * a * a) + m * g;
    const limits = { joints: [{ maxForceN: 1.2 * operatingForce, maxTorqueNm: 50_000, maxRateRadS: 2 }] };
    const r = analyseLoadCases(steady(limits), [
      { joint: 0, serviceDecelRadS2: a, emergencyDecelRadS2: 3 * a },
    ]);
    const force = r.envelope.find((e) => e.id === 'joints.0.force');
    expect(force?.loadCase).toBe('emergency_stop');
    expect(force?.value).toBeCloseTo(eForce, 2);
    expect(force?.ratio).toBeCloseTo(eForce / (1.2 * operatingForce), 6);
    // The rate is a motion item: always the operating cycle's.
    expect(r.envelope.find((e) => e.id === 'joints.0.rate')?.loadCase).toBe('operating');
    // A stop's torque is the brake's: it is not held against the drive torque limit.
    expect(r.envelope.find((e) => e.id === 'joints.0.torque')?.loadCase).toBe('operating');
    expect(r.governing).toBe('emergency_stop');
    // The operating result alone is untouched.
    expect(r.operating.envelope.find((e) => e.id === 'joints.0.force')?.value).toBeCloseTo(operatingForce, 3);
    const statuses = { within: 0, near: 1, over: 2 } as const;
    for (const c of r.cases) expect(statuses[c.status ?? 'within']).toBeLessThanOrEqual(statuses[r.status]);
  });

  it('defines no stops without decelerations, and ignores a fixed joint', () => {
    expect(analyseLoadCases(steady(), []).cases).toHaveLength(1);
    const held = analyseLoadCases({ ...steady(), profiles: [{ kind: 'fixed', angleRad: 0 }], durationS: 1 }, [
      { joint: 0, serviceDecelRadS2: 1 },
    ]);
    expect(held.cases).toHaveLength(1);
  });
});

describe('a swinging rod stopped at the centre of its swing', () => {
  // Harmonic swing q = A·sin(2πt/T) about straight down (the rod hangs at −90°).
  const A = 0.6;
  const T = 6;
  const peak = (A * 2 * Math.PI) / T;
  const hanging: ChainBody = { ...rod, cgM: [rG, 0] };

  it('ramps to rest from the peak rate at the centre, both ways: force = m·g + m·r_G·√(ω⁴ + α²) there', () => {
    const alpha = 1.2;
    const r = analyseLoadCases(
      {
        bodies: [hanging],
        profiles: [{ kind: 'swing', amplitudeRad: A, periodS: T, centreRad: -Math.PI / 2 }],
        gravityMS2: g,
        samples: 361,
      },
      [{ joint: 0, serviceDecelRadS2: alpha }],
    );
    const stop = r.cases[1];
    expect(stop.runs).toBe(2);
    expect(stop.durationS).toBeCloseTo(peak / alpha, 9);
    // At the bottom the weight is along the arm (in line with the centripetal term), the tangential is
    // across it: |F| = √((m·g + m·r_G·ω²)² + (m·r_G·α)²), the largest over the stop.
    const atBottom = Math.hypot(m * g + m * rG * peak * peak, m * rG * alpha);
    expect(stop.joints[0].peakForceN).toBeCloseTo(atBottom, 3);
    // τ = I_O·α at the bottom (no gravity moment there); later the weight's moment adds to it.
    expect(Math.abs(stop.joints[0].peakTorqueNm)).toBeGreaterThanOrEqual(IO * alpha - 1e-6);
    expect(r.warnings.filter((x) => x.code === 'stop_travel')).toEqual([]);
  });

  it('warns when the deceleration is too low to stop within the swing', () => {
    const r = analyseLoadCases(
      {
        bodies: [hanging],
        profiles: [{ kind: 'swing', amplitudeRad: A, periodS: T, centreRad: -Math.PI / 2 }],
        gravityMS2: g,
      },
      [{ joint: 0, serviceDecelRadS2: 0.05 }],
    );
    expect(r.warnings.map((x) => x.code)).toContain('stop_travel');
  });
});

test('design data gives its stops per joint', () => {
  const d = rodDesign(m, L);
  d.motion[0] = { ...d.motion[0], serviceDecelRadS2: 0.5, emergencyDecelRadS2: 1.5 };
  expect(designStops(d)).toEqual([{ joint: 0, serviceDecelRadS2: 0.5, emergencyDecelRadS2: 1.5 }]);
  const r = analyseLoadCases(designToCycleInput(d), designStops(d));
  expect(r.cases.map((c) => c.label)).toEqual(['Operating cycle', 'Service stop', 'Emergency stop']);
});
