import { median, percentile, timeCalls } from '@/bench/timing';
import { minerDamage, rainflow, rainflowArrays, rainflowRepeating } from '@/features/fatigue';

/**
 * Fatigue engine speed on one core (issue 14):
 *  - rainflow (ASTM E1049 §5.4.4) of 1,000,000 points: a noisy ride-like history and the worst case, where
 *    every point is a reversal; the cycle objects the API returns, and the typed-array form without them;
 *  - damage for every detail of a 3-body, 3,600-sample cycle: 3 joints × 3 details (pin in shear, lug net
 *    section, weld toe), each a stress history from its force component × MPa per kN, counted with
 *    rainflowRepeating and summed with minerDamage on its EN 1993-1-9 curve.
 * Targets: rainflow of 1,000,000 points < 100 ms; all details of the cycle < 2 ms.
 */

const POINTS = 1_000_000;
const SAMPLES = 3600;
const RAINFLOW_TARGET_MS = 100;
const DAMAGE_TARGET_MS = 2;

const fmt = (v: number, digits = 2) => v.toLocaleString('en', { maximumFractionDigits: digits });

/** A deterministic pseudo-random sequence (xorshift), so every run times the same data. */
function random(seed: number): () => number {
  let s = seed >>> 0 || 1;
  return () => {
    s ^= s << 13;
    s ^= s >>> 17;
    s ^= s << 5;
    return (s >>> 0) / 4294967296;
  };
}

function rideLike(n: number): Float64Array {
  const next = random(14);
  const out = new Float64Array(n);
  // Once-per-revolution reversal, a slower swing and some measurement noise (MPa).
  for (let i = 0; i < n; i++)
    out[i] = 80 * Math.sin(i * 0.0105) + 25 * Math.sin(i * 0.0021) + 6 * (next() - 0.5);
  return out;
}

function worstCase(n: number): Float64Array {
  const next = random(1049);
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) out[i] = (i % 2 === 0 ? 1 : -1) * (50 + 50 * next());
  return out;
}

type Detail = {
  joint: number;
  component: 0 | 1 | 2;
  stressPerKnMPa: number;
  categoryMPa: number;
  shear: boolean;
};

/** Invented details: per joint a pin in shear, a lug net section and a weld toe. */
const DETAILS: Detail[] = [0, 1, 2].flatMap((joint) => [
  { joint, component: 0 as const, stressPerKnMPa: 0.42, categoryMPa: 100, shear: true },
  { joint, component: 1 as const, stressPerKnMPa: 0.31, categoryMPa: 90, shear: false },
  { joint, component: 2 as const, stressPerKnMPa: 0.18, categoryMPa: 71, shear: false },
]);

/** A 3-joint cycle's force components (kN): along, across and a third, as the load engine gives them. */
function cycleForces(): Float64Array[][] {
  const next = random(3);
  return [0, 1, 2].map((joint) =>
    [0, 1, 2].map((component) => {
      const f = new Float64Array(SAMPLES);
      const amplitude = 300 / (joint + 1) + 40 * component;
      for (let k = 0; k < SAMPLES; k++) {
        const t = (k / SAMPLES) * 2 * Math.PI;
        f[k] = amplitude * Math.sin(12 * t + component) + 0.2 * amplitude * Math.sin(37 * t) + 2 * next();
      }
      return f;
    }),
  );
}

function damageOfCycle(forces: Float64Array[][], stress: Float64Array): number {
  let total = 0;
  for (const d of DETAILS) {
    const f = forces[d.joint][d.component];
    for (let k = 0; k < SAMPLES; k++) stress[k] = f[k] * d.stressPerKnMPa;
    const counted = rainflowRepeating(stress);
    const cycles = counted.map((c) => ({ rangeMPa: c.range, count: c.count }));
    total += minerDamage(cycles, {
      categoryMPa: d.categoryMPa,
      shear: d.shear,
      gammaFf: 1,
      gammaMf: 1.15,
    }).damage;
  }
  return total;
}

export function run(): void {
  console.log(
    `rainflow, ASTM E1049 §5.4.4, ${POINTS.toLocaleString('en')} points (target < ${RAINFLOW_TARGET_MS} ms)`,
  );
  for (const [label, series] of [
    ['ride-like history', rideLike(POINTS)],
    ['worst case, every point a reversal', worstCase(POINTS)],
  ] as const) {
    let cycles = 0;
    const objects = timeCalls(() => (cycles = rainflow(series).length), 2, 3);
    const arrays = timeCalls(() => rainflowArrays(series), 2, 3);
    const med = median(objects);
    console.log(
      `  ${label}: ${fmt(med, 1)} ms (p95 ${fmt(percentile(objects, 0.95), 1)} ms), ` +
        `${cycles.toLocaleString('en')} cycles, ${fmt(med / RAINFLOW_TARGET_MS)}× the target; ` +
        `typed arrays without cycle objects ${fmt(median(arrays), 1)} ms (${fmt(med / median(arrays), 1)}× faster)`,
    );
  }

  const forces = cycleForces();
  const stress = new Float64Array(SAMPLES);
  let damage = 0;
  const runs = timeCalls(() => (damage = damageOfCycle(forces, stress)), 1, 20);
  const med = median(runs);
  console.log(
    `damage of every detail, 3-body ${SAMPLES.toLocaleString('en')}-sample cycle, ${DETAILS.length} details ` +
      `(target < ${DAMAGE_TARGET_MS} ms)`,
  );
  console.log(
    `  ${fmt(med, 3)} ms per cycle (p95 ${fmt(percentile(runs, 0.95), 3)} ms), ${fmt(med / DAMAGE_TARGET_MS)}× the ` +
      `target; ${fmt((med / DETAILS.length) * 1000, 0)} µs per detail; D per cycle ${damage.toExponential(3)}`,
  );
}
