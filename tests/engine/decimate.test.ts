/**
 * Bounded cycle series (features/loads/engine/decimate.ts): every series' exact extremes survive, against
 * the full series they were cut from and against closed forms; the kept instants stay within the bound.
 */
import {
  type ChainBody,
  type MotionProfile,
  analyseCycle,
  boundCycle,
  cycleSeries,
  pickSampleIndices,
  pickValues,
  valuesPerSample,
} from '@/features/loads/engine';

const maxOf = (v: ArrayLike<number>) => Math.max(...Array.from(v));
const minOf = (v: ArrayLike<number>) => Math.min(...Array.from(v));

describe('pickSampleIndices', () => {
  it('keeps every sample when they fit', () => {
    expect(pickSampleIndices([[3, 1, 2]], 3, 3)).toEqual([0, 1, 2]);
  });

  it('keeps the closed-form peaks and troughs of a sine: sin(2π·k/400) is ±1 at k = 100 + 400j and 300 + 400j', () => {
    // 100,000 samples, 250 periods: sin(π/2 + 2πj) = 1 and sin(3π/2 + 2πj) = −1 (to within one ulp here).
    const n = 100_000;
    const wave = Float64Array.from({ length: n }, (_, k) => Math.sin((2 * Math.PI * k) / 400));
    const kept = pickSampleIndices([wave], n, 2000);
    expect(kept.length).toBeLessThanOrEqual(2000);
    expect(kept[0]).toBe(0);
    expect(kept[kept.length - 1]).toBe(n - 1);
    expect(kept).toEqual([...kept].sort((a, b) => a - b));
    const keptSet = new Set(kept);
    // Every crest and every trough instant of all 250 periods is kept, not a neighbour of it.
    for (let j = 0; j < 250; j++) {
      expect(keptSet.has(100 + 400 * j)).toBe(true);
      expect(keptSet.has(300 + 400 * j)).toBe(true);
    }
    const values = pickValues(wave, kept);
    expect(maxOf(values)).toBe(maxOf(wave));
    expect(minOf(values)).toBe(minOf(wave));
    expect(maxOf(values)).toBeCloseTo(1, 15);
  });

  it('keeps a one-sample spike that an even thinning would step over', () => {
    const n = 50_000;
    const flat = new Float64Array(n).fill(1);
    flat[12_345] = 7;
    flat[40_001] = -3;
    const kept = pickSampleIndices([flat], n, 100);
    expect(kept).toContain(12_345);
    expect(kept).toContain(40_001);
    expect(kept.length).toBeLessThanOrEqual(100);
  });

  it('keeps each series’ global extremes even when the bound is below them', () => {
    const n = 1000;
    const series = Array.from({ length: 20 }, (_, s) =>
      Float64Array.from({ length: n }, (_, k) => Math.sin(k / 37 + s)),
    );
    const kept = pickSampleIndices(series, n, 10);
    // Ends plus two per series at most: the bound gives way to exactness, never the reverse.
    expect(kept.length).toBeLessThanOrEqual(2 + 2 * series.length);
    const keptSet = new Set(kept);
    for (const s of series) {
      expect(keptSet.has(s.indexOf(maxOf(s)))).toBe(true);
      expect(keptSet.has(s.indexOf(minOf(s)))).toBe(true);
    }
  });

  it('skips NaN gaps instead of losing the extremes around them', () => {
    const v = Float64Array.from({ length: 5000 }, (_, k) => (k % 7 === 0 ? Number.NaN : Math.cos(k / 300)));
    const kept = pickValues(v, pickSampleIndices([v], v.length, 200)).filter((x) => !Number.isNaN(x));
    const finite = Array.from(v).filter((x) => !Number.isNaN(x));
    expect(maxOf(kept)).toBe(maxOf(finite));
    expect(minOf(kept)).toBe(minOf(finite));
  });
});

