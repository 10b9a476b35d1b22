/**
 * Free joints in chains: against planck (npm planck 1.4, a port of the Box2D rigid-body engine, built by
 * bench/planck-chain.ts as in tests/engine/planck-reference.test.ts), against the work–energy principle
 * (textbook: the drive's work ∫τ·ω dt equals the change in the chain's energy), and on bad chains.
 *
 * planck steps with first-order semi-implicit Euler, so its state after a fixed time differs from the
 * exact motion by O(dt). The check is that it converges to ours: halving dt halves the difference
 * (ratio 1.6–2.4), the differences are small (< 2e-3 rad at dt = 1/2000 s over 1.5–2 s), and Richardson
 * extrapolation 2·p(dt/2) − p(dt) removes the first-order term and lands within 2e-5 rad of ours.
 */
import {
  type ChainBody,
  type MotionProfile,
  FreeMotionError,
  analyseCycle,
  chainEnergy,
  createChain,
  jointAccelerations,
} from '@/features/loads/engine';
import { Dopri5, denseValue } from '@/features/loads/engine/dopri5';
import { freeAccelerations } from '@/features/loads/engine/free-dynamics';
import { buildPlanckChain } from '@/bench/planck-chain';

const g = 9.81;

// Invented chain (the same as the planck reference test): main arm, sub-arm on its tip.
const bodies: ChainBody[] = [
  { name: 'main arm', massKg: 800, cgM: [2, 0.1], inertiaCgKgM2: 1200, tipM: [4.5, 0] },
  { name: 'sub-arm', massKg: 300, cgM: [1.2, -0.2], inertiaCgKgM2: 150, tipM: [2, 0.3] },
  { name: 'gondola', massKg: 500, cgM: [0.8, 0], inertiaCgKgM2: 90 },
];

/** planck's relative joint angles and rates after `seconds`. */
function planckAfter(
  bs: ChainBody[],
  angleRad: number[],
  rateRadS: number[],
  seconds: number,
  dt: number,
  motorRateRadS?: (number | null)[],
) {
  const pc = buildPlanckChain(bs, { gravityMS2: g, angleRad, rateRadS, dt, motorRateRadS });
  const steps = Math.round(seconds / dt);
  for (let k = 0; k < steps; k++) pc.world.step(dt, 100, 20);
  const rel = (abs: number[]) => abs.map((v, i) => (i === 0 ? v : v - abs[i - 1]));
  return {
    angle: rel(pc.bodies.map((b) => b.getAngle())),
    rate: rel(pc.bodies.map((b) => b.getAngularVelocity())),
  };
}

function expectConvergesTo(ours: number[], coarse: number[], fine: number[]) {
  ours.forEach((value, i) => {
    const eCoarse = coarse[i] - value;
    const eFine = fine[i] - value;
    expect(Math.abs(eCoarse)).toBeLessThan(2e-3);
    expect(Math.abs(eCoarse / eFine)).toBeGreaterThan(1.6);
    expect(Math.abs(eCoarse / eFine)).toBeLessThan(2.4);
    expect(Math.abs(2 * fine[i] - coarse[i] - value)).toBeLessThan(2e-5);
  });
}

test('the free set’s mass matrix route gives the same accelerations as jointAccelerations (unit-acceleration columns)', () => {
  const chain = createChain(bodies, g);
  const solve = freeAccelerations(chain, [0, 1, 2]);
  for (const [q, qd] of [
    [
      [0.3, -0.9, 0.4],
      [0.5, 0.2, -0.1],
    ],
    [
      [2.1, 1.3, -2.4],
      [-1.5, 2.2, 0.7],
    ],
  ]) {
    const qdd = new Float64Array(3);
    solve(Float64Array.from(q), Float64Array.from(qd), qdd);
    const reference = jointAccelerations(chain, q, qd, [0, 0, 0]);
    reference.forEach((a, i) => expect(qdd[i]).toBeCloseTo(a, 10));
  }
});

test('double pendulum, both pins free: planck converges to the engine’s motion as dt halves', () => {
  const bs = bodies.slice(0, 2);
  const angle = [0.3, -0.9];
  const rate = [0.5, 0.2];
  const T = 1.5;
  const result = analyseCycle({
    bodies: bs,
    gravityMS2: g,
    profiles: [
      { kind: 'free', angleRad: angle[0], rateRadS: rate[0] },
      { kind: 'free', angleRad: angle[1], rateRadS: rate[1] },
    ],
    durationS: T,
    samples: 301,
  });
  const end = (key: 'angleRad' | 'rateRadS') => result.joints.map((j) => j[key][300]);
  const coarse = planckAfter(bs, angle, rate, T, 1 / 2000);
  const fine = planckAfter(bs, angle, rate, T, 1 / 4000);
  expectConvergesTo(end('angleRad'), coarse.angle, fine.angle);
  // Torque 0 on both free pins throughout.
  for (const j of result.joints) {
    for (const t of j.torqueNm) expect(t).toBe(0);
    expect(j.freeTorqueResidualNm ?? Infinity).toBeLessThan(1e-6);
  }
});

