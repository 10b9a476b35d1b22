import { Body, RevoluteJoint, Vec2, World } from 'planck';

import { type ChainBody, createChain, createChainWork, solveInto } from '@/features/loads/engine';

/**
 * The same serial chain built in planck (a port of the Box2D rigid-body engine), used as an
 * independent reference. Each planck body's origin sits on its inboard pivot and turns with the body's
 * absolute angle, so local centres and tips are the ones the engine uses.
 */
export type PlanckChain = {
  world: World;
  bodies: Body[];
  joints: RevoluteJoint[];
  /** One step; returns what the step produced, in the engine's terms. */
  step: () => PlanckSample;
};

export type PlanckSample = {
  /** State at the start of the step: relative joint angles and rates. */
  angleRad: number[];
  rateRadS: number[];
  /** Mean joint acceleration over the step, (ω_after − ω_before)/dt, relative. */
  accelRadS2: number[];
  /** Joint rates averaged over the step. */
  midRateRadS: number[];
  /** Reaction on body i (planck's body B) from its parent (body A), global frame. */
  forceN: [number, number][];
  /** Motor plus limit torque on body i; 0 on a free pin. */
  torqueNm: number[];
};

export type PlanckChainOptions = {
  gravityMS2: number;
  angleRad: number[];
  rateRadS: number[];
  dt: number;
  velocityIterations?: number;
  positionIterations?: number;
  /** Joints driven at a constant relative speed (rad/s) by a motor strong enough never to slip. */
  motorRateRadS?: (number | null)[];
};

export function buildPlanckChain(bodies: readonly ChainBody[], options: PlanckChainOptions): PlanckChain {
  const n = bodies.length;
  const chain = createChain(bodies, options.gravityMS2);
  const work = createChainWork(n);
  solveInto(chain, options.angleRad, options.rateRadS, new Float64Array(n), 0, work);

  const world = new World({ gravity: { x: 0, y: -options.gravityMS2 }, allowSleep: false });
  const ground = world.createBody();
  const planckBodies: Body[] = [];
  const joints: RevoluteJoint[] = [];
  for (let i = 0; i < n; i++) {
    const b = bodies[i];
    const body = world.createBody({
      type: 'dynamic',
      position: { x: work.pivotX[i], y: work.pivotY[i] },
      angle: work.theta[i],
      linearDamping: 0,
      angularDamping: 0,
      allowSleep: false,
      bullet: false,
    });
    const r2 = b.cgM[0] ** 2 + b.cgM[1] ** 2;
    // planck takes the inertia about the body origin (its pivot), not about the centre.
    body.setMassData({
      mass: b.massKg,
      center: Vec2(b.cgM[0], b.cgM[1]),
      I: b.inertiaCgKgM2 + b.massKg * r2,
    });
    // planck's linear velocity is that of the centre of mass: v_G = v_pivot + ω × r_G.
    const om = work.omega[i];
    body.setLinearVelocity(
      Vec2(work.pivotVX[i] - om * work.cgRelY[i], work.pivotVY[i] + om * work.cgRelX[i]),
    );
    body.setAngularVelocity(om);
    const parent = i === 0 ? ground : planckBodies[i - 1];
    const motor = options.motorRateRadS?.[i];
    const joint = world.createJoint(
      new RevoluteJoint(
        motor === undefined || motor === null
          ? {}
          : { enableMotor: true, motorSpeed: motor, maxMotorTorque: 1e12 },
        parent,
        body,
        Vec2(work.pivotX[i], work.pivotY[i]),
      ),
    );
    if (!joint) throw new Error('planck refused the joint');
    planckBodies.push(body);
    joints.push(joint);
  }

  const { dt } = options;
  const vIt = options.velocityIterations ?? 100;
  const pIt = options.positionIterations ?? 20;
  const relative = (abs: number[]) => abs.map((v, i) => (i === 0 ? v : v - abs[i - 1]));

  const step = (): PlanckSample => {
    const angle = relative(planckBodies.map((b) => b.getAngle()));
    const before = relative(planckBodies.map((b) => b.getAngularVelocity()));
    world.step(dt, vIt, pIt);
    const after = relative(planckBodies.map((b) => b.getAngularVelocity()));
    return {
      angleRad: angle,
      rateRadS: before,
      accelRadS2: after.map((w, i) => (w - before[i]) / dt),
      midRateRadS: after.map((w, i) => (w + before[i]) / 2),
      forceN: joints.map((j) => {
        const f = j.getReactionForce(1 / dt);
        return [f.x, f.y] as [number, number];
      }),
      // getReactionTorque reports only the limit torque; the motor's is reported separately.
      torqueNm: joints.map((j) => j.getReactionTorque(1 / dt) + j.getMotorTorque(1 / dt)),
    };
  };
  return { world, bodies: planckBodies, joints, step };
}
