import { ENGINE_VERSION, solveInstant } from '@/features/loads/engine';
import {
  MAX_SAMPLES,
  analyseCycleRequest,
  cycleRequestSchema,
  loadsRequestSchema,
  solveLoadsRequest,
} from '@/features/loads/schema';

// An invented two-body ride: main arm with a gondola on its tip.
const arm = { name: 'main arm', massKg: 3000, cgM: [4, 0], inertiaCgKgM2: 40_000, tipM: [8, 0] };
const gondola = { name: 'gondola', massKg: 1200, cgM: [0, -1.5], inertiaCgKgM2: 900 };
const validLoads = () => ({
  bodies: [structuredClone(arm), structuredClone(gondola)],
  state: { angleRad: [0.4, -0.4], rateRadS: [1.2, -0.3], accelRadS2: [0.5, 0.1] },
});
type Loose = Record<string, unknown>;
const validCycle = (): {
  bodies: Loose[];
  profiles: Loose[];
  seats: { name: string; body: number; positionM: number[]; spineAngleRad: number }[];
} => ({
  bodies: [structuredClone(arm), structuredClone(gondola)],
  profiles: [
    { kind: 'ramp', toRpm: 8, rampTimeS: 12, holdAfterS: 30 },
    { kind: 'swing', amplitudeRad: 0.2, periodS: 3 },
  ],
  seats: [{ name: 'row 1', body: 1, positionM: [0, -1.2], spineAngleRad: Math.PI / 2 }],
});

/** The paths of the issues a bad body produces. */
function pathsOf(outcome: { ok: boolean; issues?: { path: string }[] }): string[] {
  expect(outcome.ok).toBe(false);
  return (outcome.issues ?? []).map((i) => i.path);
}

