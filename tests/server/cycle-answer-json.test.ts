/**
 * The cycle worker's fast writer (`cycleAnswerBytes`, server/compute/cycle-series.ts) against the plain
 * path it replaces on the wire: `JSON.stringify(cycleAnswer(...).value)`, the answer the engine's own tests
 * check against textbook results. Byte for byte, for chains with seats, limits, a free joint, a measured
 * record, bounded and whole, and for the values JSON treats specially (ECMA-262 JSON.stringify: NaN and
 * ±Infinity as null, undefined keys left out, undefined array items as null). The compressed bodies the
 * worker sends are checked with zlib's own decoders (RFC 1952 gzip, RFC 7932 brotli).
 */
import zlib from 'node:zlib';

import { analyseCycle, type CycleInput, type CycleResult } from '@/features/loads/engine';
import { analyseCycleBody } from '@/features/loads/schema';
import { cycleAnswer, cycleAnswerBytes } from '@/server/compute/cycle-series';
import { threeBodyCycle } from '@/bench/three-body-chain';

// The invented chain of the benches (bench/three-body-chain.ts): main arm, sub-arm, gondola.
const threeBody = threeBodyCycle;

const withSeatsAndLimits = (samples: number): CycleInput => ({
  ...threeBody(samples),
  seats: [
    { name: 'row 1 — “front”', body: 2, positionM: [0, -2], spineAngleRad: 1.2 },
    { name: 'row 2', body: 2, positionM: [0.5, -2], spineAngleRad: 1.4, facing: 'ccw' },
  ],
  limits: {
    nearMargin: 0.2,
    joints: [{ maxForceN: 2e6, maxTorqueNm: 5e6 }, null, { maxRateRadS: 3 }],
    rider: { gz: { min: -1, max: 5 } },
  },
});

// A rod swinging freely from 60°: its period is found by integration.
const freeSwing: CycleInput = {
  bodies: [{ name: 'rod', massKg: 300, cgM: [3, 0], inertiaCgKgM2: 900 }],
  profiles: [{ kind: 'free', angleRad: -Math.PI / 6 }],
  samples: 2000,
};

// A measured turn, sampled at 50 Hz, a little uneven.
const measured: CycleInput = (() => {
  const timeS = Array.from({ length: 1500 }, (_, k) => k / 50);
  return {
    bodies: [{ name: 'arm', massKg: 2000, cgM: [4, 0], inertiaCgKgM2: 8000 }],
    profiles: [{ kind: 'measured', timeS, angleRad: timeS.map((t) => 1.2 * t + 0.05 * Math.sin(7 * t)) }],
  };
})();

const plainJson = (result: CycleResult, resolution: 'bounded' | 'full') => {
  const answer = cycleAnswer(result, resolution);
  if (!answer.ok) throw new Error('refused');
  return JSON.stringify(answer.value);
};
const fastJson = (result: CycleResult, resolution: 'bounded' | 'full') => {
  const answer = cycleAnswerBytes(result, resolution);
  if (!answer.ok) throw new Error('refused');
  return Buffer.from(answer.bytes).toString('utf8');
};

describe.each([
  ['three bodies, 3,600 samples', threeBody(3600)],
  ['three bodies, 360 samples (fits whole)', threeBody(360)],
  ['seats and limits, 5,000 samples', withSeatsAndLimits(5000)],
  ['a free joint', freeSwing],
  ['a measured record', measured],
])('%s', (_name, input) => {
  const result = analyseCycle(input);
  test.each(['bounded', 'full'] as const)('%s: the same JSON, byte for byte', (resolution) => {
    const plain = plainJson(result, resolution);
    expect(fastJson(result, resolution)).toBe(plain);
    // A second write into the reused buffer is not disturbed by the first.
    expect(fastJson(result, resolution)).toBe(plain);
  });
});

test('a request body analysed by the worker’s path gives the calculator’s numbers', () => {
  const analysed = analyseCycleBody(JSON.parse(JSON.stringify(withSeatsAndLimits(1000))));
  if (!analysed.ok) throw new Error('invalid');
  const answer = JSON.parse(fastJson(analysed.value, 'full'));
  const direct = analyseCycle(withSeatsAndLimits(1000));
  expect(answer.joints[0].forceMagnitudeN).toEqual(Array.from(direct.joints[0].forceMagnitudeN));
  expect(answer.seats[1].gz).toEqual(Array.from(direct.seats[1].gz));
  expect(answer.envelope).toEqual(JSON.parse(JSON.stringify(direct.envelope)));
});

test('non-finite numbers, undefined keys and array holes are written as JSON.stringify writes them', () => {
  const result = analyseCycle(threeBody(50));
  const holes: unknown[] = [];
  holes[2] = 'z';
  const odd = {
    ...result,
    timeS: Float64Array.from(result.timeS, (t, k) => (k === 3 ? NaN : k === 4 ? Infinity : t)),
    warnings: [...result.warnings, undefined, { text: 'x', note: undefined, at: [1, -0, NaN] }],
    extra: undefined,
    when: () => 0,
    nested: { list: [undefined, 'é', '\u2028', -Infinity], holes },
  } as unknown as CycleResult;
  expect(fastJson(odd, 'full')).toBe(plainJson(odd, 'full'));
});

test('the compressed bodies decode to the same JSON', () => {
  const result = analyseCycle(threeBody(3600));
  const answer = cycleAnswerBytes(result, 'bounded');
  if (!answer.ok) throw new Error('refused');
  const json = Buffer.from(answer.bytes);
  const gzip = zlib.gzipSync(answer.bytes, { level: 1, strategy: zlib.constants.Z_HUFFMAN_ONLY });
  expect(zlib.gunzipSync(gzip).equals(json)).toBe(true);
  expect(gzip.length).toBeLessThan(json.length / 1.8);
  const br = zlib.brotliCompressSync(answer.bytes, {
    params: { [zlib.constants.BROTLI_PARAM_QUALITY]: 1 },
  });
  expect(zlib.brotliDecompressSync(br).equals(json)).toBe(true);
});
