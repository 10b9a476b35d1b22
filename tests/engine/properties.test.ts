import * as fc from 'fast-check';

import {
  type ChainBody,
  type MotionProfile,
  analyseCycle,
  chainEnergy,
  createChain,
  jointAccelerations,
  solveInstant,
} from '@/features/loads/engine';

/**
 * Properties any correct rigid-body solver has (standard mechanics: frame invariance, linearity in
 * mass, the work–energy theorem, the moment equation about any point), checked on random chains.
 */

const finite = (min: number, max: number) => fc.double({ min, max, noNaN: true, noDefaultInfinity: true });
const point = (r: number) => fc.tuple(finite(-r, r), finite(-r, r));

const bodyArb = fc.record({
  massKg: finite(1, 5000),
  cgM: point(5),
  inertiaCgKgM2: finite(0, 2000),
  tipM: point(6),
});

const chainArb = fc
  .array(bodyArb, { minLength: 1, maxLength: 4 })
  .map((bs) => bs.map((b, i): ChainBody => ({ name: `body ${i + 1}`, ...b })));

const problemArb = chainArb.chain((bodies) => {
  const n = bodies.length;
  const values = (r: number) => fc.array(finite(-r, r), { minLength: n, maxLength: n });
  return fc.record({
    bodies: fc.constant(bodies),
    state: fc.record({ angleRad: values(Math.PI), rateRadS: values(3), accelRadS2: values(5) }),
  });
});

/** Force and torque scale of a problem, for relative round-off tolerances. */
function scaleOf(r: ReturnType<typeof solveInstant>): { force: number; torque: number } {
  let force = 1;
  let torque = 1;
  for (const j of r.joints) {
    force = Math.max(force, j.forceMagnitudeN);
    torque = Math.max(torque, Math.abs(j.torqueNm));
  }
  return { force, torque: Math.max(torque, force * 10) };
}

describe('frame invariance: rotating the whole problem rotates the forces', () => {
  it('turning geometry and gravity by φ turns every joint force by φ and leaves torques alone', () => {
    fc.assert(
      fc.property(problemArb, finite(-Math.PI, Math.PI), ({ bodies, state }, phi) => {
        const g = 9.80665;
        const base = solveInstant(bodies, state);
        const turned = solveInstant(
          bodies,
          { ...state, angleRad: state.angleRad.map((a, i) => (i === 0 ? a + phi : a)) },
          { gravityVectorMS2: [g * Math.sin(phi), -g * Math.cos(phi)] },
        );
        const { force, torque } = scaleOf(base);
        const c = Math.cos(phi);
        const s = Math.sin(phi);
        base.joints.forEach((j, i) => {
          const t = turned.joints[i];
          expect(Math.abs(c * j.forceN[0] - s * j.forceN[1] - t.forceN[0])).toBeLessThan(1e-9 * force);
          expect(Math.abs(s * j.forceN[0] + c * j.forceN[1] - t.forceN[1])).toBeLessThan(1e-9 * force);
          expect(Math.abs(j.torqueNm - t.torqueNm)).toBeLessThan(1e-9 * torque);
          // In the body's own frame nothing changes at all.
          expect(Math.abs(j.forceBodyN[0] - t.forceBodyN[0])).toBeLessThan(1e-9 * force);
          expect(Math.abs(j.forceBodyN[1] - t.forceBodyN[1])).toBeLessThan(1e-9 * force);
        });
      }),
      { numRuns: 200 },
    );
  });
});

describe('linearity in mass', () => {
  it('scaling every mass and inertia by k scales every force and torque by k', () => {
    fc.assert(
      fc.property(problemArb, finite(0.01, 100), ({ bodies, state }, k) => {
        const base = solveInstant(bodies, state);
        const heavy = solveInstant(
          bodies.map((b) => ({ ...b, massKg: b.massKg * k, inertiaCgKgM2: b.inertiaCgKgM2 * k })),
          state,
        );
        const { force, torque } = scaleOf(base);
        base.joints.forEach((j, i) => {
          const h = heavy.joints[i];
          expect(Math.abs(h.forceN[0] - k * j.forceN[0])).toBeLessThan(1e-9 * k * force);
          expect(Math.abs(h.forceN[1] - k * j.forceN[1])).toBeLessThan(1e-9 * k * force);
          expect(Math.abs(h.torqueNm - k * j.torqueNm)).toBeLessThan(1e-9 * k * torque);
        });
        // Kinematics do not depend on mass at all.
        base.bodies.forEach((b, i) => expect(heavy.bodies[i].cgAccelMS2).toEqual(b.cgAccelMS2));
      }),
      { numRuns: 200 },
    );
  });
});

