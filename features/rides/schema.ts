import { z } from 'zod';

export const rideClasses = ['pendulum_swing', 'rotating_arm', 'wheel', 'swing_carousel', 'other'] as const;
export const rideClassSchema = z.enum(rideClasses);
export type RideClass = z.infer<typeof rideClassSchema>;

export const rideStatuses = ['in_service', 'restricted', 'out_of_service'] as const;
export const rideStatusSchema = z.enum(rideStatuses);

export const rideClassLabel: Record<RideClass, string> = {
  pendulum_swing: 'Pendulum swing',
  rotating_arm: 'Rotating arm',
  wheel: 'Wheel',
  swing_carousel: 'Swing carousel',
  other: 'Other rotating ride',
};

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
  operatorCompanyId: z.string(),
  operatorName: z.string(),
});
export type RideSummary = z.infer<typeof rideSummarySchema>;

export const rideListResponseSchema = z.object({ rides: z.array(rideSummarySchema) });
