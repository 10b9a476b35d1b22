/**
 * Request and response shapes of the ride register API (rides, design data and its versions), shared by
 * the server's validation and the app's forms and API client. Pure zod: no React.
 */
import { z } from 'zod';

import { designDataSchema } from '@/features/registry/design-data';
import { rideSummarySchema } from '@/features/rides/schema';

export const designOrigins = ['editor', 'import_csv', 'import_json', 'seed'] as const;
export const designOriginSchema = z.enum(designOrigins);
export type DesignOrigin = z.infer<typeof designOriginSchema>;

/** One stored version of a ride's design data: who made it, when and why. Versions never change. */
export const designVersionSchema = z.object({
  id: z.string(),
  version: z.number().int().min(1),
  createdAt: z.string(),
  createdByName: z.string(),
  reason: z.string(),
  origin: designOriginSchema,
  data: designDataSchema,
});
export type DesignVersion = z.infer<typeof designVersionSchema>;

/**
 * `GET /api/rides/:id`: the ride as lists show it, and its current design data. `design` is null when the
 * ride has no design data yet, and always null for operators (they may not see design data).
 */
export const rideDetailResponseSchema = z.object({
  ride: rideSummarySchema,
  design: designVersionSchema.nullable(),
});
export type RideDetailResponse = z.infer<typeof rideDetailResponseSchema>;

export const rideIdParamsSchema = z.object({ id: z.string().trim().min(1, 'Required').max(64) });
