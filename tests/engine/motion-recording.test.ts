/**
 * Recording a ride cycle with the phone: the pure steps from sensor readings to the record the load
 * check runs. Outside references: the W3C DeviceOrientation and Motion definitions as MDN states them
 * (rotationRate in deg/s, alpha about z, beta about x, gamma about y; accelerationIncludingGravity of a
 * phone lying face up is z = +9.8 m/s²), the degree (π/180 rad), standard gravity 9.80665 m/s² (CGPM
 * 1901), the mean of a cosine over whole periods (0), and the pin force of a hanging rod swinging
 * harmonically (tests/support/motion-fixtures.ts).
 */
import { analyseInspection } from '@/features/records/analysis';
import { countCycles, motionRecordSchema } from '@/features/records/motion-record-schema';
import { measuredRiderOf, motionProfileOf } from '@/features/records/motion-record';
import {
  chooseAxis,
  defaultSign,
  emptyTrace,
  appendSample,
  attributeJoint,
  fromNativeSensors,
  fromWebMotion,
  parentRateOf,
  trimToCycles,
} from '@/features/motion-recording';
import { SWING, hangingRodDesign, swingTrace } from '@/tests/support/motion-fixtures';

const ID = '9b2f6c1e-4d7a-4c39-9a51-6f0e2d8b3c11';
const AT = '2026-06-01T10:00:00.000Z';
const g = 9.80665;

describe('sensor units and signs', () => {
  test('a browser event: deg/s to rad/s on the right axes, m/s² to g with face up reading +1', () => {
    const s = fromWebMotion(
      {
        timeStamp: 1500,
        rotationRate: { alpha: 90, beta: 180, gamma: -45 },
        accelerationIncludingGravity: { x: 0, y: 0, z: 9.80665 },
      },
      1000,
    );
    expect(s).not.toBeNull();
    expect(s!.tS).toBeCloseTo(0.5, 12);
    // beta about x, gamma about y, alpha about z.
    expect(s!.rate[0]).toBeCloseTo(Math.PI, 12);
    expect(s!.rate[1]).toBeCloseTo(-Math.PI / 4, 12);
    expect(s!.rate[2]).toBeCloseTo(Math.PI / 2, 12);
    expect(s!.force).toEqual([0, 0, 1]);
  });

  test('a browser without a gyroscope gives no sample', () => {
    expect(
      fromWebMotion(
        { timeStamp: 0, rotationRate: null, accelerationIncludingGravity: { x: 0, y: 0, z: 9.8 } },
        0,
      ),
    ).toBeNull();
  });

  test('native readings: iOS accelerometer (face up z = −1 g) is turned to specific force', () => {
    const ios = fromNativeSensors({ x: 0.1, y: 0, z: 0 }, { x: 0, y: 0, z: -1 }, 2, -1);
    const android = fromNativeSensors({ x: 0.1, y: 0, z: 0 }, { x: 0, y: 0, z: 1 }, 2, 1);
    expect(ios.force).toEqual([-0, -0, 1]);
    expect(android.force).toEqual([0, 0, 1]);
    expect(ios.rate).toEqual([0.1, 0, 0]);
  });

  test('repeated or unreadable timestamps are left out, so times always increase', () => {
    const t = emptyTrace();
    expect(appendSample(t, { tS: 0, rate: [0, 0, 1], force: null })).toBe(true);
    expect(appendSample(t, { tS: 0, rate: [0, 0, 1], force: null })).toBe(false);
    expect(appendSample(t, { tS: 0.01, rate: [0, NaN, 1], force: null })).toBe(false);
    expect(appendSample(t, { tS: 0.01, rate: [0, 0, 1], force: null })).toBe(true);
    expect(t.timeS).toEqual([0, 0.01]);
  });

  test('in a seat the sign follows the way the rider is drawn facing', () => {
    const d = hangingRodDesign();
    expect(defaultSign(d, null)).toBe(1);
    expect(defaultSign(d, 0)).toBe(-1);
    expect(defaultSign({ ...d, seats: [{ ...d.seats[0], facing: 'ccw' }] }, 0)).toBe(-1 * -1);
  });
});

