import {
  FREE_MOTION_ATOL,
  FREE_MOTION_RTOL,
  type ChainBody,
  type MotionProfile,
  analyseCycle,
  chainEnergy,
  createChain,
  integrateFreeMotion,
} from '@/features/loads/engine';
import { buildPlanckChain } from '@/bench/planck-chain';
import { median, now, timeCalls } from '@/bench/timing';

/** Per-call times of `fn` in ms, this bench's run length and warm-up. */
const time = (fn: () => void) => timeCalls(fn, 2, 30);

/**
 * Free-joint speed on one core: a 10 s free swing of a 3-body chain (all three pins free, released from
 * rest), integrated by Dormand–Prince 5(4) at the engine's tolerances and analysed at 360 samples.
 * Also: the integration alone, the energy drift it leaves, and planck stepping the same chain for the
 * same 10 s (at the step the reference tests use, and at its everyday step) for a ratio in the same run.
 * Target (issue 13): under 10 ms.
 */

// Invented chain: a swing arm, a sub-arm on its tip, a gondola.
const BODIES: ChainBody[] = [
  { name: 'swing arm', massKg: 8000, cgM: [6, 0.1], inertiaCgKgM2: 96_000, tipM: [12, 0] },
  { name: 'sub-arm', massKg: 1500, cgM: [1.2, -0.2], inertiaCgKgM2: 1500, tipM: [2.5, 0.3] },
  { name: 'gondola', massKg: 4000, cgM: [0, -1.5], inertiaCgKgM2: 6000 },
];
const START = [-Math.PI / 2 + 1.6, 0.3, -0.2];
const PROFILES: MotionProfile[] = START.map((angleRad) => ({ kind: 'free', angleRad }));
const DURATION_S = 10;
const G = 9.80665;

const fmt = (v: number, digits = 2) => v.toLocaleString('en', { maximumFractionDigits: digits });

function planckMs(dt: number, velocityIterations: number, positionIterations: number): number {
  const runs: number[] = [];
  const steps = Math.round(DURATION_S / dt);
  for (let r = 0; r < 5; r++) {
    const pc = buildPlanckChain(BODIES, { gravityMS2: G, angleRad: START, rateRadS: [0, 0, 0], dt });
    const t0 = now();
    for (let k = 0; k < steps; k++) pc.world.step(dt, velocityIterations, positionIterations);
    if (r >= 1) runs.push(now() - t0);
  }
  return median(runs);
}

export function run(): void {
  const input = { bodies: BODIES, profiles: PROFILES, durationS: DURATION_S, gravityMS2: G };
  const chain = createChain(BODIES, G);
  const motion = integrateFreeMotion(chain, PROFILES, DURATION_S);
  const whole = median(time(() => analyseCycle(input)));
  const alone = median(time(() => integrateFreeMotion(chain, PROFILES, DURATION_S)));

  // Energy over the analysed cycle, relative to Σ m·g·(reach to the centre): the swing's energy scale.
  const result = analyseCycle(input);
  let scale = 0;
  let reach = 0;
  for (const b of BODIES) {
    scale += b.massKg * G * (reach + Math.hypot(...b.cgM));
    reach += b.tipM ? Math.hypot(...b.tipM) : 0;
  }
  const energyAt = (k: number) =>
    chainEnergy(
      chain,
      result.joints.map((j) => j.angleRad[k]),
      result.joints.map((j) => j.rateRadS[k]),
    ).totalJ;
  const e0 = energyAt(0);
  let drift = 0;
  for (let k = 0; k < result.samples; k++) drift = Math.max(drift, Math.abs(energyAt(k) - e0) / scale);

  console.log(
    `free swing, 3 free pins, ${DURATION_S} s ` +
      `(Dormand–Prince 5(4), rtol ${FREE_MOTION_RTOL}, atol ${FREE_MOTION_ATOL})`,
  );
  console.log(
    `  integration: ${motion.steps.toLocaleString('en')} steps (${motion.rejected} rejected), ` +
      `${motion.evaluations.toLocaleString('en')} evaluations, ${fmt(alone, 3)} ms`,
  );
  console.log(`  energy drift over the cycle: ${drift.toExponential(1)} of Σ m·g·reach`);
  console.log(
    `  10 s free swing, 3-body chain, analysed at 360 samples: ${fmt(whole, 3)} ms (target < 10 ms)`,
  );
  for (const [dt, vel, pos, label] of [
    [1 / 2000, 100, 20, 'dt 1/2000 s, iterations 100/20 (as the reference tests)'],
    [1 / 60, 8, 3, 'dt 1/60 s, default iterations 8/3'],
  ] as const) {
    const ms = planckMs(dt, vel, pos);
    console.log(`  planck ${label}: ${fmt(ms, 3)} ms; engine is ${fmt(ms / whole, 1)}× faster`);
  }
}
