/**
 * A serial planar chain of rigid bodies hanging from a fixed ground pivot at the origin.
 *
 * Frames and signs (see features/loads/README.md): global x right, y up, angles and moments
 * counter-clockwise positive, gravity a magnitude acting along −y. Body i's frame has its origin at its
 * inboard pivot (joint i); its x-axis is turned by the body's absolute angle θ_i = q_0 + … + q_i, where q
 * are the joint angles relative to the parent (the ground's x-axis is global +x).
 */

export const STANDARD_GRAVITY_MS2 = 9.80665;

export type Vec2 = readonly [number, number];

export type ChainBody = {
  name: string;
  massKg: number;
  /** Centre of gravity in the body's own frame (origin at its inboard pivot). */
  cgM: Vec2;
  /** Moment of inertia about the centre of gravity, axis normal to the plane. */
  inertiaCgKgM2: number;
  /** The next body's pivot in this body's frame; required when a body follows, ignored on the last. */
  tipM?: Vec2;
};

export type JointState = {
  angleRad: ArrayLike<number>;
  rateRadS: ArrayLike<number>;
  accelRadS2: ArrayLike<number>;
};

/** Bodies packed into typed arrays so the hot loop reads contiguous numbers, not objects. */
export type Chain = {
  readonly size: number;
  readonly names: readonly string[];
  /** Magnitude of gravity, and its vector (normally (0, −g); tilted planes and checks may turn it). */
  readonly gravityMS2: number;
  readonly gravityX: number;
  readonly gravityY: number;
  readonly mass: Float64Array;
  readonly inertia: Float64Array;
  readonly cgX: Float64Array;
  readonly cgY: Float64Array;
  readonly tipX: Float64Array;
  readonly tipY: Float64Array;
};

/**
 * Everything one solve produces, one entry per body/joint. Reused between solves so a whole cycle
 * allocates nothing per sample.
 */
export type ChainWork = {
  /** Absolute angle, angular velocity and angular acceleration of each body. */
  theta: Float64Array;
  omega: Float64Array;
  alpha: Float64Array;
  cos: Float64Array;
  sin: Float64Array;
  /** Joint i's pivot: position, velocity and acceleration (global). */
  pivotX: Float64Array;
  pivotY: Float64Array;
  pivotVX: Float64Array;
  pivotVY: Float64Array;
  pivotAX: Float64Array;
  pivotAY: Float64Array;
  /** Centre of gravity relative to the body's pivot, in global axes. */
  cgRelX: Float64Array;
  cgRelY: Float64Array;
  /** Centre-of-gravity acceleration, kinematic (gravity not included). */
  cgAX: Float64Array;
  cgAY: Float64Array;
  /** Force and torque on body i by its parent at joint i, global frame; torque about joint i. */
  forceX: Float64Array;
  forceY: Float64Array;
  torque: Float64Array;
};

/**
 * Packs bodies for solving. `gravity` is a magnitude acting along −y (the API's convention) or, for a
 * ride whose plane of motion is tilted or for rotated checks, the in-plane gravity vector itself.
 */
export function createChain(
  bodies: readonly ChainBody[],
  gravity: number | Vec2 = STANDARD_GRAVITY_MS2,
): Chain {
  const n = bodies.length;
  if (n === 0) throw new Error('A chain needs at least one body');
  const [gravityX, gravityY] = typeof gravity === 'number' ? [0, -gravity] : gravity;
  const chain: Chain = {
    size: n,
    names: bodies.map((b) => b.name),
    gravityMS2: Math.hypot(gravityX, gravityY),
    gravityX,
    gravityY,
    mass: new Float64Array(n),
    inertia: new Float64Array(n),
    cgX: new Float64Array(n),
    cgY: new Float64Array(n),
    tipX: new Float64Array(n),
    tipY: new Float64Array(n),
  };
  bodies.forEach((b, i) => {
    if (i < n - 1 && !b.tipM) throw new Error(`Body ${i} (${b.name}) needs tipM: another body follows it`);
    chain.mass[i] = b.massKg;
    chain.inertia[i] = b.inertiaCgKgM2;
    chain.cgX[i] = b.cgM[0];
    chain.cgY[i] = b.cgM[1];
    // The last body's tip carries no load, so a missing one is simply zero.
    chain.tipX[i] = b.tipM ? b.tipM[0] : 0;
    chain.tipY[i] = b.tipM ? b.tipM[1] : 0;
  });
  return chain;
}