describe('axis, cycles and bias', () => {
  const w = (2 * Math.PI) / SWING.periodS;

  test('the axis with the largest swing is chosen', () => {
    const trace = swingTrace({ rateHz: 100, durationS: 10 });
    expect(chooseAxis(trace)).toBe('z');
    const turned = { ...trace, rate: { x: trace.rate.z, y: trace.rate.y, z: trace.rate.x } };
    expect(chooseAxis(turned)).toBe('x');
  });

  test.each([
    [0.3, 100],
    [2.1, 50],
    [4.0, 25],
  ])('trimmed to whole cycles with the bias removed (phase %p rad, %p Hz)', (phaseRad, rateHz) => {
    const bias = 0.03;
    const trace = swingTrace({ rateHz, durationS: 13.3, phaseRad, biasRadS: bias, noiseRadS: 0.004 });
    const out = trimToCycles(trace, { joint: 0, seat: 0, axis: 'z', sign: -1, parentRateRadS: 0 }, AT, ID);
    if (!out.ok) throw new Error(out.message);
    const r = out.record;
    // The rate A·ω·cos(ωt + φ) rises through zero where ωt + φ = 3π/2 + 2πk: count those in the record.
    const rising = Array.from(
      { length: 10 },
      (_, k) => (1.5 * Math.PI + 2 * Math.PI * k - phaseRad) / w,
    ).filter((t) => t >= 0 && t <= 13.3);
    expect(r.cycles).toBe(rising.length - 1);
    expect(Math.abs(r.timeS[r.timeS.length - 1] - r.cycles * SWING.periodS)).toBeLessThanOrEqual(
      1.5 / rateHz,
    );
    expect(Math.abs(r.trimmedFrom.startS - rising[0])).toBeLessThanOrEqual(1.5 / rateHz);
    // The mean of A·ω·cos over whole periods is 0, so the mean found is the bias (the seat's sign −1 turns
    // the phone's −(rate + bias) back round).
    expect(r.biasRadS).toBeCloseTo(bias, 2);
    // The kept record starts at a rising crossing of the design rate: A·ω·cos(arg) = 0 going up.
    expect(Math.abs(r.rateRadS[0])).toBeLessThan(
      (SWING.amplitudeRad * w * (2 * Math.PI)) / (SWING.periodS * rateHz) + 0.02,
    );
    expect(countCycles(r.timeS, r.rateRadS)).toBe(r.cycles);
    expect(r.gxG).toHaveLength(r.timeS.length);
    expect(motionRecordSchema.safeParse(r).success).toBe(true);
  });

  test('the inspector may keep fewer cycles', () => {
    const trace = swingTrace({ rateHz: 100, durationS: 13.3 });
    const out = trimToCycles(
      trace,
      { joint: 0, seat: null, axis: 'z', sign: 1, parentRateRadS: 0, keep: { first: 1, last: 1 } },
      AT,
      ID,
    );
    if (!out.ok) throw new Error(out.message);
    expect(out.cyclesFound).toBe(3);
    expect(out.record.cycles).toBe(1);
    expect(out.record.gxG).toBeUndefined();
  });

  test('a steady turn: cycles are whole turns, the parent’s rate is taken off', () => {
    // A body turning at 10 rpm over the ground on a parent turning at 4 rpm turns at 6 rpm on its pin.
    const trace = emptyTrace();
    const abs = (10 * 2 * Math.PI) / 60;
    for (let k = 0; k <= 2100; k++) appendSample(trace, { tS: k / 100, rate: [0, 0, abs], force: null });
    const parent = (4 * 2 * Math.PI) / 60;
    const out = trimToCycles(
      trace,
      { joint: 1, seat: null, axis: 'z', sign: 1, parentRateRadS: parent },
      AT,
      ID,
    );
    if (!out.ok) throw new Error(out.message);
    expect(out.turning).toBe(true);
    // One turn at 6 rpm takes 10 s: 21 s hold two.
    expect(out.record.cycles).toBe(2);
    expect(out.record.timeS.at(-1)).toBeCloseTo(20, 1);
    expect(out.record.rateRadS[5]).toBeCloseTo(abs - parent, 6);
    expect(out.record.biasRadS).toBe(0);
  });

  test('the parent’s rate: steady parents add up, a swinging parent cannot be taken off', () => {
    const d = hangingRodDesign();
    const two = {
      ...d,
      bodies: [{ name: 'Base', tipM: [0, 0] as [number, number] }, { name: 'Arm' }],
      motion: [
        { joint: 0, kind: 'constant' as const, rpm: 6 },
        { joint: 1, kind: 'swing' as const, amplitudeRad: 0.5, periodS: 4 },
      ],
    };
    expect(parentRateOf(two, 1)).toBeCloseTo((6 * 2 * Math.PI) / 60, 12);
    expect(parentRateOf(two, 0)).toBe(0);
    const swinging = {
      ...two,
      motion: [two.motion[1], { ...two.motion[1], joint: 1 }].map((m, i) => ({ ...m, joint: i })),
    };
    expect(parentRateOf(swinging, 1)).toBeNull();
  });

  test('less than one cycle is refused with a plain message', () => {
    const trace = swingTrace({ rateHz: 100, durationS: 3 });
    const out = trimToCycles(trace, { joint: 0, seat: 0, axis: 'z', sign: -1, parentRateRadS: 0 }, AT, ID);
    expect(out.ok).toBe(false);
    if (!out.ok) expect(out.message).toMatch(/less than one whole cycle/i);
  });
});