describe('boundCycle on a whole analysed cycle', () => {
  // Invented three-body chain (as bench/loads.ts): main arm, sub-arm, gondola, with a seat on the gondola.
  const bodies: ChainBody[] = [
    { name: 'main arm', massKg: 8000, cgM: [3, 0.1], inertiaCgKgM2: 120_000, tipM: [12, 0] },
    { name: 'sub-arm', massKg: 1500, cgM: [1.2, -0.2], inertiaCgKgM2: 1500, tipM: [2.5, 0.3] },
    { name: 'gondola', massKg: 4000, cgM: [0, -1.5], inertiaCgKgM2: 6000 },
  ];
  const profiles: MotionProfile[] = [
    { kind: 'ramp', toRpm: 12, rampTimeS: 8, holdAfterS: 52 },
    { kind: 'swing', amplitudeRad: 0.6, periodS: 4.1 },
    { kind: 'swing', amplitudeRad: 0.3, periodS: 2.3, phaseRad: 1 },
  ];
  const seats = [{ name: 'row 1', body: 2, positionM: [0, -2] as [number, number], spineAngleRad: 1.2 }];
  const full = analyseCycle({ bodies, profiles, samples: 10_000, seats });
  const maxValues = 16_000;
  const { result: cut, sampleIndex } = boundCycle(full, maxValues);

  it('keeps the exact maximum and minimum of every series, checked against the full series', () => {
    const before = cycleSeries(full);
    const after = cycleSeries(cut);
    expect(after).toHaveLength(before.length);
    before.forEach((series, s) => {
      expect(maxOf(after[s])).toBe(maxOf(series));
      expect(minOf(after[s])).toBe(minOf(series));
    });
    // And the summary the engine computed from the full series points at a kept instant of equal value.
    full.joints.forEach((j, i) => {
      const at = sampleIndex!.indexOf(j.peakForce.index);
      expect(at).toBeGreaterThanOrEqual(0);
      expect(cut.joints[i].forceMagnitudeN[at]).toBe(j.peakForce.value);
      expect(cut.joints[i].peakForce).toEqual(j.peakForce);
    });
  });

  it('keeps aligned series of kept samples: each value is the full series’ value at its instant', () => {
    expect(sampleIndex).not.toBeNull();
    const idx = sampleIndex!;
    expect(cut.timeS).toHaveLength(idx.length);
    idx.forEach((k, p) => {
      expect(cut.timeS[p]).toBe(full.timeS[k]);
      expect(cut.joints[1].torqueNm[p]).toBe(full.joints[1].torqueNm[k]);
      expect(cut.seats[0].gz[p]).toBe(full.seats[0].gz[k]);
    });
    expect(cut.samples).toBe(10_000);
  });

  it('stays within the bound whatever the sample count', () => {
    const perSample = valuesPerSample(cut.joints.length, cut.seats.length);
    expect(perSample).toBe(1 + 9 * 3 + 2);
    expect(cut.timeS.length * perSample).toBeLessThanOrEqual(maxValues);
    // Fine enough to draw: most of the room is used, not a handful of points.
    expect(cut.timeS.length * perSample).toBeGreaterThan(maxValues / 2);
  });

  it('returns the cycle untouched when it already fits', () => {
    const small = analyseCycle({ bodies, profiles, samples: 360, seats });
    const same = boundCycle(small, maxValues);
    expect(same.sampleIndex).toBeNull();
    expect(same.result).toBe(small);
  });

  it('keeps every turn’s peak and trough of a drawn series, not only the cycle’s extremes', () => {
    // Ten turns of a steadily driven rod: the pin force peaks once a turn at the bottom and dips at the top.
    const turning = analyseCycle({
      bodies: [{ name: 'rod', massKg: 100, cgM: [1, 0], inertiaCgKgM2: 100 / 3 }],
      profiles: [{ kind: 'constant', rpm: 20 }],
      durationS: 30,
      samples: 50_001,
    });
    const { result: kept } = boundCycle(turning, 4000);
    const inTurn = (times: Float64Array, values: Float64Array, turn: number) =>
      Array.from(values).filter((_, k) => times[k] >= 3 * turn && times[k] < 3 * (turn + 1));
    for (let turn = 0; turn < 10; turn++) {
      const full = inTurn(turning.timeS, turning.joints[0].forceMagnitudeN, turn);
      const cut = inTurn(kept.timeS, kept.joints[0].forceMagnitudeN, turn);
      expect(maxOf(cut)).toBe(maxOf(full));
      expect(minOf(cut)).toBe(minOf(full));
    }
  });

  it('keeps the textbook peak of a rod turning steadily: mg + mω²L/2 at the bottom', () => {
    // Uniform rod pinned at one end at constant ω (e.g. Meriam & Kraige, Dynamics, plane kinetics of
    // rigid bodies; a standard result, recalled from memory). 100 kg, 2 m, 20 rpm, 20,000 samples.
    const g = 9.80665;
    const rod = { name: 'rod', massKg: 100, cgM: [1, 0] as [number, number], inertiaCgKgM2: 100 / 3 };
    const turning = analyseCycle({
      bodies: [rod],
      gravityMS2: g,
      profiles: [{ kind: 'constant', rpm: 20 }],
      samples: 20_001,
    });
    const bounded = boundCycle(turning, 4000).result;
    const w = (20 * 2 * Math.PI) / 60;
    const exact = 100 * g + 100 * w * w * 1;
    expect(bounded.timeS.length).toBeLessThanOrEqual(400);
    const peak = maxOf(bounded.joints[0].forceMagnitudeN);
    expect(peak).toBe(maxOf(turning.joints[0].forceMagnitudeN));
    expect(peak).toBeGreaterThan(exact * (1 - 1e-6));
    expect(peak).toBeLessThanOrEqual(exact * (1 + 1e-9));
  });
});
