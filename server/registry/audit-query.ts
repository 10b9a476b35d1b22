import { and, asc, count, desc, eq, gte, inArray, lte, sql } from 'drizzle-orm';

import { auditLog, users } from '@/db/server/schema';
import type { AuditListQuery } from '@/features/registry/schema';
import type { Db } from '@/server/db';
import { contains, offsetOf } from '@/server/registry/query';

/** Insertion order, for entries made within the same millisecond. */
export const auditRowOrder = sql`"audit_log"."rowid"`;

/** Audit entries in the shape the app reads (`AuditEntry`), with the author's name; the caller filters. */
export function auditEntryRows(db: Pick<Db, 'select'>) {
  return db
    .select({
      id: auditLog.id,
      at: auditLog.at,
      userId: auditLog.userId,
      userName: users.name,
      entity: auditLog.entity,
      entityId: auditLog.entityId,
      action: auditLog.action,
      rideId: auditLog.rideId,
      summary: auditLog.summary,
      before: auditLog.before,
      after: auditLog.after,
    })
    .from(auditLog)
    .leftJoin(users, eq(users.id, auditLog.userId));
}

/** One page of the audit log, newest first by default, with the author's name. */
export function listAudit(db: Pick<Db, 'select'>, query: AuditListQuery) {
  const where = and(
    query.entity?.length ? inArray(auditLog.entity, query.entity) : undefined,
    query.action?.length ? inArray(auditLog.action, query.action) : undefined,
    query.entityId ? eq(auditLog.entityId, query.entityId) : undefined,
    query.rideId ? eq(auditLog.rideId, query.rideId) : undefined,
    query.userId ? eq(auditLog.userId, query.userId) : undefined,
    query.from ? gte(auditLog.at, query.from) : undefined,
    query.to ? lte(auditLog.at, query.to) : undefined,
    query.q ? contains(auditLog.summary, query.q) : undefined,
  );
  const total = db.select({ n: count() }).from(auditLog).where(where).get()?.n ?? 0;
  const entries = auditEntryRows(db)
    .where(where)
    .orderBy(
      ...(query.sort === 'at'
        ? [asc(auditLog.at), asc(auditRowOrder)]
        : [desc(auditLog.at), desc(auditRowOrder)]),
    )
    .limit(query.pageSize)
    .offset(offsetOf(query))
    .all();
  return { entries, total, page: query.page, pageSize: query.pageSize };
}
