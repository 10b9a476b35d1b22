/**
 * Signal conditioning of measured motion and of measured rider accelerations, checked against outside
 * references: the Butterworth magnitude response after the bilinear transform (Oppenheim & Schafer,
 * Discrete-Time Signal Processing, 3rd ed., §7.2), scipy.signal.butter's coefficients for a simple case
 * [from memory, and re-derived by hand in the comment], Winter's two-pass cut-off correction (Winter,
 * Biomechanics and Motor Control of Human Movement, 4th ed., §3.4.4: 0.802 for a 2nd-order filter run
 * twice), the DFT's definition, and fixed-axis rotation of a uniform rod (standard textbook result).
 */
import {
  analyseCycle,
  butterworthSections,
  conditionRiderAccelerations,
  RIDER_ACCELERATION_CUTOFF_HZ,
  unwrapAngles,
  zeroPhaseLowPass,
} from '@/features/loads/engine';
import { estimateNoise } from '@/features/loads/engine/conditioning/record';
import { fft } from '@/features/loads/engine/conditioning/spectrum';
import { analyseCycleRequest } from '@/features/loads/schema';
import {
  G,
  exactPeakForce,
  harmonicSwing,
  random,
  record,
  rodBody,
  steadyRotation,
} from '@/tests/engine/conditioning-fixtures';

const DEG = Math.PI / 180;

/** |H(e^{jω})| of a biquad cascade at frequency f. */
function gain(sections: ReturnType<typeof butterworthSections>, f: number, fs: number): number {
  const w = (2 * Math.PI * f) / fs;
  let g = 1;
  for (const s of sections) {
    // z⁻¹ = e^{−jω}
    const c1 = Math.cos(w);
    const s1 = -Math.sin(w);
    const c2 = Math.cos(2 * w);
    const s2 = -Math.sin(2 * w);
    const nr = s.b0 + s.b1 * c1 + s.b2 * c2;
    const ni = s.b1 * s1 + s.b2 * s2;
    const dr = 1 + s.a1 * c1 + s.a2 * c2;
    const di = s.a1 * s1 + s.a2 * s2;
    g *= Math.hypot(nr, ni) / Math.hypot(dr, di);
  }
  return g;
}

