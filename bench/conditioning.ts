import { type ChainBody, type MotionProfile, analyseCycle, conditionMeasured } from '@/features/loads/engine';
import { median, timeCalls } from '@/bench/timing';

/** Median ms per call of `fn`, this bench's run length and warm-up. */
const time = (fn: () => void) => median(timeCalls(fn, 1.5, 30));

/**
 * Measured-motion speed on one core: a 60 s ride cycle recorded at 100 Hz (6,001 samples per joint) on a
 * 3-body chain, every joint measured (a gyro rate record of the main arm's spin-up, noisy encoder angles
 * of the sub-arm and the gondola, wrapped to one turn). Timed: the conditioning of the three records
 * alone, and the whole cycle (conditioning, solve at the default density of 6,001 samples, histories,
 * warnings); the same cycle from the ideal profiles gives the ratio. Target (issue 13): whole cycle
 * under 20 ms.
 */

// Invented chain: main arm, sub-arm, gondola (as in bench/loads.ts).
const BODIES: ChainBody[] = [
  { name: 'main arm', massKg: 8000, cgM: [3, 0.1], inertiaCgKgM2: 120_000, tipM: [12, 0] },
  { name: 'sub-arm', massKg: 1500, cgM: [1.2, -0.2], inertiaCgKgM2: 1500, tipM: [2.5, 0.3] },
  { name: 'gondola', massKg: 4000, cgM: [0, -1.5], inertiaCgKgM2: 6000 },
];
const IDEAL: MotionProfile[] = [
  { kind: 'ramp', toRpm: 12, rampTimeS: 8, holdAfterS: 52 },
  { kind: 'swing', amplitudeRad: 0.6, periodS: 4.1 },
  { kind: 'swing', amplitudeRad: 0.3, periodS: 2.3, phaseRad: 1 },
];
const RATE_HZ = 100;
const SPAN_S = 60;

/** Seeded normal draws (mulberry32 + Box–Muller), so every run times the same records. */
function normals(seed: number) {
  let s = seed >>> 0;
  const uniform = () => {
    s = (s + 0x6d2b79f5) >>> 0;
    let t = s;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  return () => Math.sqrt(-2 * Math.log(1 - uniform())) * Math.cos(2 * Math.PI * uniform());
}

function records(): MotionProfile[] {
  const n = SPAN_S * RATE_HZ + 1;
  const timeS = Array.from({ length: n }, (_, k) => k / RATE_HZ);
  const q = new Float64Array(n * 3);
  const qd = new Float64Array(n * 3);
  const qdd = new Float64Array(n * 3);
  // The ideal motion, sampled by the engine's own profiles, then made sensor-like.
  const cycle = analyseCycle({ bodies: BODIES, profiles: IDEAL, durationS: SPAN_S, samples: n });
  cycle.joints.forEach((j, i) => {
    for (let k = 0; k < n; k++) {
      q[k * 3 + i] = j.angleRad[k];
      qd[k * 3 + i] = j.rateRadS[k];
      qdd[k * 3 + i] = j.accelRadS2[k];
    }
  });
  const noise = normals(13);
  const wrap = (a: number) => a - 2 * Math.PI * Math.floor(a / (2 * Math.PI));
  return [
    { kind: 'measured', timeS, rateRadS: timeS.map((_, k) => qd[k * 3] + 0.004 + 0.015 * noise()) },
    { kind: 'measured', timeS, angleRad: timeS.map((_, k) => wrap(q[k * 3 + 1] + 0.002 * noise())) },
    { kind: 'measured', timeS, angleRad: timeS.map((_, k) => wrap(q[k * 3 + 2] + 0.002 * noise())) },
  ];
}

const fmt = (v: number, digits = 2) => v.toLocaleString('en', { maximumFractionDigits: digits });

export function run(): void {
  const measured = records();
  // Conditioning is cached per profile object: copies make every call condition afresh.
  const fresh = () => measured.map((p) => ({ ...p }));
  const conditionMs = time(() => fresh().forEach((p) => p.kind === 'measured' && conditionMeasured(p)));
  let samples = 0;
  const wholeMs = time(() => {
    samples = analyseCycle({ bodies: BODIES, profiles: fresh() }).samples;
  });
  const idealMs = time(() => analyseCycle({ bodies: BODIES, profiles: IDEAL, samples }));
  const check = analyseCycle({ bodies: BODIES, profiles: fresh() });
  console.log(
    `60 s record at ${RATE_HZ} Hz, 3 measured joints (${samples.toLocaleString('en')} cycle samples by default)`,
  );
  console.log(`  conditioning of the 3 records: ${fmt(conditionMs, 3)} ms`);
  console.log(`  whole cycle from the records: ${fmt(wholeMs, 3)} ms (target < 20 ms)`);
  console.log(
    `  the same cycle from ideal profiles: ${fmt(idealMs, 3)} ms; measured motion costs ${fmt(wholeMs / idealMs, 1)}× that`,
  );
  console.log(
    `  cut-offs chosen: ${check.warnings.filter((w) => w.code === 'smoothing').length} records filtered`,
  );
}
