/**
 * The pieces of a free-joint integration that know the chain: the prescribed joints' motion at any
 * instant, and the free joints' accelerations from the equations of motion M(q)·q̈ + h(q, q̇) = τ with
 * τ = 0 on the free set F. Split out of free-motion.ts, which does the stepping and the period.
 */
import { type Chain, createChainWork, solveInto } from '@/features/loads/engine/chain';
import { type MotionProfile, naturalDurationS, sampleProfile } from '@/features/loads/engine/profiles';

/** A free joint the chain cannot move (no inertia about its pin), or no period to take as the cycle. */
export class FreeMotionError extends Error {
  constructor(
    message: string,
    /** Where in the cycle request the problem lies, e.g. ['profiles', 1] or ['durationS']. */
    readonly path: (string | number)[],
  ) {
    super(message);
    this.name = 'FreeMotionError';
  }
}

/** Writes the prescribed joints' angle, rate and acceleration at time t into full-chain arrays. */
export type PrescribedMotion = (t: number, q: Float64Array, qd: Float64Array, qdd: Float64Array) => void;

/**
 * The prescribed joints as functions of time. Closed-form profiles are sampled exactly at each instant.
 * A measured profile is sampled once on an even grid (its smoothing and, for rate records, its running
 * integration need the whole record in order) and read between grid points by the quintic Hermite
 * polynomial through angle, rate and acceleration at both ends: continuous to the acceleration, so the
 * integrator's error control sees no false kinks.
 */
export function prescribedMotion(profiles: readonly MotionProfile[]): PrescribedMotion {
  const one = new Float64Array(1);
  const a = new Float64Array(1);
  const r = new Float64Array(1);
  const c = new Float64Array(1);
  const parts = profiles.map((p, i) => {
    if (p.kind === 'free') return null;
    if (p.kind !== 'measured')
      return (t: number, q: Float64Array, qd: Float64Array, qdd: Float64Array) => {
        one[0] = t;
        sampleProfile(p, one, 0, 1, a, r, c);
        q[i] = a[0];
        qd[i] = r[0];
        qdd[i] = c[0];
      };
    const span = naturalDurationS(p) ?? 0;
    const points = Math.min(20_000, Math.max(400, 2 * p.timeS.length));
    const grid = Float64Array.from({ length: points }, (_, k) => (k * span) / (points - 1));
    const gq = new Float64Array(points);
    const gr = new Float64Array(points);
    const ga = new Float64Array(points);
    sampleProfile(p, grid, 0, 1, gq, gr, ga);
    const h = span / (points - 1);
    return (t: number, q: Float64Array, qd: Float64Array, qdd: Float64Array) => {
      const k = Math.min(points - 2, Math.max(0, Math.floor(t / h)));
      const s = (t - k * h) / h;
      const c0 = gq[k];
      const c1 = h * gr[k];
      const c2 = (h * h * ga[k]) / 2;
      const A = gq[k + 1] - c0 - c1 - c2;
      const B = h * gr[k + 1] - c1 - 2 * c2;
      const C = h * h * ga[k + 1] - 2 * c2;
      const c3 = 10 * A - 4 * B + C / 2;
      const c4 = -15 * A + 7 * B - C;
      const c5 = 6 * A - 3 * B + C / 2;
      q[i] = c0 + s * (c1 + s * (c2 + s * (c3 + s * (c4 + s * c5))));
      qd[i] = (c1 + s * (2 * c2 + s * (3 * c3 + s * (4 * c4 + s * 5 * c5)))) / h;
      qdd[i] = (2 * c2 + s * (6 * c3 + s * (12 * c4 + s * 20 * c5))) / (h * h);
    };
  });
  return (t, q, qd, qdd) => {
    for (const part of parts) if (part) part(t, q, qd, qdd);
  };
}

/** The shortest span of any measured record: free motion is never integrated past a record's end. */
export function measuredSpanS(profiles: readonly MotionProfile[]): number {
  let span = Infinity;
  for (const p of profiles) if (p.kind === 'measured') span = Math.min(span, naturalDurationS(p) ?? 0);
  return span;
}

