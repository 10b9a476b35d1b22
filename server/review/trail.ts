/**
 * An inspection's trail for the review desk: what was decided on it and on its findings, and what changed
 * on its ride since it was submitted (status, design data, schedules), newest first, in the audit log's
 * own shape.
 */
import { and, desc, eq, gte, notInArray, or, sql } from 'drizzle-orm';

import { auditLog } from '@/db/server/schema';
import type { AuditEntry } from '@/features/registry/schema';
import type { Db } from '@/server/db';
import { auditEntryRows, auditRowOrder } from '@/server/registry/audit-query';
import type { InspectionHead } from '@/server/findings/findings';

/** Far more than one inspection's decisions and a ride's changes over its review period. */
const TRAIL_LIMIT = 500;

export function inspectionTrail(db: Pick<Db, 'select'>, inspection: InspectionHead): AuditEntry[] {
  // The phone may send its time with an offset; the audit log is in UTC.
  const submittedAt = new Date(inspection.submittedAt).toISOString();
  return auditEntryRows(db)
    .where(
      or(
        and(eq(auditLog.entity, 'inspection'), eq(auditLog.entityId, inspection.id)),
        // A finding's entries carry its inspection in the record they keep (deleted ones included).
        and(
          eq(auditLog.rideId, inspection.rideId),
          eq(auditLog.entity, 'finding'),
          sql`json_extract(coalesce(${auditLog.after}, ${auditLog.before}), '$.inspectionId') = ${inspection.id}`,
        ),
        and(
          eq(auditLog.rideId, inspection.rideId),
          notInArray(auditLog.entity, ['inspection', 'finding']),
          gte(auditLog.at, submittedAt),
        ),
      ),
    )
    .orderBy(desc(auditLog.at), desc(auditRowOrder))
    .limit(TRAIL_LIMIT)
    .all();
}
