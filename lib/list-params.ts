/**
 * A list's query as the API reads it and the app writes it: paging, sort and search parameters (zod,
 * shared by the server's validation and the app), and the query string built from them.
 */
import { z } from 'zod';

/** Page and size for every paged list; pages count from 1. */
export const pagingQuerySchema = z.object({
  page: z.coerce.number({ error: 'Must be a whole number' }).int('Must be a whole number').min(1).default(1),
  pageSize: z.coerce
    .number({ error: 'Must be a whole number' })
    .int('Must be a whole number')
    .min(1)
    .max(200, 'At most 200')
    .default(50),
});
export const pageSchema = z.object({
  total: z.number().int(),
  page: z.number().int(),
  pageSize: z.number().int(),
});

/** `?sort=name` or `?sort=-name` (descending) from a fixed list of keys. */
export function sortQuery<const K extends string>(keys: readonly K[]) {
  const values = [...keys, ...keys.map((k) => `-${k}` as const)] as [K | `-${K}`, ...(K | `-${K}`)[]];
  return z.enum(values, {
    error: `One of ${keys.join(', ')}, each optionally with a leading - (descending)`,
  });
}

/** A free-text search term; blank counts as none. */
export const searchQuery = () =>
  z
    .string()
    .trim()
    .max(100, 'At most 100 characters')
    .optional()
    .transform((v) => (v ? v : undefined));

/** Query parameters as the API reads them; empty values are left out so keys stay stable. */
export type QueryParams = Record<string, string | number | readonly string[] | undefined | null>;

export function toSearch(params: QueryParams): string {
  const search = new URLSearchParams();
  for (const [key, value] of Object.entries(params)) {
    if (value === undefined || value === null || value === '') continue;
    if (Array.isArray(value)) {
      if (value.length > 0) search.set(key, value.join(','));
    } else search.set(key, String(value));
  }
  const text = search.toString();
  return text ? `?${text}` : '';
}

/** Drops empty values so two equal queries make the same cache key whatever their spelling. */
export function clean(params: QueryParams): QueryParams {
  return Object.fromEntries(
    Object.entries(params).filter(
      ([, v]) => v !== undefined && v !== null && v !== '' && !(Array.isArray(v) && v.length === 0),
    ),
  );
}
