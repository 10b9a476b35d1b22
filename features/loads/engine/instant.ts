import {
  type Chain,
  type ChainBody,
  type ChainWork,
  type JointState,
  type Vec2,
  createChain,
  createChainWork,
  solveInto,
  STANDARD_GRAVITY_MS2,
} from '@/features/loads/engine/chain';

/** A point P for the moment check: global coordinates, or in a body's own frame when `body` is given. */
export type MomentPoint = { name?: string; pointM: Vec2; body?: number };

export type JointLoad = {
  name: string;
  /** On body i by its parent, global frame. */
  forceN: [number, number];
  forceMagnitudeN: number;
  /** About joint i's pivot: the drive or brake torque, 0 on a free pin. */
  torqueNm: number;
  /** The same force in body i's own frame: [along body x, across body y]. */
  forceBodyN: [number, number];
};

export type BodyMotion = {
  name: string;
  /** Kinematic acceleration of the centre of gravity, gravity not included. */
  cgAccelMS2: [number, number];
  angularAccelRadS2: number;
  angleRad: number;
  angularVelocityRadS: number;
  pivotPositionM: [number, number];
  cgPositionM: [number, number];
};

export type BodyMomentCheck = {
  name: string;
  /** ΣM_P of every force and couple acting on the body (parent, child, weight). */
  fromForcesNm: number;
  /** I_G·α + r_PG × m·a_G. */
  fromKineticsNm: number;
  differenceNm: number;
};

export type MomentCheck = { name: string; pointM: [number, number]; bodies: BodyMomentCheck[] };

export type InstantResult = {
  gravityMS2: number;
  joints: JointLoad[];
  bodies: BodyMotion[];
  moments: MomentCheck[];
};

export type InstantOptions = {
  /** Magnitude along −y (default standard gravity). */
  gravityMS2?: number;
  /** The in-plane gravity vector instead, for a tilted plane of motion; wins over gravityMS2. */
  gravityVectorMS2?: Vec2;
  /** Points for the two-way moment check; the ground pivot when omitted. */
  points?: readonly MomentPoint[];
};

/** The single-instant solve behind POST /api/loads. */
export function solveInstant(
  bodies: readonly ChainBody[],
  state: JointState,
  options: InstantOptions = {},
): InstantResult {
  const chain = createChain(bodies, options.gravityVectorMS2 ?? options.gravityMS2 ?? STANDARD_GRAVITY_MS2);
  const n = chain.size;
  for (const key of ['angleRad', 'rateRadS', 'accelRadS2'] as const) {
    if (state[key].length !== n) throw new Error(`state.${key} needs ${n} values, one per body`);
  }
  const work = createChainWork(n);
  solveInto(chain, state.angleRad, state.rateRadS, state.accelRadS2, 0, work);

  const joints: JointLoad[] = [];
  const motions: BodyMotion[] = [];
  for (let i = 0; i < n; i++) {
    const fx = work.forceX[i];
    const fy = work.forceY[i];
    const c = work.cos[i];
    const s = work.sin[i];
    joints.push({
      name: chain.names[i],
      forceN: [fx, fy],
      forceMagnitudeN: Math.hypot(fx, fy),
      torqueNm: work.torque[i],
      forceBodyN: [fx * c + fy * s, -fx * s + fy * c],
    });
    motions.push({
      name: chain.names[i],
      cgAccelMS2: [work.cgAX[i], work.cgAY[i]],
      angularAccelRadS2: work.alpha[i],
      angleRad: work.theta[i],
      angularVelocityRadS: work.omega[i],
      pivotPositionM: [work.pivotX[i], work.pivotY[i]],
      cgPositionM: [work.pivotX[i] + work.cgRelX[i], work.pivotY[i] + work.cgRelY[i]],
    });
  }
  const points = options.points ?? [{ name: 'ground pivot', pointM: [0, 0] as const }];
  const moments = points.map((p, k) => momentCheck(chain, work, p, k));
  return { gravityMS2: chain.gravityMS2, joints, bodies: motions, moments };
}