describe('POST /api/loads body', () => {
  it('accepts the contract’s shape and answers with the engine’s solve', () => {
    const out = solveLoadsRequest(validLoads());
    expect(out.ok).toBe(true);
    if (!out.ok) return;
    const parsed = loadsRequestSchema.parse(validLoads());
    const direct = solveInstant(parsed.bodies, parsed.state);
    expect(out.value.engineVersion).toBe(ENGINE_VERSION);
    expect(out.value.joints[0].forceN).toEqual(direct.joints[0].forceN);
    expect(out.value.joints[1].torqueNm).toBe(direct.joints[1].torqueNm);
    expect(out.value.bodies[1].cgAccelMS2).toEqual(direct.bodies[1].cgAccelMS2);
    // Plain JSON all the way down.
    expect(JSON.parse(JSON.stringify(out.value))).toEqual(out.value);
  });

  it('uses 9.80665 m/s² unless gravityMS2 is given, and ignores tipM on the last body', () => {
    const out = solveLoadsRequest(validLoads());
    const moon = solveLoadsRequest({ ...validLoads(), gravityMS2: 1.62 });
    const withTip = validLoads();
    (withTip.bodies[1] as Record<string, unknown>).tipM = [5, 5];
    const tipped = solveLoadsRequest(withTip);
    if (!out.ok || !moon.ok || !tipped.ok) throw new Error('expected valid');
    expect(out.value.gravityMS2).toBe(9.80665);
    expect(moon.value.gravityMS2).toBe(1.62);
    expect(tipped.value.joints).toEqual(out.value.joints);
  });

  it('names a negative mass: bodies.1.massKg', () => {
    const body = validLoads();
    body.bodies[1].massKg = -5;
    expect(pathsOf(solveLoadsRequest(body))).toContain('bodies.1.massKg');
  });

  it('rejects a zero mass and a negative inertia, but allows zero inertia (a point mass)', () => {
    const zero = validLoads();
    zero.bodies[0].massKg = 0;
    expect(pathsOf(solveLoadsRequest(zero))).toEqual(['bodies.0.massKg']);
    const negative = validLoads();
    negative.bodies[1].inertiaCgKgM2 = -1;
    expect(pathsOf(solveLoadsRequest(negative))).toEqual(['bodies.1.inertiaCgKgM2']);
    const point = validLoads();
    point.bodies[1].inertiaCgKgM2 = 0;
    expect(solveLoadsRequest(point).ok).toBe(true);
  });

  it('names a chain without tipM where a body follows: bodies.0.tipM', () => {
    const body = validLoads();
    delete (body.bodies[0] as Record<string, unknown>).tipM;
    const out = solveLoadsRequest(body);
    expect(pathsOf(out)).toEqual(['bodies.0.tipM']);
  });

  it('names state arrays whose length does not match the bodies: state.angleRad', () => {
    const body = validLoads();
    body.state.angleRad = [0.1];
    const out = solveLoadsRequest(body);
    expect(pathsOf(out)).toEqual(['state.angleRad']);
    if (!out.ok) expect(out.issues[0].message).toMatch(/2/);
  });

  it('names non-finite numbers and missing fields', () => {
    const inf = validLoads();
    inf.state.rateRadS[1] = Infinity;
    expect(pathsOf(solveLoadsRequest(inf))).toEqual(['state.rateRadS.1']);
    const nan = validLoads();
    nan.bodies[0].cgM = [Number.NaN, 0];
    expect(pathsOf(solveLoadsRequest(nan))).toEqual(['bodies.0.cgM.0']);
    const text = validLoads() as Record<string, unknown>;
    (text.bodies as Record<string, unknown>[])[1].massKg = '1200';
    expect(pathsOf(solveLoadsRequest(text))).toEqual(['bodies.1.massKg']);
    const missing = validLoads();
    delete (missing.bodies[1] as Record<string, unknown>).cgM;
    const out = solveLoadsRequest(missing);
    expect(pathsOf(out)).toEqual(['bodies.1.cgM']);
    if (!out.ok) expect(out.issues[0].message).toBe('Required');
    expect(pathsOf(solveLoadsRequest({ bodies: validLoads().bodies }))).toEqual(['state']);
    expect(pathsOf(solveLoadsRequest(null))).toEqual(['(body)']);
  });

  it('allows at most 10 bodies', () => {
    const bodies = Array.from({ length: 11 }, (_, i) => ({ ...arm, name: `b${i}` }));
    const zeros = Array(11).fill(0);
    const out = solveLoadsRequest({ bodies, state: { angleRad: zeros, rateRadS: zeros, accelRadS2: zeros } });
    expect(pathsOf(out)).toContain('bodies');
    expect(loadsRequestSchema.safeParse({ ...validLoads(), bodies: [] }).success).toBe(false);
  });

  it('checks requested points for the moment check and reports both ways for each', () => {
    const ok = solveLoadsRequest({
      ...validLoads(),
      points: [{ name: 'gondola pin', pointM: [0, 0], body: 1 }],
    });
    if (!ok.ok) throw new Error('expected valid');
    expect(ok.value.moments[0].name).toBe('gondola pin');
    for (const b of ok.value.moments[0].bodies) expect(Math.abs(b.differenceNm)).toBeLessThan(1e-6);
    const bad = solveLoadsRequest({ ...validLoads(), points: [{ pointM: [0, 0], body: 2 }] });
    expect(pathsOf(bad)).toEqual(['points.0.body']);
  });
});

