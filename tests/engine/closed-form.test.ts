import {
  type ChainBody,
  analyseCycle,
  chainEnergy,
  createChain,
  jointAccelerations,
  solveInstant,
} from '@/features/loads/engine';

/**
 * Closed-form rigid-body results from the standard dynamics texts (e.g. Meriam & Kraige, Engineering
 * Mechanics: Dynamics, chapter on plane kinetics of rigid bodies; Hibbeler, Engineering Mechanics:
 * Dynamics). The formulas are standard results; the worked numbers are recomputed here from them and
 * were first written down from memory, with g = 9.81 m/s² as those texts use it.
 */
const g = 9.81;

/** A uniform slender rod pinned at one end: centre of gravity at L/2 on its x-axis, I_G = mL²/12. */
function rod(massKg: number, lengthM: number): ChainBody {
  return { name: 'rod', massKg, cgM: [lengthM / 2, 0], inertiaCgKgM2: (massKg * lengthM ** 2) / 12 };
}

describe('uniform rod pinned at one end, released from rest horizontal (m = 50 kg, L = 3 m)', () => {
  const m = 50;
  const L = 3;
  const body = rod(m, L);
  const chain = createChain([body], g);

  it('falls with α = 3g/(2L) = 4.905 rad/s² (textbook: free body of the rod about its pin)', () => {
    const [alpha] = jointAccelerations(chain, [0], [0], [0]);
    // Clockwise: the rod lies along +x and falls toward −y.
    expect(alpha).toBeCloseTo((-3 * g) / (2 * L), 10);
    expect(Math.abs(alpha)).toBeCloseTo(4.905, 3);
  });

  it('loads its pin with mg/4 = 122.6 N, straight up, and needs no torque (textbook)', () => {
    const r = solveInstant(
      [body],
      { angleRad: [0], rateRadS: [0], accelRadS2: [(-3 * g) / (2 * L)] },
      { gravityMS2: g },
    );
    const [joint] = r.joints;
    expect(joint.forceN[0]).toBeCloseTo(0, 9);
    expect(joint.forceN[1]).toBeCloseTo((m * g) / 4, 9);
    expect(joint.forceMagnitudeN).toBeCloseTo(122.6, 1);
    expect(joint.torqueNm).toBeCloseTo(0, 9);
    // The centre's kinematic acceleration: a_t = α·L/2 downward, no normal part at rest.
    expect(r.bodies[0].cgAccelMS2[0]).toBeCloseTo(0, 12);
    expect(r.bodies[0].cgAccelMS2[1]).toBeCloseTo((-3 * g) / 4, 9);
  });

  it('reaches the bottom with ω = √(3g/L) = 3.13 rad/s and a pin force of 2.5·mg = 1226 N (textbook)', () => {
    // ω from energy: the engine's own energy function against mg·L/2 = ½·I_O·ω².
    const omega = Math.sqrt((3 * g) / L);
    expect(omega).toBeCloseTo(3.13, 2);
    const top = chainEnergy(chain, [0], [0]);
    const bottom = chainEnergy(chain, [-Math.PI / 2], [-omega]);
    expect(bottom.totalJ).toBeCloseTo(top.totalJ, 9);

    const [alpha] = jointAccelerations(chain, [-Math.PI / 2], [-omega], [0]);
    expect(alpha).toBeCloseTo(0, 9);
    const r = solveInstant(
      [body],
      { angleRad: [-Math.PI / 2], rateRadS: [-omega], accelRadS2: [alpha] },
      { gravityMS2: g },
    );
    expect(r.joints[0].forceN[0]).toBeCloseTo(0, 9);
    expect(r.joints[0].forceN[1]).toBeCloseTo(2.5 * m * g, 9);
    expect(r.joints[0].forceMagnitudeN).toBeCloseTo(1226, 0);
  });

  it.each([15, 30, 45, 60, 75])(
    'at %i° below horizontal: along 2.5·mg·sinθ, across 0.25·mg·cosθ (textbook general position)',
    (deg) => {
      const th = (deg * Math.PI) / 180;
      const omega = -Math.sqrt((3 * g * Math.sin(th)) / L);
      const [alpha] = jointAccelerations(chain, [-th], [omega], [0]);
      expect(Math.abs(alpha)).toBeCloseTo((3 * g * Math.cos(th)) / (2 * L), 9);
      const r = solveInstant(
        [body],
        { angleRad: [-th], rateRadS: [omega], accelRadS2: [alpha] },
        { gravityMS2: g },
      );
      const [along, across] = r.joints[0].forceBodyN;
      // The pin pulls the rod toward itself (−x of the rod) and holds it up across the rod (+y).
      expect(along).toBeCloseTo(-2.5 * m * g * Math.sin(th), 8);
      expect(across).toBeCloseTo(0.25 * m * g * Math.cos(th), 8);
    },
  );
});

