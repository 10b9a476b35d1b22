import type { ChainBody, CycleInput, MotionProfile } from '@/features/loads/engine';

/**
 * The invented three-body chain the benches and the cycle-route tests share: main arm, sub-arm, gondola,
 * each driven by its own profile (a ramp to 12 rpm held for 52 s, and two swings).
 */
export const THREE_BODIES: ChainBody[] = [
  { name: 'main arm', massKg: 8000, cgM: [3, 0.1], inertiaCgKgM2: 120_000, tipM: [12, 0] },
  { name: 'sub-arm', massKg: 1500, cgM: [1.2, -0.2], inertiaCgKgM2: 1500, tipM: [2.5, 0.3] },
  { name: 'gondola', massKg: 4000, cgM: [0, -1.5], inertiaCgKgM2: 6000 },
];

export const THREE_PROFILES: MotionProfile[] = [
  { kind: 'ramp', toRpm: 12, rampTimeS: 8, holdAfterS: 52 },
  { kind: 'swing', amplitudeRad: 0.6, periodS: 4.1 },
  { kind: 'swing', amplitudeRad: 0.3, periodS: 2.3, phaseRad: 1 },
];

/** The chain's whole cycle at `samples` instants, as the cycle route and `analyseCycle` take it. */
export const threeBodyCycle = (samples: number): CycleInput => ({
  bodies: THREE_BODIES,
  profiles: THREE_PROFILES,
  samples,
});