describe('POST /api/loads/cycle body', () => {
  it('accepts bodies, profiles and seats and answers with plain JSON', () => {
    const out = analyseCycleRequest(validCycle());
    expect(out.ok).toBe(true);
    if (!out.ok) return;
    expect(out.value.samples).toBe(360);
    expect(out.value.durationS).toBe(42);
    expect(out.value.joints).toHaveLength(2);
    expect(out.value.seats[0].gz).toHaveLength(360);
    expect(out.value.assumptions.length).toBeGreaterThan(0);
    // Plain arrays, no typed arrays (those would serialise as objects); JSON only turns −0 into 0.
    expect(Array.isArray(out.value.timeS) && Array.isArray(out.value.joints[0].forceXN)).toBe(true);
    const text = JSON.stringify(out.value);
    expect(JSON.stringify(JSON.parse(text))).toBe(text);
  });

  it('names profiles that do not match the bodies', () => {
    const body = validCycle();
    body.profiles.pop();
    expect(pathsOf(analyseCycleRequest(body))).toEqual(['profiles']);
  });

  it('names a missing tipM, an unknown profile kind and a seat on no body', () => {
    const body = validCycle();
    delete body.bodies[0].tipM;
    body.profiles[1] = { kind: 'wobble' };
    body.seats[0].body = 5;
    const paths = pathsOf(analyseCycleRequest(body));
    expect(paths).toContain('profiles.1.kind');
    // Cross-field rules run once the shapes are right.
    const fixed = validCycle();
    delete fixed.bodies[0].tipM;
    fixed.seats[0].body = 5;
    expect(pathsOf(analyseCycleRequest(fixed)).sort()).toEqual(['bodies.0.tipM', 'seats.0.body']);
  });

  it('bounds the samples at 100,000 and needs whole numbers', () => {
    expect(pathsOf(analyseCycleRequest({ ...validCycle(), samples: MAX_SAMPLES + 1 }))).toEqual(['samples']);
    expect(pathsOf(analyseCycleRequest({ ...validCycle(), samples: 360.5 }))).toEqual(['samples']);
    expect(cycleRequestSchema.safeParse({ ...validCycle(), samples: MAX_SAMPLES }).success).toBe(true);
  });

  it('asks for durationS when no profile has a cycle length, and refuses to extrapolate a record', () => {
    const still = {
      ...validCycle(),
      profiles: [
        { kind: 'fixed', angleRad: 0 },
        { kind: 'constant', rpm: 0 },
      ],
    };
    expect(pathsOf(analyseCycleRequest(still))).toEqual(['durationS']);
    const measured = {
      ...validCycle(),
      profiles: [
        { kind: 'measured', timeS: [0, 1, 2, 3, 4, 5], angleRad: [0, 0.1, 0.2, 0.3, 0.4, 0.5] },
        { kind: 'fixed', angleRad: 0 },
      ],
      durationS: 8,
    };
    expect(pathsOf(analyseCycleRequest(measured))).toEqual(['durationS']);
  });

  it('checks measured records: one series, matching length, increasing times', () => {
    const base = validCycle();
    const both = {
      kind: 'measured',
      timeS: [0, 1, 2, 3, 4],
      angleRad: [0, 1, 2, 3, 4],
      rateRadS: [1, 1, 1, 1, 1],
    };
    expect(pathsOf(analyseCycleRequest({ ...base, profiles: [both, base.profiles[1]] }))).toEqual([
      'profiles.0.angleRad',
    ]);
    const short = { kind: 'measured', timeS: [0, 1, 2, 3, 4], rateRadS: [1, 1, 1] };
    expect(pathsOf(analyseCycleRequest({ ...base, profiles: [short, base.profiles[1]] }))).toEqual([
      'profiles.0.rateRadS',
    ]);
    const backwards = { kind: 'measured', timeS: [0, 1, 3, 2, 4], rateRadS: [1, 1, 1, 1, 1] };
    expect(pathsOf(analyseCycleRequest({ ...base, profiles: [backwards, base.profiles[1]] }))).toEqual([
      'profiles.0.timeS.3',
    ]);
  });

  it('checks limits: positive values, minimum below nominal, a margin between 0 and 1', () => {
    const body = {
      ...validCycle(),
      limits: {
        nearMargin: 1.2,
        joints: [
          {
            maxForceN: -1,
            pin: { shear: 'double', bearingLengthM: 0.05, nominalDiameterM: 0.08, minimumDiameterM: 0.09 },
          },
        ],
        rider: { gz: { min: 2, max: -1 } },
      },
    };
    expect(pathsOf(analyseCycleRequest(body)).sort()).toEqual([
      'limits.joints.0.maxForceN',
      'limits.joints.0.pin.minimumDiameterM',
      'limits.nearMargin',
      'limits.rider.gz.max',
    ]);
  });

  it('evaluates the envelope when limits are given', () => {
    const out = analyseCycleRequest({
      ...validCycle(),
      limits: { joints: [{ maxForceN: 1e9, maxTorqueNm: 1 }], rider: { gz: { min: -1.5, max: 6 } } },
    });
    if (!out.ok) throw new Error(JSON.stringify(out.issues));
    const ids = out.value.envelope.map((e) => e.id);
    expect(ids).toEqual(['joints.0.force', 'joints.0.torque', 'seats.0.gz']);
    expect(out.value.envelope[0].status).toBe('within');
    expect(out.value.envelope[1].status).toBe('over');
    expect(out.value.status).toBe('over');
  });
});