describe('moments about any point P, two ways', () => {
  it('ΣM_P of the forces equals I_G·α + r_PG × m·a_G to round-off, for every body', () => {
    fc.assert(
      fc.property(
        problemArb,
        fc.array(point(20), { minLength: 1, maxLength: 3 }),
        point(12),
        ({ bodies, state }, ps, gravity) => {
          // Any in-plane gravity vector, so the weight's moment is checked in both components.
          const r = solveInstant(bodies, state, {
            points: ps.map((p) => ({ pointM: p })),
            gravityVectorMS2: gravity,
          });
          const { torque } = scaleOf(r);
          const reach = 1 + Math.max(...ps.map((p) => Math.hypot(...p)));
          expect(r.moments).toHaveLength(ps.length);
          for (const m of r.moments)
            for (const b of m.bodies) {
              expect(Math.abs(b.differenceNm)).toBeLessThan(1e-9 * torque * reach);
              expect(b.differenceNm).toBeCloseTo(b.fromForcesNm - b.fromKineticsNm, 12);
            }
        },
      ),
      { numRuns: 200 },
    );
  });

  it('points given in a body frame land on that body: its pivot, and its centre where ΣM_G = I_G·α', () => {
    fc.assert(
      fc.property(problemArb, ({ bodies, state }) => {
        const last = bodies.length - 1;
        const r = solveInstant(bodies, state, {
          points: [
            { pointM: [0, 0], body: last },
            { pointM: bodies[last].cgM, body: last },
          ],
        });
        const [pivot, centre] = r.moments;
        const scale = scaleOf(r).torque;
        pivot.pointM.forEach((v, k) =>
          expect(Math.abs(v - r.bodies[last].pivotPositionM[k])).toBeLessThan(1e-9 * (1 + Math.abs(v))),
        );
        centre.pointM.forEach((v, k) =>
          expect(Math.abs(v - r.bodies[last].cgPositionM[k])).toBeLessThan(1e-9 * (1 + Math.abs(v))),
        );
        // About its own centre the kinetic moment is I_G·α alone (standard result ΣM_G = I_G·α).
        const own = centre.bodies[last];
        const iAlpha = bodies[last].inertiaCgKgM2 * r.bodies[last].angularAccelRadS2;
        expect(Math.abs(own.fromKineticsNm - iAlpha)).toBeLessThan(1e-9 * scale);
        expect(Math.abs(own.fromForcesNm - iAlpha)).toBeLessThan(1e-9 * scale);
      }),
      { numRuns: 100 },
    );
  });
});

describe('forward and inverse dynamics are each other’s inverse', () => {
  it('accelerations from given torques reproduce those torques', () => {
    fc.assert(
      fc.property(problemArb, ({ bodies, state }) => {
        // Keep the mass matrix well conditioned: every body needs some inertia about its pivot.
        const solid = bodies.map((b) => ({ ...b, inertiaCgKgM2: b.inertiaCgKgM2 + b.massKg * 0.1 }));
        const chain = createChain(solid);
        const torques = state.accelRadS2.map((a) => a * 1000);
        const acc = jointAccelerations(chain, state.angleRad, state.rateRadS, torques);
        const back = solveInstant(solid, { ...state, accelRadS2: Array.from(acc) });
        back.joints.forEach((j, i) =>
          expect(Math.abs(j.torqueNm - torques[i])).toBeLessThan(1e-6 * scaleOf(back).torque),
        );
      }),
      { numRuns: 100 },
    );
  });
});

describe('power balance over a cycle (work–energy theorem)', () => {
  it('∫ Σ τ_i·q̇_i dt equals the change in kinetic plus potential energy', () => {
    const profileArb = fc.record({
      amplitudeRad: finite(0.1, 1.5),
      periodS: finite(2, 12),
      centreRad: finite(-Math.PI, Math.PI),
      phaseRad: finite(0, 2 * Math.PI),
    });
    fc.assert(
      fc.property(
        chainArb,
        fc.array(profileArb, { minLength: 4, maxLength: 4 }),
        finite(1, 6),
        (bodies, swings, duration) => {
          const profiles: MotionProfile[] = bodies.map((_, i) => ({ kind: 'swing', ...swings[i] }));
          // Odd sample count for Simpson's rule; fine enough that its error is far below the tolerance.
          const samples = 4001;
          const cycle = analyseCycle({ bodies, profiles, durationS: duration, samples });
          const h = duration / (samples - 1);
          let work = 0;
          let powerScale = 0;
          for (let k = 0; k < samples; k++) {
            let p = 0;
            cycle.joints.forEach((j) => (p += j.torqueNm[k] * j.rateRadS[k]));
            const weight = k === 0 || k === samples - 1 ? 1 : k % 2 === 1 ? 4 : 2;
            work += (weight * h * p) / 3;
            powerScale = Math.max(powerScale, Math.abs(p));
          }
          const chain = createChain(bodies);
          const at = (k: number) =>
            chainEnergy(
              chain,
              cycle.joints.map((j) => j.angleRad[k]),
              cycle.joints.map((j) => j.rateRadS[k]),
            ).totalJ;
          const change = at(samples - 1) - at(0);
          // Simpson's error for smooth periodic integrands over ≥ 4000 steps: far below 1e-6 of the
          // power scale × duration; the tolerance leaves room for round-off in the energies too.
          expect(Math.abs(work - change)).toBeLessThan(1e-6 * (powerScale * duration + Math.abs(change) + 1));
        },
      ),
      { numRuns: 40 },
    );
  });
});
