import { z } from 'zod';

import { designDataSchema } from '@/features/registry/design-data';
import { rideSummarySchema } from '@/features/rides/schema';

/** A design-data version as the API returns it. Versions never change once made. */
export const designVersionSchema = z.object({
  id: z.string(),
  version: z.number().int(),
  createdAt: z.string(),
  createdByName: z.string().nullable(),
  reason: z.string(),
  data: designDataSchema,
});
export type DesignVersion = z.infer<typeof designVersionSchema>;

/** GET /api/rides/:id — the ride with its current design data (null before any is entered). */
export const rideDetailResponseSchema = z.object({
  ride: rideSummarySchema,
  design: designVersionSchema.nullable(),
});
export type RideDetail = z.infer<typeof rideDetailResponseSchema>;
