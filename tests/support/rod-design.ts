import type { DesignData } from '@/features/loads/design-schema';

/**
 * A uniform slender rod pinned at one end, as design data: the textbook body whose pin force when
 * driven at constant speed is m·g + m·ω²·L/2 (standard rigid-body result). Shared by the engine and
 * server tests of the readings-to-load-check path.
 */
export function rodDesign(massKg: number, lengthM: number, document = 'Test rod'): DesignData {
  return {
    source: { document, revision: 'A' },
    bodies: [{ name: 'Rod' }],
    parts: [{ kind: 'rod', body: 0, name: 'Rod', massKg, fromM: [0, 0], toM: [lengthM, 0] }],
    pivots: [
      {
        joint: 0,
        name: 'Main pivot',
        shear: 'double',
        bearingLengthM: 0.05,
        nominalDiameterM: 0.06,
        minimumDiameterM: 0.058,
        maxClearanceM: 0.0005,
        maxForceN: 20_000,
      },
    ],
    seats: [],
    motion: [{ joint: 0, kind: 'constant', rpm: 6, maxRateRadS: 2 }],
    rider: {},
  };
}
