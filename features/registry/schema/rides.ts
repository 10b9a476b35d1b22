import { id, nullableText, requiredText, timestamp } from '@/features/registry/schema/fields';
import { pageSchema, pagingQuerySchema, searchQuery, sortQuery } from '@/lib/list-params';
import {
  rideClassSchema,
  rideClasses,
  rideStatusSchema,
  rideStatuses,
  rideSummarySchema,
} from '@/features/rides/schema';
import { z } from 'zod';

// ——— rides ———

const year = () =>
  z
    .number({ error: 'Must be a year' })
    .int('Must be a year')
    .min(1850, 'Must be 1850 or later')
    .max(2100, 'Must be 2100 or earlier');

/**
 * POST /api/rides. A ride that is restricted or out of service must say why (the operator's notice would
 * be empty otherwise); in service clears the reason. `statusSince` defaults to now when the status is set
 * or changed.
 */
export const rideInputSchema = z.object({
  name: requiredText(80),
  rideClass: rideClassSchema,
  description: nullableText(200).optional(),
  maker: nullableText(120).optional(),
  model: nullableText(80).optional(),
  serial: nullableText(80).optional(),
  year: year().nullable().optional(),
  siteId: z.union([id(), z.null()]).optional(),
  operatorCompanyId: id(),
  status: rideStatusSchema.optional(),
  statusReason: nullableText(500).optional(),
  statusSince: timestamp().optional(),
});
export type RideInput = z.output<typeof rideInputSchema>;
/** PATCH /api/rides/:id: any subset; the status rule is checked on the ride as it would become. */
export const ridePatchSchema = rideInputSchema.partial();
export type RidePatch = z.output<typeof ridePatchSchema>;

export const rideResponseSchema = z.object({ ride: rideSummarySchema });

/** Several values of one filter, as `?status=a,b` or `?status=a&status=b`. */
export function listOf<const T extends string>(values: readonly T[]) {
  const one = z.enum(values as [T, ...T[]], { error: `One of ${values.join(', ')}` });
  return z.preprocess(
    (v) => (Array.isArray(v) ? v.join(',') : v),
    z
      .string()
      .transform((v) =>
        v
          .split(',')
          .map((s) => s.trim())
          .filter(Boolean),
      )
      .pipe(z.array(one)),
  );
}

export const rideSortKeys = [
  'name',
  'status',
  'rideClass',
  'operator',
  'site',
  'maker',
  'year',
  'statusSince',
] as const;
export type RideSortKey = (typeof rideSortKeys)[number];

/**
 * `GET /api/rides` query. Without `sort` the list comes by operator, then name. `q` searches name, maker,
 * model, serial, site and operator.
 */
export const rideListQuerySchema = pagingQuerySchema.extend({
  q: searchQuery(),
  status: listOf(rideStatuses).optional(),
  rideClass: listOf(rideClasses).optional(),
  siteId: z.string().trim().min(1).optional(),
  operatorId: z.string().trim().min(1).optional(),
  sort: sortQuery(rideSortKeys).optional(),
});
export type RideListQuery = z.output<typeof rideListQuerySchema>;

/** `GET /api/rides`: `rides` keeps the list item shape of `rideListResponseSchema`, plus the page. */
export const rideListPageSchema = pageSchema.extend({ rides: z.array(rideSummarySchema) });
export type RideListPage = z.infer<typeof rideListPageSchema>;

export const idParamsSchema = z.object({ id: id() });
