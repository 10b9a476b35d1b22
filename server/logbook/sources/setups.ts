/**
 * A travelling ride's set-ups: one entry per change of state (planned, built, cleared, pulled down), at
 * which site and event, with who made it and their note. Set-ups are read by whoever may read the ride
 * (an operator: their own company's rides, which the logbook already is).
 */
import { and, eq } from 'drizzle-orm';

import { setupChanges, setups, siteEvents } from '@/db/server/setups';
import { sites, users } from '@/db/server/schema';
import type { LogbookEvent } from '@/features/logbook/schema';
import { formatDate } from '@/lib/dates';
import { setupStateVocabulary, type SetupState } from '@/lib/vocabulary';
import { everyone, inRange, lines, when, type LogbookSource } from '@/server/logbook/source';

const titles: Record<SetupState, string> = {
  planned: 'Set-up planned',
  set_up: 'Built at the site, awaiting its set-up inspection',
  cleared: 'Set-up cleared to run',
  pulled_down: 'Pulled down',
};

export const setupsSource: LogbookSource = {
  kind: 'setup',
  shownTo: everyone,
  read: (db, q) =>
    db
      .select({
        id: setupChanges.id,
        at: setupChanges.at,
        fromState: setupChanges.fromState,
        toState: setupChanges.toState,
        note: setupChanges.note,
        byName: users.name,
        fromDate: setups.fromDate,
        toDate: setups.toDate,
        pitch: setups.pitch,
        siteName: sites.name,
        eventName: siteEvents.name,
      })
      .from(setupChanges)
      .innerJoin(setups, eq(setups.id, setupChanges.setupId))
      .innerJoin(sites, eq(sites.id, setups.siteId))
      .leftJoin(siteEvents, eq(siteEvents.id, setups.eventId))
      .leftJoin(users, eq(users.id, setupChanges.byUser))
      .where(and(eq(setups.rideId, q.rideId), inRange(setupChanges.at, q)))
      .all()
      .map((r): LogbookEvent => ({
        id: `setup:${r.id}`,
        rideId: q.rideId,
        ...when(r.at, q.zone),
        kind: 'setup',
        title: `${titles[r.toState]} at ${r.siteName}${r.eventName ? ` for ${r.eventName}` : ''}`,
        detail: lines(
          `From ${formatDate(r.fromDate)} to ${formatDate(r.toDate)}${r.pitch ? `, ${r.pitch}` : ''}`,
          r.fromState
            ? `${setupStateVocabulary[r.fromState].label} → ${setupStateVocabulary[r.toState].label}`
            : null,
          r.note ? `Note: ${r.note}` : null,
        ),
        who: r.byName,
        link: { label: 'Open the ride', href: `/rides/${encodeURIComponent(q.rideId)}` },
        documents: [],
      })),
};
