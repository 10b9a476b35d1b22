/**
 * The chain drawing's geometry: where parts, pivots, CGs and seats land at a pose. Expected positions are
 * worked by hand from the frame rules of features/loads/README.md (body i's frame at its inboard pivot,
 * x-axis turned by θ_i = q_0 + … + q_i; a point p goes to origin + R(θ)·p with R = [[cos, −sin], [sin, cos]]).
 */
import { chainLayout, designPose, fitToView, niceLength, peakPose } from '@/features/registry/chain-geometry';
import type { DesignData } from '@/features/loads/design-schema';
import { analyseCycle } from '@/features/loads/engine';
import { designToCycleInput } from '@/features/loads/design-schema';
import { skylarkDesign } from '@/server/seed/demo-design';

/** A two-body test chain (round numbers, not a ride): a 14 m arm carrying a 6 m sub-arm. */
const twoBody: DesignData = {
  source: { document: 'Test chain', revision: '1' },
  bodies: [{ name: 'Arm', tipM: [14, 0] }, { name: 'Sub-arm' }],
  parts: [
    { kind: 'rod', body: 0, name: 'Arm girder', massKg: 9000, fromM: [-7, 0], toM: [14, 0] },
    { kind: 'rod', body: 1, name: 'Sub-arm beam', massKg: 1800, fromM: [-2, 0], toM: [4, 0] },
    { kind: 'point', body: 1, name: 'Gondola', massKg: 600, atM: [4, 0] },
    { kind: 'plate', body: 0, name: 'Platform', massKg: 500, centreM: [0, -6.3], widthM: 3.2, heightM: 1.2 },
  ],
  pivots: [
    {
      joint: 0,
      name: 'Main pivot',
      shear: 'double',
      bearingLengthM: 0.3,
      nominalDiameterM: 0.12,
      minimumDiameterM: 0.119,
      maxClearanceM: 0.0005,
    },
    {
      joint: 1,
      name: 'Sub-arm pivot',
      shear: 'single',
      bearingLengthM: 0.2,
      nominalDiameterM: 0.08,
      minimumDiameterM: 0.079,
      maxClearanceM: 0.0004,
    },
  ],
  seats: [{ body: 1, name: 'Seat A', positionM: [4, -0.9], spineAngleRad: Math.PI / 2 }],
  motion: [
    { joint: 0, kind: 'constant', rpm: 6 },
    { joint: 1, kind: 'fixed', angleRad: -Math.PI / 2 },
  ],
  rider: {},
};

const close = (actual: readonly number[], expected: readonly number[]) => {
  expect(actual).toHaveLength(expected.length);
  actual.forEach((v, i) => expect(v).toBeCloseTo(expected[i], 9));
};

describe('chainLayout at a pose', () => {
  // Arm straight up (q0 = 90°), sub-arm turned back to horizontal (q1 = −90°, so θ1 = 0).
  const layout = chainLayout(twoBody, [Math.PI / 2, -Math.PI / 2]);

  test('pivots: the ground pivot at the origin, the second at the arm tip turned 90° (0, 14)', () => {
    close(layout.pivots[0].at, [0, 0]);
    close(layout.pivots[1].at, [0, 14]);
    expect(layout.pivots.map((p) => p.name)).toEqual(['Main pivot', 'Sub-arm pivot']);
  });

  test('rods: (−7, 0)→(14, 0) on the arm becomes (0, −7)→(0, 14); the sub-arm beam sits at y = 14', () => {
    const [arm, beam] = layout.shapes.filter((s) => s.kind === 'segment');
    if (arm.kind !== 'segment' || beam.kind !== 'segment') throw new Error('segments expected');
    close(arm.from, [0, -7]);
    close(arm.to, [0, 14]);
    close(beam.from, [-2, 14]);
    close(beam.to, [4, 14]);
  });

  test('CGs: the sub-arm’s is (1800·1 + 600·4)/2400 = 1.75 m out along its x-axis', () => {
    // Arm: girder (9000 kg, midpoint (3.5, 0)) and platform (500 kg at (0, −6.3)):
    // x = 9000·3.5/9500 = 3.315789…, y = 500·(−6.3)/9500 = −0.331578…; turned 90°: (0.331578…, 3.315789…).
    close(layout.bodies[0].cg, [0.3315789473684, 3.3157894736842]);
    close(layout.bodies[1].cg, [1.75, 14]);
    expect(layout.bodies[1].massKg).toBe(2400);
  });

  test('a point mass and a seat move with their body; the seat’s spine turns with it', () => {
    const gondola = layout.shapes.find((s) => s.name === 'Gondola');
    if (gondola?.kind !== 'mass') throw new Error('mass expected');
    close(gondola.at, [4, 14]);
    close(layout.seats[0].at, [4, 13.1]);
    close(layout.seats[0].spine, [0, 1]);
  });

  test('plate corners turn with the body: 30° about the ground pivot', () => {
    const turned = chainLayout(twoBody, [Math.PI / 6, 0]);
    const plate = turned.shapes.find((s) => s.name === 'Platform');
    if (plate?.kind !== 'rect') throw new Error('rect expected');
    // cos 30° = 0.8660254038, sin 30° = 0.5.
    // Corner (−1.6, −6.9): x = −1.6·cos30 + 6.9·sin30 = −1.3856406461 + 3.45 = 2.0643593539;
    //                      y = −1.6·sin30 − 6.9·cos30 = −0.8 − 5.9755752862 = −6.7755752862.
    close(plate.corners[0], [2.0643593539, -6.7755752862]);
    // Corner (1.6, −5.7): x = 1.3856406461 + 2.85 = 4.2356406461; y = 0.8 − 4.9363448017 = −4.1363448017.
    close(plate.corners[2], [4.2356406461, -4.1363448017]);
  });

  test('bounds hold every part, pivot, CG and seat', () => {
    // Turning 90° maps (x, y) to (−y, x): the platform's corners (±1.6, −6.9…−5.7) land at x 5.7…6.9;
    // the arm runs from y = −7 to 14; the sub-arm beam starts at x = −2.
    close(
      [layout.bounds.minX, layout.bounds.maxX, layout.bounds.minY, layout.bounds.maxY],
      [-2, 6.9, -7, 14],
    );
  });
});