describe('rod driven at constant ω in a vertical plane (m = 100 kg, L = 2 m, ω = 3 rad/s)', () => {
  const m = 100;
  const L = 2;
  const w = 3;
  const body = rod(m, L);
  const at = (angle: number) =>
    solveInstant([body], { angleRad: [angle], rateRadS: [w], accelRadS2: [0] }, { gravityMS2: g }).joints[0];

  it('pin force mg + mω²L/2 = 1881 N at the bottom, mg − mω²L/2 = 81 N at the top (textbook)', () => {
    expect(at(-Math.PI / 2).forceMagnitudeN).toBeCloseTo(m * g + m * w * w * (L / 2), 9);
    expect(at(-Math.PI / 2).forceMagnitudeN).toBeCloseTo(1881, 0);
    expect(at(Math.PI / 2).forceMagnitudeN).toBeCloseTo(m * g - m * w * w * (L / 2), 9);
    expect(at(Math.PI / 2).forceMagnitudeN).toBeCloseTo(81, 0);
  });

  it.each([-150, -90, -30, 0, 45, 90, 170])('drive torque mg·(L/2)·cosθ at θ = %i° (textbook)', (deg) => {
    const th = (deg * Math.PI) / 180;
    expect(at(th).torqueNm).toBeCloseTo(m * g * (L / 2) * Math.cos(th), 9);
  });
});

describe('statics of a two-body arm (standard result: moments of the weights)', () => {
  it('holding the chain still needs Σ m·g·x_G at the root and carries the total weight', () => {
    const arm: ChainBody = { name: 'arm', massKg: 400, cgM: [1.5, 0], inertiaCgKgM2: 300, tipM: [3, 0] };
    const car: ChainBody = { name: 'car', massKg: 250, cgM: [0, -0.8], inertiaCgKgM2: 40 };
    // Arm raised 30°, car hanging plumb (relative −30° undoes the arm's turn, cgM points down).
    const th = Math.PI / 6;
    const r = solveInstant(
      [arm, car],
      { angleRad: [th, -th], rateRadS: [0, 0], accelRadS2: [0, 0] },
      { gravityMS2: g },
    );
    const xArm = 1.5 * Math.cos(th);
    const xCar = 3 * Math.cos(th);
    expect(r.joints[0].torqueNm).toBeCloseTo(400 * g * xArm + 250 * g * xCar, 8);
    expect(r.joints[0].forceN[1]).toBeCloseTo(650 * g, 8);
    // The car hangs plumb below its pin, so that pin needs no torque.
    expect(r.joints[1].torqueNm).toBeCloseTo(0, 8);
    expect(r.joints[1].forceN[1]).toBeCloseTo(250 * g, 8);
  });
});

describe('rotating arm with one tip carrying an imbalance (standard result m·r·ω²)', () => {
  it('adds a rotating pivot load of m·r·ω² on top of the weight', () => {
    // Invented ride: a balanced 12 m arm at 12 rpm, 1500 kg more on one tip than the other.
    const w = (12 * 2 * Math.PI) / 60;
    const arm: ChainBody = {
      name: 'arm',
      massKg: 16_000 + 1500,
      cgM: [(1500 * 12) / 17_500, 0],
      inertiaCgKgM2: 1e6,
    };
    const expected = 1500 * 12 * w * w; // ≈ 28.4 kN
    for (const deg of [0, 60, 135, 270]) {
      const th = (deg * Math.PI) / 180;
      const r = solveInstant([arm], { angleRad: [th], rateRadS: [w], accelRadS2: [0] }, { gravityMS2: g });
      const [fx, fy] = r.joints[0].forceN;
      // Take the weight out; what is left turns with the arm, pointing inward along it.
      const rx = fx;
      const ry = fy - 17_500 * g;
      expect(Math.hypot(rx, ry)).toBeCloseTo(expected, 6);
      expect((rx * Math.cos(th) + ry * Math.sin(th)) / expected).toBeCloseTo(-1, 12);
    }
    expect(expected / 1000).toBeCloseTo(28.4, 1);
  });
});

describe('pendulum swing released at 110° (domain notes, illustrative magnitudes: own calculation)', () => {
  it('loads the pivot with about 3.4 × static and gives riders about 3.9 g at the bottom', () => {
    // Invented ride: 15 m uniform arm of 6 t with a 10 t gondola at its end.
    const arm: ChainBody = {
      name: 'swing',
      massKg: 16_000,
      cgM: [(6000 * 7.5 + 10_000 * 15) / 16_000, 0],
      inertiaCgKgM2: 0,
    };
    const iO = (6000 * 15 ** 2) / 3 + 10_000 * 15 ** 2;
    arm.inertiaCgKgM2 = iO - 16_000 * arm.cgM[0] ** 2;
    const chain = createChain([arm], g);
    const release = -Math.PI / 2 + (110 * Math.PI) / 180;
    const start = chainEnergy(chain, [release], [0]).totalJ;
    // ω at the bottom from the energy balance, found with the engine's own energy function.
    const bottomPotential = chainEnergy(chain, [-Math.PI / 2], [0]).totalJ;
    const omega = Math.sqrt((2 * (start - bottomPotential)) / iO);
    const r = solveInstant(
      [arm],
      { angleRad: [-Math.PI / 2], rateRadS: [omega], accelRadS2: [0] },
      { gravityMS2: g },
    );
    expect(r.joints[0].forceMagnitudeN / (16_000 * g)).toBeCloseTo(3.4, 1);
    // The rider sits at the gondola's centre, head toward the pivot, passing the bottom at that speed.
    const cycle = analyseCycle({
      bodies: [arm],
      gravityMS2: g,
      profiles: [{ kind: 'constant', rpm: (omega * 60) / (2 * Math.PI), startAngleRad: -Math.PI / 2 }],
      durationS: 0.01,
      samples: 2,
      seats: [{ name: 'rider', body: 0, positionM: [15, 0], spineAngleRad: Math.PI }],
    });
    expect(cycle.seats[0].gz[0]).toBeCloseTo(3.9, 1);
    expect(cycle.seats[0].gx[0]).toBeCloseTo(0, 9);
  });
});