test('double pendulum: joint forces agree with planck’s reactions within 0.5 % of the peak', () => {
  const bs = bodies.slice(0, 2);
  const dt = 1 / 2000;
  const result = analyseCycle({
    bodies: bs,
    gravityMS2: g,
    profiles: [
      { kind: 'free', angleRad: 0.3, rateRadS: 0.5 },
      { kind: 'free', angleRad: -0.9, rateRadS: 0.2 },
    ],
    durationS: 1,
    samples: 101,
  });
  const pc = buildPlanckChain(bs, { gravityMS2: g, angleRad: [0.3, -0.9], rateRadS: [0.5, 0.2], dt });
  let worst = 0;
  let peak = 0;
  for (let k = 0; k < 2000; k++) {
    const s = pc.step();
    // planck needs a few steps before its impulses carry the centripetal part; compare every 0.01 s.
    if (k < 20 || k % 20 !== 0) continue;
    const i = k / 20;
    result.joints.forEach((j, n) => {
      worst = Math.max(worst, Math.hypot(j.forceXN[i] - s.forceN[n][0], j.forceYN[i] - s.forceN[n][1]));
      peak = Math.max(peak, Math.hypot(...s.forceN[n]));
    });
  }
  expect(peak).toBeGreaterThan(5000);
  expect(worst).toBeLessThan(0.005 * peak);
});

test('three free pins over 10 s: energy constant to 1e-7 of Σ m·g·reach, no torque on any pin (energy conservation)', () => {
  const start = [-Math.PI / 2 + 1.6, 0.3, -0.2];
  const result = analyseCycle({
    bodies,
    gravityMS2: g,
    profiles: start.map((angleRad) => ({ kind: 'free', angleRad })),
    durationS: 10,
    samples: 1001,
  });
  const chain = createChain(bodies, g);
  let scale = 0;
  let reach = 0;
  for (const b of bodies) {
    scale += b.massKg * g * (reach + Math.hypot(...b.cgM));
    reach += b.tipM ? Math.hypot(...b.tipM) : 0;
  }
  const energy = (k: number) =>
    chainEnergy(
      chain,
      result.joints.map((j) => j.angleRad[k]),
      result.joints.map((j) => j.rateRadS[k]),
    ).totalJ;
  const e0 = energy(0);
  let drift = 0;
  for (let k = 0; k < result.samples; k++) drift = Math.max(drift, Math.abs(energy(k) - e0));
  expect(drift).toBeLessThan(1e-7 * scale);
  // It does move: kinetic energy well above the drift.
  const last = chainEnergy(
    chain,
    result.joints.map((j) => j.angleRad[500]),
    result.joints.map((j) => j.rateRadS[500]),
  );
  expect(last.kineticJ).toBeGreaterThan(0.01 * scale);
  for (const j of result.joints) {
    for (const t of j.torqueNm) expect(t).toBe(0);
    expect(j.freeTorqueResidualNm ?? Infinity).toBeLessThan(1e-9 * scale);
  }
});

describe('a free gondola on a steadily driven arm (mixed chain)', () => {
  const bs = bodies.slice(0, 2);
  const w = 1.2;
  const profiles: MotionProfile[] = [
    { kind: 'constant', rpm: (w * 60) / (2 * Math.PI), startAngleRad: 0.3 },
    { kind: 'free', angleRad: -0.9, rateRadS: 0.2 },
  ];
  const T = 2;
  const result = analyseCycle({ bodies: bs, gravityMS2: g, profiles, durationS: T, samples: 2001 });

  it('planck (arm on a motor, gondola free) converges to the engine’s motion as dt halves', () => {
    const ours = result.joints.map((j) => j.angleRad[2000]);
    const coarse = planckAfter(bs, [0.3, -0.9], [w, 0.2], T, 1 / 2000, [w, null]);
    const fine = planckAfter(bs, [0.3, -0.9], [w, 0.2], T, 1 / 4000, [w, null]);
    expect(ours[0]).toBeCloseTo(0.3 + w * T, 12);
    expectConvergesTo(ours.slice(1), coarse.angle.slice(1), fine.angle.slice(1));
  });

  it('work–energy: the drive’s work ∫τ·ω dt equals the change in energy; the free pin carries no torque', () => {
    const chain = createChain(bs, g);
    const energy = (k: number) =>
      chainEnergy(
        chain,
        result.joints.map((j) => j.angleRad[k]),
        result.joints.map((j) => j.rateRadS[k]),
      ).totalJ;
    const tau = result.joints[0].torqueNm;
    const h = T / 2000;
    let work = 0;
    let scale = 0;
    // Simpson's rule over even intervals: at an interior even k the running sum counts τ_k twice
    // over (weight 2 where an end takes 1), so one third of h·τ_k·ω comes off there.
    for (let k = 0; k <= 2000; k++) {
      const weight = k === 0 || k === 2000 ? 1 : k % 2 ? 4 : 2;
      work += (weight * h * tau[k] * w) / 3;
      scale = Math.max(scale, Math.abs(tau[k] * w));
      if (k % 100 === 0 && k > 0) {
        const upToK = k === 2000 ? work : work - (h * tau[k] * w) / 3;
        expect(Math.abs(upToK - (energy(k) - energy(0)))).toBeLessThan(1e-6 * scale * T);
      }
    }
    expect(scale).toBeGreaterThan(100);
    for (const t of result.joints[1].torqueNm) expect(t).toBe(0);
    expect(result.joints[1].freeTorqueResidualNm ?? Infinity).toBeLessThan(1e-8 * scale);
  });
});