describe('design pose', () => {
  test('steady rotation and swings start at 0, a held joint at its set angle', () => {
    expect(designPose(twoBody)).toEqual([0, -Math.PI / 2]);
  });

  test('Skylark (demo) hangs straight down: gondola pivot 15 m below the main pivot, counterweight above', () => {
    const layout = chainLayout(skylarkDesign, designPose(skylarkDesign));
    close(layout.pivots[1].at, [0, -15]);
    const cw = layout.shapes.find((s) => s.name === 'Counterweight');
    if (cw?.kind !== 'rect') throw new Error('rect expected');
    // Centre (0, 3.2), 2.4 × 1.2: corners from (−1.2, 2.6) to (1.2, 3.8).
    close(cw.corners[0], [-1.2, 2.6]);
    close(cw.corners[2], [1.2, 3.8]);
    // The gondola's custom part sits at its CG, 0.6 m below the slewing bearing.
    const ring = layout.shapes.find((s) => s.name === 'Gondola ring and seats');
    if (ring?.kind !== 'mass') throw new Error('mass expected');
    close(ring.at, [0, -15.6]);
  });

  test('the peak pose is the chain’s angles at the instant of the main pivot’s peak force', () => {
    const result = analyseCycle(designToCycleInput(skylarkDesign));
    const k = result.joints[0].peakForce.index;
    expect(peakPose(result)).toEqual([result.joints[0].angleRad[k], result.joints[1].angleRad[k]]);
  });
});

describe('fitting to the view', () => {
  test('one scale on both axes, centred, y pointing down', () => {
    // 20 m × 10 m into 420 × 220 px with 10 px padding: min(400/20, 200/10) = 20 px/m.
    const fit = fitToView({ minX: -10, maxX: 10, minY: -5, maxY: 5 }, 420, 220, 10);
    expect(fit.scale).toBe(20);
    expect(fit.toScreen([0, 0])).toEqual([210, 110]);
    expect(fit.toScreen([10, 5])).toEqual([410, 10]);
    expect(fit.toScreen([-10, -5])).toEqual([10, 210]);
  });

  test('the narrower direction sets the scale and the other is centred', () => {
    // 10 m × 10 m into 420 × 220: min(400/10, 200/10) = 20 px/m; x spans 200 px centred on 210.
    const fit = fitToView({ minX: 0, maxX: 10, minY: 0, maxY: 10 }, 420, 220, 10);
    expect(fit.scale).toBe(20);
    expect(fit.toScreen([0, 10])).toEqual([110, 10]);
  });

  test('scale bar lengths are 1, 2 or 5 × 10ⁿ', () => {
    expect(niceLength(3.7)).toBe(5);
    expect(niceLength(2.9)).toBe(2);
    expect(niceLength(12)).toBe(10);
    expect(niceLength(0.8)).toBe(1);
    expect(niceLength(0.004)).toBeCloseTo(0.005, 12);
  });
});
