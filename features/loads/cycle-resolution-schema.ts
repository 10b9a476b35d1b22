/**
 * How much of a ride cycle's series an HTTP answer carries (`POST /api/loads/cycle`,
 * `GET /api/inspections/:id/cycle`): by default a bounded set of instants that keeps every series' peaks
 * and troughs exactly (features/loads/engine/decimate.ts); `?resolution=full` asks for every sample, which
 * the server allows up to a cap and otherwise refuses with a 400 naming `query.resolution`.
 */
import { z } from 'zod';

export const CYCLE_RESOLUTIONS = ['bounded', 'full'] as const;
export type CycleResolution = (typeof CYCLE_RESOLUTIONS)[number];

export const cycleQuerySchema = z.object({
  resolution: z
    .enum(CYCLE_RESOLUTIONS, { error: `Must be one of: ${CYCLE_RESOLUTIONS.join(', ')}` })
    .default('bounded'),
});

/**
 * What the answer adds to the engine's cycle result: `resolution` says whether every sample is there;
 * when not, `sampleIndex` gives each kept instant's index in the full analysis (`samples` long), which is
 * also what the peaks' `index` fields count in.
 */
export type CycleSeriesFields = { resolution: CycleResolution; sampleIndex?: number[] };
