/**
 * The register's PATCH of a ride. It sits above the registry because a change of status in it goes
 * through the status rules (`assertPatchTransition`) and issues the operator's status notice.
 */
import { eq } from 'drizzle-orm';

import { rides } from '@/db/server/schema';
import type { RidePatch } from '@/features/registry/schema';
import type { RideSummary } from '@/features/rides/schema';
import type { Db } from '@/server/db';
import { issueStatusNotice } from '@/server/notices/issue';
import { queueDay, refreshQueue } from '@/server/queue/queue-refresh';
import { recordAudit } from '@/server/registry/audit';
import { assertOperatorCompany } from '@/server/registry/companies';
import { mustFindRide, statusFields } from '@/server/registry/rides';
import { assertSite } from '@/server/registry/sites';
import { assertPatchTransition } from '@/server/review/ride-status';

/**
 * Applies a partial change. A new status (or a new reason) starts a new "since" unless the request gives
 * one; setting the ride back in service clears the reason.
 */
export function updateRide(
  db: Db,
  userId: string,
  id: string,
  patch: RidePatch,
  now: Date,
  /** The app's public address, for the link in the operator's status notice. */
  appUrl: string,
): RideSummary {
  return db.transaction((tx) => {
    const before = mustFindRide(tx, id);
    if (patch.operatorCompanyId !== undefined) assertOperatorCompany(tx, patch.operatorCompanyId);
    if (patch.siteId) assertSite(tx, patch.siteId);
    const status = patch.status ?? before.status;
    const reason = patch.statusReason !== undefined ? patch.statusReason : before.statusReason;
    // Every change of status goes through the status rules; easing a stop is refused here (override).
    if (status !== before.status) assertPatchTransition(tx, userId, id, before.status, status, reason, now);
    // Correcting the reason's wording keeps the date; only a change of status starts a new period.
    const statusChanged = status !== before.status;
    const since =
      patch.statusSince ?? (statusChanged ? now.toISOString() : (before.statusSince ?? now.toISOString()));
    tx.update(rides)
      .set({
        ...(patch.name !== undefined && { name: patch.name }),
        ...(patch.rideClass !== undefined && { rideClass: patch.rideClass }),
        ...(patch.description !== undefined && { description: patch.description }),
        ...(patch.maker !== undefined && { maker: patch.maker }),
        ...(patch.model !== undefined && { model: patch.model }),
        ...(patch.serial !== undefined && { serial: patch.serial }),
        ...(patch.year !== undefined && { year: patch.year }),
        ...(patch.siteId !== undefined && { siteId: patch.siteId }),
        ...(patch.operatorCompanyId !== undefined && { operatorCompanyId: patch.operatorCompanyId }),
        ...statusFields(status, reason, since),
      })
      .where(eq(rides.id, id))
      .run();
    const after = mustFindRide(tx, id);
    const statusNote = after.status !== before.status ? ` (status ${before.status} → ${after.status})` : '';
    recordAudit(tx, {
      userId,
      entity: 'ride',
      entityId: id,
      action: 'update',
      rideId: id,
      summary: `Ride ${after.name} changed${statusNote}`,
      before,
      after,
    });
    // A change of operating status is the operator's business: it issues them a notice.
    if (after.status !== before.status)
      issueStatusNotice(tx, { rideId: id, userId, now, appUrl, reason: after.statusReason });
    // Name, class, status, site and operator are all shown and filtered on in the review queue.
    refreshQueue(tx, queueDay(db, now), [id]);
    return after;
  });
}
