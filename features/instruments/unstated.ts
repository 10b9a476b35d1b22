import type { DraftProblem, Reading } from '@/features/records/schema';

/**
 * Readings whose method the app filled in before inspectors were asked: recorded without an instrument
 * answer (the key is absent, not null) and not timed with the tap timer. A draft started on an older app
 * version, or a correction of a record made then, may hold them; they cannot go out as if the inspector
 * had said how they were measured.
 */
export function unstatedMethodProblems(readings: readonly Reading[]): DraftProblem[] {
  return readings
    .filter((r) => r.instrument === undefined && r.method !== 'tap_timer')
    .map((r) => ({
      itemId: null,
      message: `How was “${r.label}” measured? Remove it under Readings and add it again, choosing the method and instrument`,
    }));
}