describe('Butterworth low-pass by the bilinear transform', () => {
  it('matches scipy.signal.butter(2, 0.5) for a single pass (from memory; K = tan(π/4) = 1 by hand)', () => {
    // b = [1, 2, 1]/(2 + √2) = [0.29289, 0.58579, 0.29289]; a = [1, 0, (2 − √2)/(2 + √2)] = [1, 0, 0.17157].
    const [s] = butterworthSections(2, 25, 100, 1);
    expect(s.b0).toBeCloseTo(0.2928932188, 9);
    expect(s.b1).toBeCloseTo(0.5857864376, 9);
    expect(s.b2).toBeCloseTo(0.2928932188, 9);
    expect(s.a1).toBeCloseTo(0, 12);
    expect(s.a2).toBeCloseTo(0.1715728753, 9);
  });

  it('has the digital Butterworth response 1/√(1 + (tan(πf/fs)/tan(πfc/fs))^(2N)) (Oppenheim & Schafer §7.2)', () => {
    for (const order of [2, 4, 6]) {
      const fs = 100;
      const fc = 7;
      const sections = butterworthSections(order, fc, fs, 1);
      for (const f of [0, 1, 3, 7, 12, 30, 45]) {
        const ratio = Math.tan((Math.PI * f) / fs) / Math.tan((Math.PI * fc) / fs);
        expect(gain(sections, f, fs)).toBeCloseTo(1 / Math.sqrt(1 + ratio ** (2 * order)), 10);
      }
    }
  });

  it('moves the design cut-off by Winter’s correction so two passes are −3 dB at the cut-off (0.802 for N = 2)', () => {
    const fs = 200;
    const fc = 5;
    const sections = butterworthSections(2, fc, fs, 2);
    // Single-pass design frequency: tan(πfc/fs)/0.802 (Winter's C for two passes of a 2nd-order filter).
    const designed = Math.atan(Math.tan((Math.PI * fc) / fs) / 0.802) * (fs / Math.PI);
    expect(gain(sections, designed, fs)).toBeCloseTo(Math.SQRT1_2, 3);
    expect(gain(sections, fc, fs) ** 2).toBeCloseTo(Math.SQRT1_2, 6);
  });

  it('runs forward and backward: a sine at the cut-off keeps 1/√2 of its amplitude and no phase shift', () => {
    const fs = 100;
    const fc = 2;
    const n = 4001;
    const x = Array.from({ length: n }, (_, k) => Math.sin((2 * Math.PI * fc * k) / fs));
    const { values } = zeroPhaseLowPass(x, fs, fc, 4);
    // Away from the ends: amplitude by least squares against sin and cos.
    let ss = 0;
    let sc = 0;
    let norm = 0;
    for (let k = 1000; k < 3000; k++) {
      const ph = (2 * Math.PI * fc * k) / fs;
      ss += values[k] * Math.sin(ph);
      sc += values[k] * Math.cos(ph);
      norm += Math.sin(ph) ** 2;
    }
    expect(ss / norm).toBeCloseTo(Math.SQRT1_2, 3);
    expect(Math.abs(sc / norm)).toBeLessThan(1e-6);
  });

  it('keeps a cubic trend to the very ends (maximally flat at 0 Hz; the padding follows the trend)', () => {
    const fs = 50;
    const x = Array.from({ length: 501 }, (_, k) => {
      const t = k / fs;
      return 0.3 + 1.2 * t - 0.4 * t * t + 0.02 * t * t * t;
    });
    const { values } = zeroPhaseLowPass(x, fs, 1, 4);
    let worst = 0;
    for (let k = 0; k < x.length; k++) worst = Math.max(worst, Math.abs(values[k] - x[k]));
    // The trend spans about 3 units; the bounded curvature term of the padding costs a few 1e-5 at most.
    expect(worst).toBeLessThan(1e-4);
  });
});

describe('record facts', () => {
  it('the FFT agrees with the DFT’s definition', () => {
    const n = 64;
    const re = Float64Array.from({ length: n }, (_, k) => Math.sin(0.3 * k) + 0.1 * k);
    const im = new Float64Array(n);
    const x = Float64Array.from(re);
    fft(re, im);
    for (const f of [0, 1, 5, 31, 32, 50]) {
      let sr = 0;
      let si = 0;
      for (let k = 0; k < n; k++) {
        sr += x[k] * Math.cos((-2 * Math.PI * f * k) / n);
        si += x[k] * Math.sin((-2 * Math.PI * f * k) / n);
      }
      expect(re[f]).toBeCloseTo(sr, 9);
      expect(im[f]).toBeCloseTo(si, 9);
    }
  });

  it('unwraps an encoder read within one turn back into the steady rotation', () => {
    const truth = Array.from({ length: 300 }, (_, k) => 0.4 + 0.21 * k);
    const wrapped = truth.map((q) => q - 2 * Math.PI * Math.floor(q / (2 * Math.PI)));
    const { values, jumps } = unwrapAngles(wrapped);
    expect(jumps).toBe(Math.floor(truth[299] / (2 * Math.PI)));
    values.forEach((v, k) => expect(v).toBeCloseTo(truth[k], 12));
  });

  it('estimates white noise within 10 % on an uneven record of a swing', () => {
    const rnd = random(7);
    const timeS: number[] = [];
    let t = 0;
    for (let k = 0; k < 2000; k++) {
      timeS.push(t);
      t += 0.01 * (0.8 + 0.4 * rnd.uniform());
    }
    const sigma = 0.003;
    const values = timeS.map((tt) => 0.7 * Math.sin(1.6 * tt) + sigma * rnd.normal());
    expect(estimateNoise(timeS, values) / sigma).toBeGreaterThan(0.9);
    expect(estimateNoise(timeS, values) / sigma).toBeLessThan(1.1);
  });
});

