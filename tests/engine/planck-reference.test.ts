import { type ChainBody, createChain, jointAccelerations, solveInstant } from '@/features/loads/engine';
import { buildPlanckChain } from '@/bench/planck-chain';

/**
 * Reference: planck 1.4 (npm), a general-purpose 2D rigid-body engine ported from Box2D, simulating the
 * same chains with revolute joints. Its joint reactions are read with getReactionForce(1/dt) — the force
 * on body B (our child body) from body A (its parent), global frame — and getMotorTorque(1/dt), since
 * in this Box2D version getReactionTorque(1/dt) reports only the limit torque. Sleep and damping are
 * off, the step is small and the solver iterates to convergence.
 *
 * Our engine is fed planck's state at the start of each step: angles, rates, and the step's mean
 * acceleration (ω_after − ω_before)/dt. planck integrates with first-order semi-implicit Euler, so the
 * two differ by O(dt): measured 0.04 % of the peak force at dt = 1/2000 s for these chains, halving
 * with dt. Tolerance: 0.5 % of the run's peak force (and for torques, of the chain's Σ m·g·reach).
 * The first steps are skipped: planck needs one step before its impulses include the centripetal part.
 */
const g = 9.81;
const dt = 1 / 2000;
const TOLERANCE = 0.005;

// Invented chain: a main arm, a sub-arm on its tip, a gondola on the sub-arm's tip.
const chainBodies: ChainBody[] = [
  { name: 'main arm', massKg: 800, cgM: [2, 0.1], inertiaCgKgM2: 1200, tipM: [4.5, 0] },
  { name: 'sub-arm', massKg: 300, cgM: [1.2, -0.2], inertiaCgKgM2: 150, tipM: [2, 0.3] },
  { name: 'gondola', massKg: 500, cgM: [0.8, 0], inertiaCgKgM2: 90 },
];

function torqueScale(bodies: readonly ChainBody[]): number {
  let reach = 0;
  let scale = 0;
  for (const b of bodies) {
    scale += b.massKg * g * (reach + Math.hypot(...b.cgM));
    reach += b.tipM ? Math.hypot(...b.tipM) : 0;
  }
  return scale;
}

type Run = {
  worstForce: number;
  peakForce: number;
  worstTorque: number;
  compared: number;
  worstAccel: number;
};

function compare(
  bodies: readonly ChainBody[],
  angleRad: number[],
  rateRadS: number[],
  seconds: number,
  motorRateRadS?: (number | null)[],
): Run {
  const planck = buildPlanckChain(bodies, { gravityMS2: g, angleRad, rateRadS, dt, motorRateRadS });
  const chain = createChain(bodies, g);
  const run: Run = { worstForce: 0, peakForce: 0, worstTorque: 0, compared: 0, worstAccel: 0 };
  const steps = Math.round(seconds / dt);
  for (let k = 0; k < steps; k++) {
    const s = planck.step();
    if (k < 3 || k % 20 !== 0) continue;
    const ours = solveInstant(bodies, s, { gravityMS2: g });
    ours.joints.forEach((j, i) => {
      run.worstForce = Math.max(
        run.worstForce,
        Math.hypot(j.forceN[0] - s.forceN[i][0], j.forceN[1] - s.forceN[i][1]),
      );
      run.peakForce = Math.max(run.peakForce, Math.hypot(...s.forceN[i]));
      run.worstTorque = Math.max(run.worstTorque, Math.abs(j.torqueNm - s.torqueNm[i]));
    });
    // The other way round: our forward dynamics fed planck's torques gives planck's accelerations.
    const acc = jointAccelerations(chain, s.angleRad, s.rateRadS, s.torqueNm);
    s.accelRadS2.forEach((a, i) => {
      if (motorRateRadS?.[i] == null) run.worstAccel = Math.max(run.worstAccel, Math.abs(acc[i] - a));
    });
    run.compared++;
  }
  return run;
}

describe('joint reactions agree with planck (Box2D port) within 0.5 % of peak', () => {
  describe.each([1, 2, 3])('%i-body chain', (count) => {
    const bodies = chainBodies.slice(0, count);
    const scale = torqueScale(bodies);

    it('free pins, swinging from an arbitrary start', () => {
      const run = compare(bodies, [0.3, -0.9, 0.4].slice(0, count), [0.5, 0.2, -0.1].slice(0, count), 0.8);
      expect(run.compared).toBeGreaterThan(70);
      expect(run.peakForce).toBeGreaterThan(1000);
      expect(run.worstForce).toBeLessThan(TOLERANCE * run.peakForce);
      // Free pins: planck reports no torque, and ours must come out (nearly) zero from planck's motion.
      expect(run.worstTorque).toBeLessThan(TOLERANCE * scale);
      expect(run.worstAccel).toBeLessThan(0.05);
    });

    it('first joint motor-driven at 1.2 rad/s, the others free', () => {
      const motors = [1.2, null, null].slice(0, count);
      const run = compare(
        bodies,
        [0.3, -0.9, 0.4].slice(0, count),
        [1.2, 0.2, -0.1].slice(0, count),
        2,
        motors,
      );
      expect(run.compared).toBeGreaterThan(190);
      expect(run.worstForce).toBeLessThan(TOLERANCE * run.peakForce);
      expect(run.worstTorque).toBeLessThan(TOLERANCE * scale);
      if (count > 1) expect(run.worstAccel).toBeLessThan(0.05);
    });
  });
});
