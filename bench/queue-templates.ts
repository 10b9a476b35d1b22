/**
 * One real analysis per demo design for the review-queue bench: the engine's result on bench readings,
 * stored as JSON once per status so the seed can give the queue its mix without running the engine
 * 20,000 times.
 */
import { benchReadings } from '@/bench/readings';
import type { DesignData } from '@/features/loads/design-schema';
import { analyseInspection, previewOf } from '@/features/records/analysis';
import type { InspectionRecord } from '@/features/records/schema';
import { rideClasses, type RideClass } from '@/features/rides/schema';
import { demoDesigns } from '@/server/seed/demo-design';
import { demoRides } from '@/server/seed/demo';
import { ANALYSIS_SAMPLES, summariseAnalysis } from '@/server/sync/analysis';

/** Readings per bench inspection. */
export const READINGS_PER = 10;

export type Template = {
  design: DesignData;
  designJson: string;
  preview: InspectionRecord['preview'];
  /** The stored analysis as JSON per status, with DESIGN_ID where the inspection's design version goes. */
  analysis: Record<'within' | 'near' | 'over', string>;
};
export const DESIGN_ID = '@@design-version@@';

export function templates(): Map<RideClass, Template[]> {
  const byClass = new Map<RideClass, Template[]>();
  for (const ride of demoRides) {
    const design = demoDesigns[ride.serial];
    if (!design) continue;
    const readings = benchReadings(design, '2026-01-01T08:00:00.000Z', 0, READINGS_PER);
    const result = analyseInspection(design, readings, ANALYSIS_SAMPLES);
    const preview = previewOf(result);
    const stored = summariseAnalysis(result, { id: DESIGN_ID, version: 1 }, preview);
    // The engine's real result for the design; the worst status is relabelled to give the queue its mix.
    const as = (status: 'within' | 'near' | 'over') =>
      JSON.stringify({ ...stored, status, server: { ...stored.server, status } });
    const t: Template = {
      design,
      designJson: JSON.stringify(design),
      preview,
      analysis: { within: as('within'), near: as('near'), over: as('over') },
    };
    byClass.set(ride.rideClass, [...(byClass.get(ride.rideClass) ?? []), t]);
  }
  const all = [...byClass.values()].flat();
  for (const c of rideClasses) if (!byClass.has(c)) byClass.set(c, all);
  return byClass;
}
