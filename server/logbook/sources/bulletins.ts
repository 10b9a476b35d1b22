/**
 * Makers' bulletins on the ride: each record of one done (through an inspection's checklist, or by a
 * supervisor or administrator on the day they give) or found not done by an inspection. Whoever may read
 * the ride reads its bulletins' state (`GET /rides/:id/bulletins`), so everyone who sees the ride sees
 * these; the inspection itself is named, not linked (its review screen is the deciders'), and the link
 * leads an operator to the ride (the bulletin's own page is staff's).
 */
import { and, eq } from 'drizzle-orm';

import { bulletinActions, bulletins } from '@/db/server/bulletins';
import { users } from '@/db/server/schema';
import type { LogbookEvent } from '@/features/logbook/schema';
import { formatDate } from '@/lib/dates';
import { everyone, inRange, isOperator, lines, when, type LogbookSource } from '@/server/logbook/source';

export const bulletinsSource: LogbookSource = {
  kind: 'bulletin',
  shownTo: everyone,
  read: (db, q) =>
    db
      .select({
        id: bulletinActions.id,
        outcome: bulletinActions.outcome,
        on: bulletinActions.on,
        note: bulletinActions.note,
        inspectionId: bulletinActions.inspectionId,
        recordedAt: bulletinActions.recordedAt,
        byName: users.name,
        bulletinId: bulletins.id,
        maker: bulletins.maker,
        reference: bulletins.reference,
        title: bulletins.title,
      })
      .from(bulletinActions)
      .innerJoin(bulletins, eq(bulletins.id, bulletinActions.bulletinId))
      .leftJoin(users, eq(users.id, bulletinActions.byUserId))
      .where(and(eq(bulletinActions.rideId, q.rideId), inRange(bulletinActions.recordedAt, q)))
      .all()
      .map((r): LogbookEvent => ({
        id: `bulletin:${r.id}`,
        rideId: q.rideId,
        ...when(r.recordedAt, q.zone),
        kind: 'bulletin',
        title: `${r.maker} bulletin ${r.reference} ${r.outcome === 'done' ? 'recorded done' : 'found not done'}`,
        detail: lines(
          r.title,
          `${r.outcome === 'done' ? 'Done' : 'Found not done'} on ${formatDate(r.on)}${
            r.inspectionId ? ' at an inspection' : ', recorded without an inspection'
          }`,
          r.note ? `Note: ${r.note}` : null,
        ),
        who: r.byName,
        // The bulletin's page is staff's; an operator reads the ride's bulletins on the ride's page.
        link: isOperator(q.viewer)
          ? { label: 'Open the ride', href: `/rides/${encodeURIComponent(q.rideId)}` }
          : { label: 'Open the bulletin', href: `/register/bulletins/${encodeURIComponent(r.bulletinId)}` },
        documents: [],
      })),
};