export function createChainWork(size: number): ChainWork {
  const f = () => new Float64Array(size);
  return {
    theta: f(),
    omega: f(),
    alpha: f(),
    cos: f(),
    sin: f(),
    pivotX: f(),
    pivotY: f(),
    pivotVX: f(),
    pivotVY: f(),
    pivotAX: f(),
    pivotAY: f(),
    cgRelX: f(),
    cgRelY: f(),
    cgAX: f(),
    cgAY: f(),
    forceX: f(),
    forceY: f(),
    torque: f(),
  };
}

/**
 * Newton–Euler inverse dynamics for one instant: kinematics outward from the ground, then joint forces
 * and torques inward from the last body. Reads joint i's state at `q[offset + i]` (likewise `qd`, `qdd`)
 * so a whole cycle can live in one flat array; writes into `work`.
 *
 * Per body (m, I_G, r_G from pivot, r_T pivot→tip, F_c/τ_c the next joint's force/torque on the child):
 *   F_i = m (a_G − g) + F_c
 *   τ_i = I_G α + r_G × m (a_G − g) + τ_c + r_T × F_c          (moments about joint i)
 */
export function solveInto(
  chain: Chain,
  q: ArrayLike<number>,
  qd: ArrayLike<number>,
  qdd: ArrayLike<number>,
  offset: number,
  work: ChainWork,
): void {
  const n = chain.size;
  const { mass, inertia, cgX, cgY, tipX, tipY } = chain;
  const gX = chain.gravityX;
  const gY = chain.gravityY;
  let th = 0;
  let om = 0;
  let al = 0;
  let px = 0;
  let py = 0;
  let vx = 0;
  let vy = 0;
  let ax = 0;
  let ay = 0;
  for (let i = 0; i < n; i++) {
    th += q[offset + i];
    om += qd[offset + i];
    al += qdd[offset + i];
    const c = Math.cos(th);
    const s = Math.sin(th);
    const om2 = om * om;
    work.theta[i] = th;
    work.omega[i] = om;
    work.alpha[i] = al;
    work.cos[i] = c;
    work.sin[i] = s;
    work.pivotX[i] = px;
    work.pivotY[i] = py;
    work.pivotVX[i] = vx;
    work.pivotVY[i] = vy;
    work.pivotAX[i] = ax;
    work.pivotAY[i] = ay;
    const gx = c * cgX[i] - s * cgY[i];
    const gy = s * cgX[i] + c * cgY[i];
    work.cgRelX[i] = gx;
    work.cgRelY[i] = gy;
    // a_G = a_pivot + α × r_G − ω² r_G (planar: α × r = α·(−r_y, r_x))
    work.cgAX[i] = ax - al * gy - om2 * gx;
    work.cgAY[i] = ay + al * gx - om2 * gy;
    const tx = c * tipX[i] - s * tipY[i];
    const ty = s * tipX[i] + c * tipY[i];
    px += tx;
    py += ty;
    vx -= om * ty;
    vy += om * tx;
    ax += -al * ty - om2 * tx;
    ay += al * tx - om2 * ty;
  }
  let fcx = 0;
  let fcy = 0;
  let tc = 0;
  for (let i = n - 1; i >= 0; i--) {
    const m = mass[i];
    // m (a_G − g)
    const mx = m * (work.cgAX[i] - gX);
    const my = m * (work.cgAY[i] - gY);
    const gx = work.cgRelX[i];
    const gy = work.cgRelY[i];
    const c = work.cos[i];
    const s = work.sin[i];
    const tx = c * tipX[i] - s * tipY[i];
    const ty = s * tipX[i] + c * tipY[i];
    const fx = mx + fcx;
    const fy = my + fcy;
    const t = inertia[i] * work.alpha[i] + (gx * my - gy * mx) + tc + (tx * fcy - ty * fcx);
    work.forceX[i] = fx;
    work.forceY[i] = fy;
    work.torque[i] = t;
    fcx = fx;
    fcy = fy;
    tc = t;
  }
}
