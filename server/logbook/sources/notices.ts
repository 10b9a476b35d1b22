/**
 * Notices issued to the ride's operator, and their acknowledgement: two entries per notice. An operator
 * sees only notices issued to their own company (a ride that changed hands keeps its earlier operator's
 * notices to them); staff see all.
 */
import { and, eq, or } from 'drizzle-orm';
import { alias } from 'drizzle-orm/sqlite-core';

import { notices } from '@/db/server/notices';
import { users } from '@/db/server/schema';
import type { LogbookEvent } from '@/features/logbook/schema';
import { noticeKindVocabulary, rideStatusVocabulary } from '@/lib/vocabulary';
import { everyone, inRange, lines, when, type LogbookSource } from '@/server/logbook/source';

const issuer = alias(users, 'logbook_issuer');
const acknowledger = alias(users, 'logbook_acknowledger');

export const noticesSource: LogbookSource = {
  kind: 'notice',
  shownTo: everyone,
  read: (db, q) => {
    const rows = db
      .select({
        id: notices.id,
        reference: notices.reference,
        kind: notices.kind,
        issuedAt: notices.issuedAt,
        issuerName: issuer.name,
        document: notices.document,
        acknowledgedAt: notices.acknowledgedAt,
        acknowledgerName: acknowledger.name,
      })
      .from(notices)
      .innerJoin(issuer, eq(issuer.id, notices.issuedBy))
      .leftJoin(acknowledger, eq(acknowledger.id, notices.acknowledgedBy))
      .where(
        and(
          eq(notices.rideId, q.rideId),
          q.viewer.role === 'operator' ? eq(notices.operatorCompanyId, q.viewer.companyId ?? '') : undefined,
          or(inRange(notices.issuedAt, q), inRange(notices.acknowledgedAt, q)),
        ),
      )
      .all();
    const inside = (at: string) => (!q.fromAt || at >= q.fromAt) && (!q.beforeAt || at < q.beforeAt);
    const out: LogbookEvent[] = [];
    for (const r of rows) {
      const word = `${noticeKindVocabulary[r.kind].label} ${r.reference}`;
      const link = { label: 'Open the notice', href: `/notices/${encodeURIComponent(r.id)}` };
      const pdf = {
        label: `${r.reference} (PDF)`,
        apiPath: `/api/notices/${encodeURIComponent(r.id)}/pdf`,
        fileName: `${r.reference}.pdf`,
      };
      const issued = when(r.issuedAt, q.zone);
      if (inside(issued.at)) {
        const status = r.document.operatingStatus;
        const findingsCount = r.document.findings.length;
        out.push({
          id: `notice:${r.id}`,
          rideId: q.rideId,
          ...issued,
          kind: 'notice',
          title: `${word} issued to ${r.document.operator.name}`,
          detail: lines(
            `Operating status: ${rideStatusVocabulary[status.status].label}${status.reason ? ` — ${status.reason}` : ''}`,
            findingsCount > 0 ? `${findingsCount} finding${findingsCount === 1 ? '' : 's'} listed` : null,
          ),
          who: r.issuerName,
          link,
          documents: [pdf],
        });
      }
      if (r.acknowledgedAt && inside(when(r.acknowledgedAt, q.zone).at))
        out.push({
          id: `notice-ack:${r.id}`,
          rideId: q.rideId,
          ...when(r.acknowledgedAt, q.zone),
          kind: 'notice',
          title: `${word} acknowledged`,
          detail: [],
          who: r.acknowledgerName,
          link,
          documents: [],
        });
    }
    return out;
  },
};
