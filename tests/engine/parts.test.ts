import {
  bodyFromParts,
  centreOfPercussion,
  combineParts,
  inertiaAbout,
  jointAccelerations,
  createChain,
  partProperties,
  solveInstant,
} from '@/features/loads/engine';

/**
 * Mass moments of inertia of standard shapes about an axis through the centre, normal to the plane,
 * and the parallel-axis theorem — the tables in any dynamics text (e.g. Meriam & Kraige, Dynamics,
 * appendix on mass moments of inertia; standard results, written down from memory).
 */
describe('standard shapes (tables of mass moments of inertia)', () => {
  const m = 12;
  it('slender rod: mL²/12 about its centre, mL²/3 about an end', () => {
    const L = 2.5;
    const p = partProperties({
      kind: 'rod',
      massKg: m,
      fromM: [0, 0],
      toM: [L * Math.cos(0.4), L * Math.sin(0.4)],
    });
    expect(p.inertiaCgKgM2).toBeCloseTo((m * L * L) / 12, 12);
    expect(inertiaAbout(p, [0, 0])).toBeCloseTo((m * L * L) / 3, 12);
  });
  it('disc mR²/2, thin ring mR², sphere 2mR²/5', () => {
    const R = 0.7;
    expect(
      partProperties({ kind: 'disc', massKg: m, centreM: [1, 2], radiusM: R }).inertiaCgKgM2,
    ).toBeCloseTo((m * R * R) / 2, 12);
    expect(
      partProperties({ kind: 'ring', massKg: m, centreM: [1, 2], radiusM: R }).inertiaCgKgM2,
    ).toBeCloseTo(m * R * R, 12);
    expect(
      partProperties({ kind: 'sphere', massKg: m, centreM: [0, 0], radiusM: R }).inertiaCgKgM2,
    ).toBeCloseTo((2 * m * R * R) / 5, 12);
  });
  it('rectangular plate m(a² + b²)/12; a counterweight without size is a point', () => {
    const p = partProperties({ kind: 'plate', massKg: m, centreM: [0, 0], widthM: 1.2, heightM: 0.5 });
    expect(p.inertiaCgKgM2).toBeCloseTo((m * (1.2 ** 2 + 0.5 ** 2)) / 12, 12);
    expect(partProperties({ kind: 'counterweight', massKg: m, centreM: [-2, 0] }).inertiaCgKgM2).toBe(0);
  });
  it('parallel axis: I = I_G + m·d² for a disc about a rim point = 3mR²/2', () => {
    const R = 0.4;
    const p = partProperties({ kind: 'disc', massKg: m, centreM: [3, 1], radiusM: R });
    expect(inertiaAbout(p, [3 + R, 1])).toBeCloseTo((3 * m * R * R) / 2, 12);
  });
});

describe('composite bodies', () => {
  it('two half-rods make the same body as one rod (centre and inertia)', () => {
    const whole = combineParts([{ kind: 'rod', massKg: 10, fromM: [0, 0], toM: [4, 0] }]);
    const halves = combineParts([
      { kind: 'rod', massKg: 5, fromM: [0, 0], toM: [2, 0] },
      { kind: 'rod', massKg: 5, fromM: [2, 0], toM: [4, 0] },
    ]);
    expect(halves.massKg).toBe(10);
    expect(halves.cgM[0]).toBeCloseTo(2, 12);
    expect(halves.inertiaCgKgM2).toBeCloseTo(whole.inertiaCgKgM2, 12);
    expect(halves.inertiaCgKgM2).toBeCloseTo((10 * 16) / 12, 12);
  });

  it('an arm with a counterweight and a gondola: centre by moments, inertia by parallel axes', () => {
    // Invented arm: 8 m beam from −2 m to +6 m, 1.2 t counterweight at −2 m, 0.8 t gondola at +6 m.
    const body = bodyFromParts(
      'arm',
      [
        { kind: 'rod', massKg: 2000, fromM: [-2, 0], toM: [6, 0] },
        { kind: 'counterweight', massKg: 1200, centreM: [-2, 0] },
        { kind: 'point', massKg: 800, atM: [6, 0] },
      ],
      [6, 0],
    );
    const m = 4000;
    const x = (2000 * 2 + 1200 * -2 + 800 * 6) / m;
    expect(body.massKg).toBe(m);
    expect(body.cgM[0]).toBeCloseTo(x, 12);
    const iPivot = (2000 * 64) / 12 + 2000 * 4 + 1200 * 4 + 800 * 36;
    expect(body.inertiaCgKgM2 + m * x * x).toBeCloseTo(iPivot, 9);
    expect(body.tipM).toEqual([6, 0]);
  });
});

describe('centre of percussion (standard result q = I_O/(m·r_G))', () => {
  it('is 2L/3 from the pin for a uniform rod', () => {
    const L = 3;
    const props = partProperties({ kind: 'rod', massKg: 20, fromM: [0, 0], toM: [L, 0] });
    expect(centreOfPercussion(props)).toBeCloseTo((2 * L) / 3, 12);
  });

  it('a blow there leaves no reaction at the pin (checked with the engine)', () => {
    // A horizontal impulse-like force P at q on a rod hanging at rest: the pin force must vanish.
    const L = 2;
    const m = 30;
    const props = partProperties({ kind: 'rod', massKg: m, fromM: [0, 0], toM: [L, 0] });
    const q = centreOfPercussion(props);
    const P = 500;
    const chain = createChain([{ name: 'rod', ...props }], 0);
    // Model the blow as a joint torque P·q about the pin (no gravity): the rod's own response.
    const [alpha] = jointAccelerations(chain, [-Math.PI / 2], [0], [P * q]);
    const r = solveInstant(
      [{ name: 'rod', ...props }],
      { angleRad: [-Math.PI / 2], rateRadS: [0], accelRadS2: [alpha] },
      {
        gravityMS2: 0,
      },
    );
    // The pin supplies m·a_G; applying P at q supplies exactly that, so the pin's share P − m·a_G is zero.
    expect(r.joints[0].forceN[0]).toBeCloseTo(P, 9);
    expect(m * r.bodies[0].cgAccelMS2[0]).toBeCloseTo(P, 9);
  });
});
