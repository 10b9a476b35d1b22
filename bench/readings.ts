import { randomUUID } from 'node:crypto';

import type { Reading } from '@/features/records/schema';
import type { DesignData } from '@/features/loads/design-schema';

/**
 * The readings of one bench inspection: the main arm's speed (or the swing's period), varied a little by
 * `i`, then brake gaps up to `count` readings in all, every one taken at `taken`.
 */
export function benchReadings(design: DesignData, taken: string, i: number, count: number): Reading[] {
  const motion = design.motion.find((m) => m.joint === 0);
  const first: Reading =
    motion?.kind === 'swing'
      ? {
          id: randomUUID(),
          kind: 'period',
          joint: 0,
          label: 'Swing period',
          valueSI: (motion.periodS ?? 8) * (1 + (i % 9) / 200),
          unit: 's',
          method: 'tap_timer',
          spreadSI: 0.05,
          takenAt: taken,
        }
      : {
          id: randomUUID(),
          kind: 'speed',
          joint: 0,
          label: 'Arm speed',
          // Near the design speed (rad/s), as a real reading is: one far from it would need confirming.
          valueSI: ((Math.abs(motion?.rpm ?? 10) * 2 * Math.PI) / 60) * (1 + (i % 9) / 200),
          unit: 'rpm',
          method: 'tap_timer',
          spreadSI: 0.004,
          takenAt: taken,
        };
  const rest = Array.from({ length: count - 1 }, (_, k): Reading => ({
    id: randomUUID(),
    kind: 'other',
    joint: null,
    label: `Brake gap ${k + 1}`,
    valueSI: 0.002 + k * 1e-5,
    unit: 'mm',
    method: 'gauge',
    takenAt: taken,
  }));
  return [first, ...rest];
}