describe('the record in the load check', () => {
  const d = hangingRodDesign();
  const { massKg: m, lengthM: L, amplitudeRad: A, periodS, seatM } = SWING;
  const w = (2 * Math.PI) / periodS;
  const record = () => {
    const trace = swingTrace({
      rateHz: 100,
      durationS: 13.3,
      phaseRad: 1.1,
      biasRadS: 0.02,
      noiseRadS: 0.003,
    });
    const out = trimToCycles(trace, { joint: 0, seat: 0, axis: 'z', sign: -1, parentRateRadS: 0 }, AT, ID);
    if (!out.ok) throw new Error(out.message);
    return out.record;
  };

  test('the profile is the joint’s rate, its angle centred on the design’s centre', () => {
    const p = motionProfileOf([record()], 0);
    expect(p?.kind).toBe('measured');
    if (p?.kind !== 'measured') return;
    expect(p.timeS[0]).toBe(0);
    // θ = A·sin(ωt + φ) starting at a rising crossing of the rate (θ at its minimum −A): the centring puts
    // the start at −A.
    expect(p.startAngleRad).toBeCloseTo(-A, 2);
  });

  test('peak pivot force from the recorded swing matches m·g + m·(L/2)·(A·ω)²', () => {
    const result = analyseInspection(d, [], 720, [record()]);
    const truth = m * g + m * (L / 2) * (A * w) ** 2;
    expect(result.joints[0].peakForce.value / truth - 1).toBeLessThan(0.01);
    expect(result.joints[0].peakForce.value / truth - 1).toBeGreaterThan(-0.01);
    expect(result.warnings.some((x) => x.code === 'motion_record_used')).toBe(true);
  });

  test('a record naming a joint or seat the design lacks is not used, and the result says so', () => {
    const r = { ...record(), joint: 3, seat: 5 };
    const codes = analyseInspection(d, [], 360, [r]).warnings.map((w) => w.code);
    expect(codes).toEqual(expect.arrayContaining(['motion_record_seat_unknown', 'motion_record_unused']));
    expect(measuredRiderOf(d, [r])).toEqual([]);
    // The design motion ran instead: the same peak as without the record.
    expect(analyseInspection(d, [], 360, [r]).joints[0].peakForce.value).toBe(
      analyseInspection(d, [], 360).joints[0].peakForce.value,
    );
  });

  test('measured rider Gz in the seat: 1 + d·(A·ω)²/g at the bottom of the swing', () => {
    const [rider] = measuredRiderOf(d, [record()]);
    expect(rider.name).toBe('Seat 1');
    expect(rider.gzMax).toBeCloseTo(1 + (seatM * (A * w) ** 2) / g, 2);
    expect(rider.limits.gz).toEqual({ min: -0.2, max: 3 });
  });
});

describe('bad records are refused, naming the field', () => {
  const good = () => {
    const trace = swingTrace({ rateHz: 100, durationS: 9 });
    const out = trimToCycles(trace, { joint: 0, seat: 0, axis: 'z', sign: -1, parentRateRadS: 0 }, AT, ID);
    if (!out.ok) throw new Error(out.message);
    return out.record;
  };
  const pathsOf = (r: unknown) => {
    const p = motionRecordSchema.safeParse(r);
    return p.success ? [] : p.error.issues.map((i) => i.path.join('.'));
  };

  test('a good record passes', () => expect(pathsOf(good())).toEqual([]));
  test('a sample that is not a finite number', () => {
    const r = good();
    r.rateRadS[10] = Number.NaN;
    expect(pathsOf(r)).toContain('rateRadS.10');
    const inf = good();
    inf.timeS[3] = Infinity;
    expect(pathsOf(inf)).toContain('timeS.3');
  });
  test('times that do not increase', () => {
    const r = good();
    r.timeS[20] = r.timeS[19];
    expect(pathsOf(r)).toEqual(['timeS.20']);
  });
  test('sampled too slowly (every tenth sample of a 100 Hz record: 10 Hz)', () => {
    const r = good();
    const keep = (v: number[]) => v.filter((_, k) => k % 10 === 0);
    expect(
      pathsOf({
        ...r,
        timeS: keep(r.timeS),
        rateRadS: keep(r.rateRadS),
        gxG: keep(r.gxG!),
        gzG: keep(r.gzG!),
      }),
    ).toContain('sampleRateHz');
  });
  test('less than one cycle', () => {
    const r = good();
    const half = (v: number[]) => v.slice(0, Math.floor(v.length / 4));
    expect(
      pathsOf({
        ...r,
        timeS: half(r.timeS),
        rateRadS: half(r.rateRadS),
        gxG: half(r.gxG!),
        gzG: half(r.gzG!),
      }),
    ).toContain('rateRadS');
  });
});

test('a phone on a body fixed to the one below records the joint below that moves', () => {
  const d = hangingRodDesign();
  const gondola = {
    ...d,
    bodies: [{ name: 'Arm', tipM: [0, -4] as [number, number] }, { name: 'Gondola' }],
    motion: [d.motion[0], { joint: 1, kind: 'fixed' as const, angleRad: 0 }],
  };
  expect(attributeJoint(gondola, 1)).toEqual({ joint: 0, parentRateRadS: 0 });
  expect(attributeJoint(gondola, 0)).toEqual({ joint: 0, parentRateRadS: 0 });
});
