import { auditLog } from '@/db/server/schema';
import type { AuditAction, AuditEntity } from '@/features/registry/schema';
import type { Db } from '@/server/db';

type AuditEntry = {
  userId: string;
  entity: AuditEntity;
  entityId: string;
  action: AuditAction;
  rideId?: string | null;
  summary: string;
  before?: unknown;
  after?: unknown;
};

/**
 * Records one change. Call it inside the transaction that makes the change, so an entry exists exactly
 * when the change does.
 */
export function recordAudit(tx: Pick<Db, 'insert'>, entry: AuditEntry): void {
  tx.insert(auditLog)
    .values({
      userId: entry.userId,
      entity: entry.entity,
      entityId: entry.entityId,
      action: entry.action,
      rideId: entry.rideId ?? null,
      summary: entry.summary,
      before: entry.before ?? null,
      after: entry.after ?? null,
    })
    .run();
}
