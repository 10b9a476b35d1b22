import { auditLog } from '@/db/server/schema';
import type { AuditAction } from '@/features/registry/schema/audit';
import type { Db } from '@/server/db';

/**
 * Audit entries about people's accounts, written from server/auth (which sits below server/registry and
 * its `recordAudit`). The entity is always the person (`user`); the actor is the administrator, or the
 * person themselves for a password they chose. Call it inside the transaction that makes the change.
 */
export function recordPeopleAudit(
  tx: Pick<Db, 'insert'>,
  entry: {
    userId: string;
    entityId: string;
    action: Exclude<AuditAction, 'delete' | 'sign_out' | 'sign_in_failed'>;
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
