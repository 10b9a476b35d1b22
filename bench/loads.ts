import {
  analyseCycle,
  createChain,
  createChainWork,
  sampleProfile,
  solveInto,
} from '@/features/loads/engine';
import { buildPlanckChain } from '@/bench/planck-chain';
import { THREE_BODIES, THREE_PROFILES } from '@/bench/three-body-chain';
import { median, now, percentile, timeCalls } from '@/bench/timing';

/** Per-call times of `fn` in ms, this bench's run length and warm-up. */
const time = (fn: () => void) => timeCalls(fn, 1, 20);

/**
 * Load-engine speed on one core (JavaScript runs the solve on one thread):
 *  - raw solve: body-samples per second through solveInto over a prepared cycle;
 *  - whole cycle: analyseCycle end to end (profiles, solve, histories, peaks, seats, envelope);
 *  - planck stepping the same chain for the same number of steps, for a ratio measured in the same run.
 * Targets (issue 3): ≥ 2 million body-samples/s; a 3,600-sample 3-body cycle in under 5 ms.
 */

// The invented chain shared with the cycle benches and tests (bench/three-body-chain.ts).
const BODIES = THREE_BODIES;
const PROFILES = THREE_PROFILES;
const SAMPLES = 3600;

const fmt = (v: number, digits = 2) => v.toLocaleString('en', { maximumFractionDigits: digits });

function rawSolve(count: number): number {
  const bodies = BODIES.slice(0, count);
  const chain = createChain(bodies);
  const times = Float64Array.from({ length: SAMPLES }, (_, k) => (k * 60) / (SAMPLES - 1));
  const q = new Float64Array(SAMPLES * count);
  const qd = new Float64Array(SAMPLES * count);
  const qdd = new Float64Array(SAMPLES * count);
  PROFILES.slice(0, count).forEach((p, i) => sampleProfile(p, times, i, count, q, qd, qdd));
  const work = createChainWork(count);
  let sink = 0;
  const pass = () => {
    for (let k = 0; k < SAMPLES; k++) {
      solveInto(chain, q, qd, qdd, k * count, work);
      sink += work.forceX[0];
    }
  };
  const runs = time(pass);
  if (Number.isNaN(sink)) console.log('(unreachable)');
  return (SAMPLES * count) / (median(runs) / 1000);
}

function wholeCycle(count: number): { perSecond: number; medianMs: number; p95Ms: number } {
  const input = {
    bodies: BODIES.slice(0, count),
    profiles: PROFILES.slice(0, count),
    samples: SAMPLES,
    seats: [{ name: 'seat', body: count - 1, positionM: [0, -1.2] as const, spineAngleRad: Math.PI / 2 }],
    limits: { joints: [{ maxForceN: 1e6, maxTorqueNm: 1e6 }], rider: { gz: { min: -1.5, max: 6 } } },
  };
  const runs = time(() => analyseCycle(input));
  const med = median(runs);
  return { perSecond: (SAMPLES * count) / (med / 1000), medianMs: med, p95Ms: percentile(runs, 0.95) };
}

function planckSteps(count: number, velocityIterations: number, positionIterations: number): number {
  const runs: number[] = [];
  for (let r = 0; r < 12; r++) {
    const pc = buildPlanckChain(BODIES.slice(0, count), {
      gravityMS2: 9.80665,
      angleRad: [0.3, -0.9, 0.4].slice(0, count),
      rateRadS: [1.2, 0.2, -0.1].slice(0, count),
      dt: 60 / SAMPLES,
      motorRateRadS: [1.2],
    });
    const t0 = now();
    for (let k = 0; k < SAMPLES; k++) pc.world.step(60 / SAMPLES, velocityIterations, positionIterations);
    if (r >= 2) runs.push(now() - t0); // the first runs warm the JIT
  }
  return median(runs);
}

export function run(): void {
  console.log(`raw solve (solveInto over ${SAMPLES.toLocaleString('en')} prepared samples)`);
  for (const n of [1, 2, 3])
    console.log(`  ${n}-body chain: ${fmt(rawSolve(n) / 1e6)} million body-samples/s`);

  console.log(`whole cycle (analyseCycle, ${SAMPLES.toLocaleString('en')} samples, 1 seat, limits)`);
  const cycles = [1, 2, 3].map((n) => ({ n, ...wholeCycle(n) }));
  for (const c of cycles)
    console.log(
      `  ${c.n}-body chain: ${fmt(c.perSecond / 1e6)} million body-samples/s, ` +
        `${fmt(c.medianMs, 3)} ms per cycle (p95 ${fmt(c.p95Ms, 3)} ms)`,
    );
  const three = cycles[2];
  console.log(`  3,600-sample 3-body cycle: ${fmt(three.medianMs, 3)} ms (target < 5 ms)`);

  console.log(`planck (Box2D port) stepping the same 3-body chain ${SAMPLES.toLocaleString('en')} steps`);
  for (const [vel, pos, label] of [
    [8, 3, 'default iterations 8/3'],
    [100, 20, 'test-grade iterations 100/20'],
  ] as const) {
    const ms = planckSteps(3, vel, pos);
    console.log(`  ${label}: ${fmt(ms, 3)} ms; engine cycle is ${fmt(ms / three.medianMs, 1)}× faster`);
  }
}