const cycleOf = (profile: object, extra: object = {}) =>
  analyseCycle({
    bodies: [rodBody(400, 6)],
    profiles: [profile as never],
    ...extra,
  });

describe('measured profiles: warnings in plain words', () => {
  const swing = harmonicSwing(0.7, 4, 0.4);

  it('always reports the smoothing used and the noise, on the joint they concern', () => {
    const c = cycleOf(record(swing, { kind: 'angle', noiseRad: 0.2 * DEG }, 100, 12, 3));
    const smoothing = c.warnings.find((w) => w.code === 'smoothing');
    expect(smoothing).toMatchObject({ level: 'info', joint: 0 });
    expect(smoothing?.message).toMatch(
      /100 samples per second.*low-pass at [\d.]+ Hz \(chosen from the record/,
    );
    const noise = c.warnings.find((w) => w.code === 'noise');
    // The seeded noise is 0.2° RMS; the estimate says so to two figures.
    expect(noise?.message).toMatch(/about 0\.(19|2|21) °/);
  });

  it('says when the angles were unwrapped, and the wheel’s loads come out right (rod at 10 rpm)', () => {
    const wheel = steadyRotation(10, 1);
    const rec = record(wheel, { kind: 'angle', noiseRad: 0.05 * DEG, wrap: 'turn' }, 50, 12, 5);
    const c = cycleOf(rec);
    expect(c.warnings.find((w) => w.code === 'unwrapped')?.message).toMatch(/whole turn \d+ times/);
    // Uniform rod at constant ω: peak reaction m·g + m·ω²·L/2 at the bottom (fixed-axis rotation).
    const w = (10 * 2 * Math.PI) / 60;
    const truth = 400 * (G + w * w * 3);
    expect(Math.abs(c.joints[0].peakForce.value / truth - 1)).toBeLessThan(0.01);
  });

  it('reports gaps and uneven spacing', () => {
    const rec = record(swing, { kind: 'angle', noiseRad: 0.05 * DEG }, 100, 12, 9, 0.5);
    const keep = rec.timeS.map((t, k) => !(t > 5 && t < 5.6) || k % 1000 === 0);
    const gappy = {
      kind: 'measured',
      timeS: rec.timeS.filter((_, k) => keep[k]),
      angleRad: rec.angleRad!.filter((_, k) => keep[k]),
    };
    const c = cycleOf(gappy);
    expect(c.warnings.find((w) => w.code === 'gaps')?.message).toMatch(/1 gap .*longest is 0\.6\d* s at 5/);
    expect(c.warnings.find((w) => w.code === 'uneven_spacing')?.level).toBe('info');
  });

  it('fills a 1 s gap smoothly: the peak force stays within 3 % (linear filling gave +240 %)', () => {
    const rec = record(swing, { kind: 'angle', noiseRad: 0.1 * DEG }, 100, 12, 5);
    const keep = rec.timeS.map((t) => !(t > 6 && t < 7));
    const gappy = {
      kind: 'measured',
      timeS: rec.timeS.filter((_, k) => keep[k]),
      angleRad: rec.angleRad!.filter((_, k) => keep[k]),
    };
    const truth = exactPeakForce(swing, 400, 6, 12);
    expect(Math.abs(cycleOf(gappy).joints[0].peakForce.value / truth - 1)).toBeLessThan(0.03);
  });

  it('reports clipped and flat-lined values', () => {
    const rec = record(swing, { kind: 'rate', noiseRadS: 0.01, biasRadS: 0 }, 100, 12, 4);
    const clipped = { ...rec, rateRadS: rec.rateRadS!.map((w) => Math.min(w, 0.8)) };
    expect(cycleOf(clipped).warnings.find((w) => w.code === 'clipped')?.level).toBe('warning');
    const stuck = { ...rec, rateRadS: rec.rateRadS!.map((w, k) => (k >= 300 && k < 420 ? 0.1234 : w)) };
    expect(cycleOf(stuck).warnings.find((w) => w.code === 'flat_lined')?.message).toMatch(
      /1\.2 s \(from 3 s\)/,
    );
  });

  it('warns when the record is sampled too slowly for its motion', () => {
    // A 0.8 s swing with a strong third harmonic read 6 times a second: content near the Nyquist band.
    const fast = {
      name: 'fast',
      at: (t: number) => {
        const w = (2 * Math.PI) / 0.8;
        return {
          q: -Math.PI / 2 + 0.5 * Math.sin(w * t) + 0.1 * Math.sin(3 * w * t),
          w: 0.5 * w * Math.cos(w * t) + 0.3 * w * Math.cos(3 * w * t),
          a: 0,
        };
      },
    };
    const c = cycleOf(record(fast, { kind: 'angle', noiseRad: 0.0005 }, 6, 20, 2));
    expect(c.warnings.find((w) => w.code === 'low_sample_rate')?.level).toBe('warning');
  });

  it('honours a requested cut-off and says when it is below the motion', () => {
    const rec = record(swing, { kind: 'angle', noiseRad: 0.05 * DEG }, 100, 12, 3);
    const c = cycleOf({ ...rec, cutoffHz: 0.1 });
    expect(c.warnings.find((w) => w.code === 'smoothing')?.message).toMatch(/at 0\.1 Hz \(as requested/);
    expect(c.warnings.find((w) => w.code === 'cutoff_below_motion')?.level).toBe('warning');
  });

  it('keeps windowPoints for former callers: a Savitzky–Golay window in samples, said so', () => {
    const rec = record(swing, { kind: 'angle', noiseRad: 0.0001 }, 20, 12, 3);
    const c = cycleOf({ ...rec, windowPoints: 15 });
    expect(c.warnings.find((w) => w.code === 'smoothing')?.message).toMatch(
      /Savitzky–Golay fit over 15 samples/,
    );
  });

  it('samples the default cycle as densely as the record (a 100 Hz, 30 s record gives 3,001 samples)', () => {
    const c = cycleOf(record(swing, { kind: 'angle', noiseRad: 0.001 }, 100, 30, 3));
    expect(c.samples).toBe(3001);
    expect(cycleOf(record(swing, { kind: 'angle', noiseRad: 0.001 }, 5, 8, 3)).samples).toBe(360);
  });

  it('gets the peak pivot force of a noisy 100 Hz swing within 3 % (it was +70 % with a window in samples)', () => {
    const rec = record(swing, { kind: 'angle', noiseRad: 0.05 * DEG }, 100, 12, 11);
    const truth = exactPeakForce(swing, 400, 6, 12);
    expect(Math.abs(cycleOf(rec).joints[0].peakForce.value / truth - 1)).toBeLessThan(0.03);
  });
});

describe('measured profiles: bad input is refused with the field named (400, nothing analysed)', () => {
  const base = (profile: object) => ({
    bodies: [{ name: 'arm', massKg: 100, cgM: [1, 0], inertiaCgKgM2: 10 }],
    profiles: [profile],
  });
  const paths = (body: object) => {
    const out = analyseCycleRequest(body);
    return out.ok ? [] : out.issues.map((i) => i.path);
  };
  const timeS = Array.from({ length: 101 }, (_, k) => k / 20);
  const angleRad = timeS.map((t) => Math.sin(t));

  it('a cut-off at or above half the sample rate, or not above 0', () => {
    expect(paths(base({ kind: 'measured', timeS, angleRad, cutoffHz: 10 }))).toEqual(['profiles.0.cutoffHz']);
    expect(paths(base({ kind: 'measured', timeS, angleRad, cutoffHz: 0 }))).toEqual(['profiles.0.cutoffHz']);
    expect(paths(base({ kind: 'measured', timeS, angleRad, cutoffHz: 9.9 }))).toEqual([]);
  });

  it('non-finite samples, times that do not increase, a record too short', () => {
    expect(paths(base({ kind: 'measured', timeS, angleRad: [...angleRad.slice(0, 100), null] }))).toEqual([
      'profiles.0.angleRad.100',
    ]);
    const repeated = [...timeS];
    repeated[40] = repeated[39];
    expect(paths(base({ kind: 'measured', timeS: repeated, angleRad }))).toEqual(['profiles.0.timeS.40']);
    expect(paths(base({ kind: 'measured', timeS: [0, 1, 2], rateRadS: [0, 1, 2] }))).toContain(
      'profiles.0.timeS',
    );
  });

  it('a cycle longer than the record', () => {
    expect(paths({ ...base({ kind: 'measured', timeS, angleRad }), durationS: 6 })).toEqual(['durationS']);
  });
});

describe('measured rider accelerations (ride-measurement low-pass, [from memory, verify: ASTM F2137 / EN 13814])', () => {
  const fs = 100;
  const timeS = Array.from({ length: 2001 }, (_, k) => k / fs);

  it('filters at 5 Hz with 4 poles and zero phase by default: −3 dB at 5 Hz, 1 Hz kept, 20 Hz removed', () => {
    expect(RIDER_ACCELERATION_CUTOFF_HZ).toBe(5);
    const amplitudeAt = (f: number) => {
      const out = conditionRiderAccelerations(
        timeS,
        timeS.map((t) => Math.sin(2 * Math.PI * f * t)),
      ).values;
      let ss = 0;
      let sc = 0;
      let norm = 0;
      for (let k = 500; k < 1500; k++) {
        ss += out[k] * Math.sin(2 * Math.PI * f * timeS[k]);
        sc += out[k] * Math.cos(2 * Math.PI * f * timeS[k]);
        norm += Math.sin(2 * Math.PI * f * timeS[k]) ** 2;
      }
      return { gain: Math.hypot(ss, sc) / norm, phase: Math.atan2(sc, ss) };
    };
    expect(amplitudeAt(5).gain).toBeCloseTo(Math.SQRT1_2, 2);
    expect(amplitudeAt(1).gain).toBeGreaterThan(0.998);
    expect(Math.abs(amplitudeAt(1).phase)).toBeLessThan(1e-6);
    // Digital 4-pole response at 20 Hz: 1/(1 + (tan(0.2π)/(tan(0.05π)/0.802))⁴) ≈ 0.0053.
    expect(amplitudeAt(20).gain).toBeLessThan(0.006);
  });

  it('keeps a sustained acceleration and reads back at the input’s own uneven times', () => {
    const rnd = random(3);
    const times: number[] = [];
    let t = 0;
    for (let k = 0; k < 1500; k++) {
      times.push(t);
      t += 0.01 * (0.7 + 0.6 * rnd.uniform());
    }
    // A 2 g plateau with 0.3 g of vibration at 25 Hz on top.
    const values = times.map((tt) => 1 + (tt > 4 && tt < 9 ? 1 : 0) + 0.3 * Math.sin(2 * Math.PI * 25 * tt));
    const out = conditionRiderAccelerations(times, values);
    expect(out.values).toHaveLength(times.length);
    const mid = times.findIndex((tt) => tt > 6.5);
    expect(out.values[mid]).toBeCloseTo(2, 2);
    expect(out.warnings.find((w) => w.code === 'smoothing')?.message).toMatch(/5 Hz.*4-pole Butterworth/);
  });

  it('says when the record is too slow to filter at the cut-off, and refuses malformed input', () => {
    const slow = Array.from({ length: 50 }, (_, k) => k / 8);
    const out = conditionRiderAccelerations(slow, slow.map(Math.sin));
    expect(out.cutoffHz).toBeNull();
    expect(out.warnings.find((w) => w.code === 'low_sample_rate')?.level).toBe('warning');
    expect(() => conditionRiderAccelerations([0, 1, 1, 2], [1, 1, 1, 1])).toThrow(/increase/);
    expect(() => conditionRiderAccelerations([0, 1, 2, 3], [1, NaN, 1, 1])).toThrow(/finite/);
  });
});
