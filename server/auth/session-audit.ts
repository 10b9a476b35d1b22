import { auditLog } from '@/db/server/schema';
import type { Db } from '@/server/db';

/**
 * Audit entries about sessions, written from server/auth (which sits below server/registry and its
 * `recordAudit`). The entity is always the person (`user`); for a failed sign-in the actor is unknown, so
 * `userId` stays null and the entity is the account tried (its id, or the e-mail when no account has it).
 */
export function recordSessionAudit(
  tx: Pick<Db, 'insert'>,
  entry: {
    userId: string | null;
    entityId: string;
    action: 'sign_out' | 'sign_in_failed';
    summary: string;
    after?: unknown;
  },
): void {
  tx.insert(auditLog)
    .values({
      userId: entry.userId,
      entity: 'user',
      entityId: entry.entityId,
      action: entry.action,
      summary: entry.summary,
      after: entry.after ?? null,
    })
    .run();
}
