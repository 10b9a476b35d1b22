import { z } from 'zod';

import { labelsOf, rideClasses, rideClassVocabulary, rideStatuses } from '@/lib/vocabulary';

// Ride classes and statuses, their words and marks, are defined in the vocabulary.
export { rideClasses, rideStatuses };
export const rideClassSchema = z.enum(rideClasses);
export type RideClass = z.infer<typeof rideClassSchema>;

export const rideStatusSchema = z.enum(rideStatuses);

export const rideClassLabel = labelsOf(rideClassVocabulary);

/** One ride as lists show it (GET /api/rides). */
export const rideSummarySchema = z.object({
  id: z.string(),
  name: z.string(),
  rideClass: rideClassSchema,
  description: z.string().nullable(),
  maker: z.string().nullable(),
  model: z.string().nullable(),
  serial: z.string().nullable(),
  year: z.number().int().nullable(),
  status: rideStatusSchema,
  statusReason: z.string().nullable(),
  statusSince: z.string().nullable(),
  siteId: z.string().nullable(),
  siteName: z.string().nullable(),
  /**
   * The IANA zone the ride's days are counted in (its site's, else the inspection body's default). The
   * phone keeps it with the ride, so "today" and due dates follow the site's clock offline; absent in
   * copies cached before zones, which then use the phone's own zone.
   */
  siteTimeZone: z.string().optional(),
  operatorCompanyId: z.string(),
  operatorName: z.string(),
});
export type RideSummary = z.infer<typeof rideSummarySchema>;

export const rideListResponseSchema = z.object({ rides: z.array(rideSummarySchema) });
