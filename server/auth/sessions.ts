import { eq } from 'drizzle-orm';

import { users } from '@/db/server/schema';
import type { Db } from '@/server/db';

/**
 * Ends every session of one user: tokens issued before `at` are refused from the next request on
 * (server/auth/require-auth.ts compares the token's issue time with `users.tokens_valid_after`). Called by
 * sign-out, password change and reset, disabling, and a role or company change.
 *
 * The stamp keeps milliseconds, and so do tokens (a millisecond issue-time claim beside JWT's whole-second
 * `iat`): a sign-out followed by a new sign-in within the same second must end the old token and keep the new.
 */
export function endSessions(db: Pick<Db, 'update'>, userId: string, at: Date = new Date()): void {
  db.update(users).set({ tokensValidAfter: at.toISOString() }).where(eq(users.id, userId)).run();
}