test('a measured arm (angle record of the same steady rotation) drives the free gondola as the closed form does', () => {
  const bs = bodies.slice(0, 2);
  const w = 1.2;
  const timeS = Array.from({ length: 501 }, (_, k) => k / 100);
  const steady: MotionProfile[] = [
    { kind: 'constant', rpm: (w * 60) / (2 * Math.PI), startAngleRad: 0.3 },
    { kind: 'free', angleRad: -0.9 },
  ];
  const measured: MotionProfile[] = [
    { kind: 'measured', timeS, angleRad: timeS.map((t) => 0.3 + w * t) },
    { kind: 'free', angleRad: -0.9 },
  ];
  const a = analyseCycle({ bodies: bs, gravityMS2: g, profiles: steady, durationS: 4, samples: 201 });
  const b = analyseCycle({ bodies: bs, gravityMS2: g, profiles: measured, durationS: 4, samples: 201 });
  for (let k = 0; k < 201; k++) expect(b.joints[1].angleRad[k]).toBeCloseTo(a.joints[1].angleRad[k], 4);
});

describe('unsolvable or motionless free joints', () => {
  it('a free pin carrying no inertia (mass on the pin, no moment of inertia) is refused at profiles.<i>', () => {
    const pointOnPin: ChainBody = { name: 'slack hanger', massKg: 50, cgM: [0, 0], inertiaCgKgM2: 0 };
    const run = (profiles: MotionProfile[], bs: ChainBody[]) => () =>
      analyseCycle({ bodies: bs, profiles, durationS: 2 });
    expect(run([{ kind: 'free', angleRad: 1 }], [pointOnPin])).toThrow(FreeMotionError);
    try {
      run(
        [
          { kind: 'constant', rpm: 5 },
          { kind: 'free', angleRad: 1 },
        ],
        [{ ...bodies[0] }, pointOnPin],
      )();
      throw new Error('expected a FreeMotionError');
    } catch (error) {
      expect(error).toBeInstanceOf(FreeMotionError);
      expect((error as FreeMotionError).path).toEqual(['profiles', 1]);
      expect((error as Error).message).toMatch(/Joint 2 \(slack hanger\) is free.*no inertia about its pin/);
    }
  });

  it('hanging at rest: no period; without durationS a clear error at durationS, with it a warning and no motion', () => {
    const pendulum = [bodies[2]];
    const hanging: MotionProfile[] = [{ kind: 'free', angleRad: -Math.PI / 2 }];
    expect(() => analyseCycle({ bodies: pendulum, profiles: hanging })).toThrow(
      /stays at rest.*Give durationS/,
    );
    const result = analyseCycle({ bodies: pendulum, profiles: hanging, durationS: 30 });
    expect(result.joints[0].freePeriodS).toBeNull();
    expect(result.warnings).toEqual([
      expect.objectContaining({ code: 'free-period-none', level: 'warning' }),
    ]);
    for (const v of result.joints[0].rateRadS) expect(Math.abs(v)).toBeLessThan(1e-12);
  });

  it('a cycle shorter than the free period is flagged', () => {
    const result = analyseCycle({
      bodies: [bodies[2]],
      profiles: [{ kind: 'free', angleRad: 0 }],
      durationS: 0.5,
    });
    expect(result.joints[0].freePeriodS).toBeGreaterThan(0.5);
    expect(result.warnings.map((w) => w.code)).toEqual(['free-period', 'free-cycle-short']);
  });
});

test('Dormand–Prince 5(4) with dense output on y″ = −y matches cos t over 20 s (exact solution)', () => {
  const stepper = new Dopri5((_t, y, dy) => ((dy[0] = y[1]), (dy[1] = -y[0])), 0, [1, 0], {
    rtol: 1e-10,
    atol: 1e-10,
  });
  let worst = 0;
  while (stepper.t < 20) {
    const seg = stepper.step(20);
    for (let s = 0; s <= 8; s++) {
      const t = seg.t0 + (s / 8) * seg.h;
      worst = Math.max(worst, Math.abs(denseValue(seg, t, 0, 2) - Math.cos(t)));
    }
  }
  expect(stepper.t).toBe(20);
  expect(worst).toBeLessThan(1e-8);
  expect(stepper.evaluations).toBe(6 * (stepper.steps + stepper.rejected) + 2);
});
