import { z } from 'zod';

import { sessionUserSchema } from '@/features/session/schema';

/** What the device keeps between launches: the token and the last known user (for offline starts). */
export const storedSessionSchema = z.object({
  token: z.string(),
  expiresAt: z.string(),
  user: sessionUserSchema,
});
export type StoredSession = z.infer<typeof storedSessionSchema>;

export function parseStoredSession(raw: string | null): StoredSession | null {
  if (!raw) return null;
  try {
    const parsed = storedSessionSchema.safeParse(JSON.parse(raw));
    return parsed.success ? parsed.data : null;
  } catch {
    return null;
  }
}
