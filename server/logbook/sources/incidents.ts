/**
 * Operators' incident reports: one entry when it happened (as reported), and a second when a supervisor
 * or administrator reviewed it, with their note. The logbook is already the viewer's ride (an operator's
 * company's only), and the report route serves everyone who may read the ride, so every role sees both.
 */
import { and, eq, or } from 'drizzle-orm';
import { alias } from 'drizzle-orm/sqlite-core';

import { incidents } from '@/db/server/incidents';
import { users } from '@/db/server/schema';
import type { LogbookEvent } from '@/features/logbook/schema';
import { incidentKindVocabulary } from '@/lib/vocabulary';
import { everyone, inRange, lines, when, type LogbookSource } from '@/server/logbook/source';

const reporter = alias(users, 'logbook_incident_reporter');
const reviewer = alias(users, 'logbook_incident_reviewer');

export const incidentsSource: LogbookSource = {
  kind: 'incident',
  shownTo: everyone,
  read: (db, q) => {
    const rows = db
      .select({
        id: incidents.id,
        kind: incidents.kind,
        occurredAt: incidents.occurredAt,
        what: incidents.what,
        ridersAffected: incidents.ridersAffected,
        anyoneHurt: incidents.anyoneHurt,
        stoppedRide: incidents.stoppedRide,
        photoShas: incidents.photoShas,
        reportedAt: incidents.reportedAt,
        reporterName: reporter.name,
        reviewedAt: incidents.reviewedAt,
        reviewNote: incidents.reviewNote,
        reviewerName: reviewer.name,
      })
      .from(incidents)
      .innerJoin(reporter, eq(reporter.id, incidents.reportedBy))
      .leftJoin(reviewer, eq(reviewer.id, incidents.reviewedBy))
      .where(
        and(
          eq(incidents.rideId, q.rideId),
          or(inRange(incidents.occurredAt, q), inRange(incidents.reviewedAt, q)),
        ),
      )
      .all();
    const inside = (at: string) => (!q.fromAt || at >= q.fromAt) && (!q.beforeAt || at < q.beforeAt);
    const out: LogbookEvent[] = [];
    for (const r of rows) {
      const word = incidentKindVocabulary[r.kind].label;
      const link = { label: 'Open the incident report', href: `/incidents/${encodeURIComponent(r.id)}` };
      const happened = when(r.occurredAt, q.zone);
      if (inside(happened.at))
        out.push({
          id: `incident:${r.id}`,
          rideId: q.rideId,
          ...happened,
          kind: 'incident',
          title: `${word} reported`,
          detail: lines(
            r.what,
            `${r.ridersAffected} rider${r.ridersAffected === 1 ? '' : 's'} affected; ${r.anyoneHurt ? 'someone was hurt' : 'nobody hurt'}`,
            r.stoppedRide ? 'The reporter took the ride out of service' : null,
            r.photoShas.length > 0
              ? `${r.photoShas.length} photo${r.photoShas.length === 1 ? '' : 's'}`
              : null,
            `Reported ${when(r.reportedAt, q.zone).day}`,
          ),
          who: r.reporterName,
          link,
          documents: [],
        });
      if (r.reviewedAt && inside(when(r.reviewedAt, q.zone).at))
        out.push({
          id: `incident-review:${r.id}`,
          rideId: q.rideId,
          ...when(r.reviewedAt, q.zone),
          kind: 'incident',
          title: `${word} report reviewed`,
          detail: lines(r.reviewNote ? `Note: ${r.reviewNote}` : null, `Happened ${happened.day}`),
          who: r.reviewerName,
          link,
          documents: [],
        });
    }
    return out;
  },
};
