import { auditLog } from '@/db/server/schema';
import type { AuditAction } from '@/features/registry/schema/audit';
import type { Db } from '@/server/db';

/**
 * Audit entries about people's accounts and sessions, written from server/auth (which sits below
 * server/registry and its `recordAudit`). The entity is always the person (`user`). The actor is the
 * administrator, or the person themselves (a password they chose, a sign-out); for a failed sign-in it is
 * unknown, so `userId` stays null and the entity is the account tried (its id, or the e-mail when no account
 * has it). Call it inside the transaction that makes the change.
 */
export function recordUserAudit(
  tx: Pick<Db, 'insert'>,
  entry: {
    userId: string | null;
    entityId: string;
    action: Exclude<AuditAction, 'delete'>;
    summary: string;
    before?: unknown;
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
      before: entry.before ?? null,
      after: entry.after ?? null,
    })
    .run();
}
