import { z } from 'zod';

// ——— small field builders ———

export const requiredText = (max: number) =>
  z.string({ error: 'Required' }).trim().min(1, 'Required').max(max, `At most ${max} characters`);

/** Optional text that may also be cleared: '' and null both store null. */
export const nullableText = (max: number) =>
  z
    .union([z.string().trim().max(max, `At most ${max} characters`), z.null()], {
      error: 'Must be text or null',
    })
    .transform((v) => (v === '' ? null : v));

export const email = () =>
  z
    .string({ error: 'Required' })
    .trim()
    .toLowerCase()
    .pipe(z.email({ error: 'Must be an e-mail address' }));

export const id = () => requiredText(64);

/** An ISO 8601 timestamp, stored as given in UTC. */
export const timestamp = () =>
  z
    .string({ error: 'Required' })
    .trim()
    .refine(
      (v) => /^\d{4}-\d{2}-\d{2}(T[\d:.]+(Z|[+-]\d{2}:?\d{2})?)?$/.test(v) && !Number.isNaN(Date.parse(v)),
      {
        message: 'Must be a date or date-time, e.g. 2025-05-01 or 2025-05-01T08:30:00Z',
      },
    )
    .transform((v) => new Date(v).toISOString());