function momentCheck(chain: Chain, work: ChainWork, point: MomentPoint, index: number): MomentCheck {
  const n = chain.size;
  let px = point.pointM[0];
  let py = point.pointM[1];
  if (point.body !== undefined) {
    const b = point.body;
    const c = work.cos[b];
    const s = work.sin[b];
    px = work.pivotX[b] + c * point.pointM[0] - s * point.pointM[1];
    py = work.pivotY[b] + s * point.pointM[0] + c * point.pointM[1];
  }
  const bodies: BodyMomentCheck[] = [];
  for (let i = 0; i < n; i++) {
    const m = chain.mass[i];
    const gX = work.pivotX[i] + work.cgRelX[i] - px;
    const gY = work.pivotY[i] + work.cgRelY[i] - py;
    const oX = work.pivotX[i] - px;
    const oY = work.pivotY[i] - py;
    // Parent's force and couple at joint i, weight at G ...
    let fromForces =
      work.torque[i] +
      (oX * work.forceY[i] - oY * work.forceX[i]) +
      m * (gX * chain.gravityY - gY * chain.gravityX);
    // ... and the child's reaction (equal and opposite) at the next pivot.
    if (i + 1 < n) {
      const tX = work.pivotX[i + 1] - px;
      const tY = work.pivotY[i + 1] - py;
      fromForces -= work.torque[i + 1] + (tX * work.forceY[i + 1] - tY * work.forceX[i + 1]);
    }
    const fromKinetics = chain.inertia[i] * work.alpha[i] + m * (gX * work.cgAY[i] - gY * work.cgAX[i]);
    bodies.push({
      name: chain.names[i],
      fromForcesNm: fromForces,
      fromKineticsNm: fromKinetics,
      differenceNm: fromForces - fromKinetics,
    });
  }
  return { name: point.name ?? `P${index + 1}`, pointM: [px, py], bodies };
}

export type ChainEnergy = { kineticJ: number; potentialJ: number; totalJ: number };

/** Kinetic and potential energy (datum at the ground pivot) of the chain in a given position and speed. */
export function chainEnergy(
  chain: Chain,
  angleRad: ArrayLike<number>,
  rateRadS: ArrayLike<number>,
): ChainEnergy {
  const n = chain.size;
  const zeros = new Float64Array(n);
  const work = createChainWork(n);
  solveInto(chain, angleRad, rateRadS, zeros, 0, work);
  let kinetic = 0;
  let potential = 0;
  for (let i = 0; i < n; i++) {
    const om = work.omega[i];
    // v_G = v_pivot + ω × r_G
    const vx = work.pivotVX[i] - om * work.cgRelY[i];
    const vy = work.pivotVY[i] + om * work.cgRelX[i];
    kinetic += 0.5 * chain.mass[i] * (vx * vx + vy * vy) + 0.5 * chain.inertia[i] * om * om;
    // −m·g⃗·r_G: with g⃗ = (0, −g) this is m·g·y_G.
    potential -=
      chain.mass[i] *
      (chain.gravityX * (work.pivotX[i] + work.cgRelX[i]) +
        chain.gravityY * (work.pivotY[i] + work.cgRelY[i]));
  }
  return { kineticJ: kinetic, potentialJ: potential, totalJ: kinetic + potential };
}

/**
 * Forward dynamics: the joint accelerations that given joint torques produce (0 on a free pin). Builds
 * the mass matrix column by column from the inverse dynamics (unit accelerations, no speed, no gravity)
 * and solves M·q̈ = τ − bias. Used for free-swing checks; not in the hot loop.
 */
export function jointAccelerations(
  chain: Chain,
  angleRad: ArrayLike<number>,
  rateRadS: ArrayLike<number>,
  torqueNm: ArrayLike<number>,
): Float64Array {
  const n = chain.size;
  const work = createChainWork(n);
  const zeros = new Float64Array(n);
  solveInto(chain, angleRad, rateRadS, zeros, 0, work);
  const rhs = new Float64Array(n);
  for (let i = 0; i < n; i++) rhs[i] = torqueNm[i] - work.torque[i];
  const noGravity: Chain = { ...chain, gravityMS2: 0, gravityX: 0, gravityY: 0 };
  const matrix: Float64Array[] = [];
  const unit = new Float64Array(n);
  for (let j = 0; j < n; j++) {
    unit.fill(0);
    unit[j] = 1;
    solveInto(noGravity, angleRad, zeros, unit, 0, work);
    matrix.push(Float64Array.from(work.torque));
  }
  // matrix[j][i] = M[i][j]; M is symmetric, so the transpose is the same matrix.
  return solveLinear(matrix, rhs);
}

/** Gaussian elimination with partial pivoting; small dense systems only. */
export function solveLinear(rows: Float64Array[], rhs: Float64Array): Float64Array {
  const n = rhs.length;
  const a = rows.map((r) => Float64Array.from(r));
  const b = Float64Array.from(rhs);
  for (let col = 0; col < n; col++) {
    let pivot = col;
    for (let r = col + 1; r < n; r++) if (Math.abs(a[r][col]) > Math.abs(a[pivot][col])) pivot = r;
    if (Math.abs(a[pivot][col]) < 1e-300) throw new Error('Singular system');
    [a[col], a[pivot]] = [a[pivot], a[col]];
    [b[col], b[pivot]] = [b[pivot], b[col]];
    for (let r = col + 1; r < n; r++) {
      const f = a[r][col] / a[col][col];
      if (f === 0) continue;
      for (let k = col; k < n; k++) a[r][k] -= f * a[col][k];
      b[r] -= f * b[col];
    }
  }
  const x = new Float64Array(n);
  for (let r = n - 1; r >= 0; r--) {
    let sum = b[r];
    for (let k = r + 1; k < n; k++) sum -= a[r][k] * x[k];
    x[r] = sum / a[r][r];
  }
  return x;
}