/** Sets the free joints' accelerations in `qdd` from q, q̇ and the prescribed entries of q̈. */
export type FreeAccelerations = (q: Float64Array, qd: Float64Array, qdd: Float64Array) => void;

/**
 * Forward dynamics restricted to the free set. The inverse dynamics with q̈_F = 0 gives the free joints'
 * torques without their own accelerations (speed terms, gravity and the prescribed joints'
 * accelerations); the mass matrix follows from the same pass's positions, since a unit rate at joint j
 * turns every body i ≥ j about pivot j: M_jk = Σ_{i ≥ max(j,k)} I_G,i + m_i·(r_Gi − p_j)·(r_Gi − p_k)
 * (the column-by-column route of jointAccelerations gives the same matrix; tests check it). Then
 * M_FF·q̈_F = −τ_F(q̈_F = 0) is solved by Cholesky: M_FF is symmetric and positive definite unless a free
 * joint carries nothing that resists turning.
 */
export function freeAccelerations(chain: Chain, free: readonly number[]): FreeAccelerations {
  const n = chain.size;
  const nf = free.length;
  const work = createChainWork(n);
  const m = new Float64Array(nf * nf);
  const x = new Float64Array(nf);
  // A size for the chain's inertia, so "no inertia about the pin" is judged relative to the chain.
  let scale = 0;
  for (let i = 0; i < n; i++) {
    const r2 = chain.cgX[i] ** 2 + chain.cgY[i] ** 2 + chain.tipX[i] ** 2 + chain.tipY[i] ** 2;
    scale += chain.inertia[i] + chain.mass[i] * r2;
  }
  const tiny = 1e-12 * scale;
  return (q, qd, qdd) => {
    for (let k = 0; k < nf; k++) qdd[free[k]] = 0;
    solveInto(chain, q, qd, qdd, 0, work);
    for (let k = 0; k < nf; k++) x[k] = -work.torque[free[k]];
    for (let a = 0; a < nf; a++) {
      const j = free[a];
      for (let b = a; b < nf; b++) {
        const k = free[b];
        let sum = 0;
        for (let i = k; i < n; i++) {
          const gx = work.pivotX[i] + work.cgRelX[i];
          const gy = work.pivotY[i] + work.cgRelY[i];
          sum +=
            chain.inertia[i] +
            chain.mass[i] *
              ((gx - work.pivotX[j]) * (gx - work.pivotX[k]) + (gy - work.pivotY[j]) * (gy - work.pivotY[k]));
        }
        m[a * nf + b] = sum;
        m[b * nf + a] = sum;
      }
    }
    // Cholesky M = L·Lᵀ in place (lower triangle), then forward and back substitution.
    for (let j = 0; j < nf; j++) {
      let d = m[j * nf + j];
      for (let p = 0; p < j; p++) d -= m[j * nf + p] ** 2;
      if (!(d > tiny)) throw singular(chain, free[j]);
      const l = Math.sqrt(d);
      m[j * nf + j] = l;
      for (let i = j + 1; i < nf; i++) {
        let v = m[i * nf + j];
        for (let p = 0; p < j; p++) v -= m[i * nf + p] * m[j * nf + p];
        m[i * nf + j] = v / l;
      }
    }
    for (let i = 0; i < nf; i++) {
      let v = x[i];
      for (let p = 0; p < i; p++) v -= m[i * nf + p] * x[p];
      x[i] = v / m[i * nf + i];
    }
    for (let i = nf - 1; i >= 0; i--) {
      let v = x[i];
      for (let p = i + 1; p < nf; p++) v -= m[p * nf + i] * x[p];
      x[i] = v / m[i * nf + i];
    }
    for (let k = 0; k < nf; k++) qdd[free[k]] = x[k];
  };
}

function singular(chain: Chain, joint: number): FreeMotionError {
  return new FreeMotionError(
    `Joint ${joint + 1} (${chain.names[joint]}) is free, but what it carries has no inertia about its ` +
      'pin (no mass off the pin and no moment of inertia), so its motion is undetermined: give the ' +
      'body its mass properties or prescribe the joint’s motion',
    ['profiles', joint],
  );
}
