/**
 * Incident reports over HTTP (issue #19): an operator reports on their own company's ride, bad input is
 * refused with each field named and nothing stored, operators never reach another company's rides or
 * reports, a report may stop the ride (status rules' `incident_stop`) and book its follow-up, the operator
 * cannot restart it, and the supervisor sees open reports in the review queue and closes them.
 *
 * Times: the report's site-clock stamps are checked against the IANA zone rules through Intl's own
 * formatter (`Intl.DateTimeFormat` with `timeZone`), not through the app's date helpers.
 */
import { and, eq } from 'drizzle-orm';

import { incidents } from '@/db/server/incidents';
import { rideStatusChanges, reviewQueue } from '@/db/server/review';
import { auditLog, inspectionSchedules, rides } from '@/db/server/schema';
import {
  incidentCreatedSchema,
  incidentSchema,
  rideIncidentsResponseSchema,
} from '@/features/incidents/schema';
import { queueResponseSchema } from '@/features/review/schema';
import { rideListPageSchema } from '@/features/registry/schema';
import { listIncidentsForRide } from '@/server/incidents/incidents';
import { refreshQueue } from '@/server/queue/queue-refresh';
import { rideTimeZone } from '@/server/schedule-due';
import { sqliteOf } from '@/server/sqlite-client';

import { expectApiError, signInAs, type TestServer } from './helpers';
import { photoPng } from './notices-fixtures';
import { demoClients, makePinnedServer, type Clients } from './registry-helpers';
import request from 'supertest';
import { createHash } from 'node:crypto';

const now = new Date('2026-06-15T10:00:00Z');
let server: TestServer;
let api: Clients;
let rideIds: Map<string, string>;

beforeAll(async () => {
  server = await makePinnedServer(now);
  api = await demoClients(server.app);
  const list = rideListPageSchema.parse((await api.admin.get('/api/rides?pageSize=50')).body).rides;
  rideIds = new Map(list.map((r) => [r.name, r.id]));
  // The queue as a read at this clock rebuilds it, so every later write is compared with a rebuild.
  refreshQueue(server.db, now.toISOString());
}, 60_000);
afterAll(() => server.close());

// Tamsworth Pier Leisure (operator@) runs Twin Comet; Corvane Travelling Shows (operator2@) runs Tidebreaker.
const ownRide = () => rideIds.get('Twin Comet')!;
const otherRide = () => rideIds.get('Tidebreaker')!;
const url = (rideId: string) => `/api/rides/${rideId}/incidents`;

const rowsOf = (rideId: string) =>
  server.db.select().from(incidents).where(eq(incidents.rideId, rideId)).all();
const allQueueRows = () =>
  sqliteOf(server.db).prepare('SELECT * FROM review_queue ORDER BY key').all() as Record<string, unknown>[];

/** The site-clock wall time of an instant by Intl's own zone rules, "YYYY-MM-DDTHH:MM". */
function intlLocal(at: string, zone: string): string {
  const parts = Object.fromEntries(
    new Intl.DateTimeFormat('en-GB', {
      timeZone: zone,
      year: 'numeric',
      month: '2-digit',
      day: '2-digit',
      hour: '2-digit',
      minute: '2-digit',
      hourCycle: 'h23',
    })
      .formatToParts(new Date(at))
      .map((p) => [p.type, p.value]),
  );
  return `${parts.year}-${parts.month}-${parts.day}T${parts.hour}:${parts.minute}`;
}

const good = {
  kind: 'near_miss',
  occurredAt: '2026-06-14T15:30',
  what: 'Lap bar on seat 4 unlatched at the top of the swing.\nRider held in by the belt.',
  ridersAffected: 1,
  anyoneHurt: false,
};

// Whatever a write refreshed, the queue must be what a full rebuild makes of the same data.
afterEach(() => {
  const kept = allQueueRows();
  refreshQueue(server.db, now.toISOString());
  expect(kept).toEqual(allQueueRows());
});

describe('reporting', () => {
  test('an operator reports on their own ride; times are read on the site’s clock', async () => {
    const res = await api.operator.post(url(ownRide()), good);
    expect(res.status).toBe(201);
    const created = incidentCreatedSchema.parse(res.body);
    expect(created.incident).toMatchObject({
      kind: 'near_miss',
      ridersAffected: 1,
      anyoneHurt: false,
      stoppedRide: false,
      reportedByName: 'Priya Castellan',
      reviewedAt: null,
    });
    expect(created.rideStatus).toBe('in_service');
    const zone = rideTimeZone(server.db, ownRide());
    expect(created.incident.timeZone).toBe(zone);
    // Intl (the platform's IANA database) reads the stored instant back as the wall time typed.
    expect(intlLocal(created.incident.occurredAt, zone)).toBe('2026-06-14T15:30');
    const audit = server.db
      .select()
      .from(auditLog)
      .where(and(eq(auditLog.entity, 'incident'), eq(auditLog.entityId, created.incident.id)))
      .all();
    expect(audit.map((a) => a.action)).toEqual(['create']);
  });

  test('bad input names each field and stores nothing', async () => {
    const before = rowsOf(ownRide()).length;
    const res = await api.operator.post(url(ownRide()), {
      kind: 'fire',
      occurredAt: '2026-02-30T25:00',
      what: '   ',
      ridersAffected: -2,
    });
    expectApiError(res, 400, 'validation_failed');
    const paths = (res.body.error.issues as { path: string }[]).map((i) => i.path).sort();
    expect(paths).toEqual(['anyoneHurt', 'kind', 'occurredAt', 'ridersAffected', 'what'].sort());
    // Downtime the wrong way round, and back running on a ride stopped with the report.
    const backwards = await api.operator.post(url(ownRide()), {
      ...good,
      stoppedAt: '2026-06-14T16:00',
      runningAgainAt: '2026-06-14T15:00',
    });
    expect(backwards.body.error.issues).toEqual([
      { path: 'runningAgainAt', message: 'Cannot be before the ride stopped' },
    ]);
    const stoppedButRunning = await api.operator.post(url(ownRide()), {
      ...good,
      stoppedAt: '2026-06-14T16:00',
      runningAgainAt: '2026-06-14T17:00',
      stopRide: true,
    });
    expectApiError(stoppedButRunning, 400, 'validation_failed');
    // A time in the future on the site's clock is refused by the server, naming the field.
    const future = await api.operator.post(url(ownRide()), { ...good, occurredAt: '2026-06-16T09:00' });
    expectApiError(future, 400, 'validation_failed');
    expect(future.body.error.issues).toEqual([
      { path: 'occurredAt', message: expect.stringMatching(/future/) },
    ]);
    // A photo the server does not have: nothing stored either.
    const missing = await api.operator.post(url(ownRide()), { ...good, photoShas: ['a'.repeat(64)] });
    expectApiError(missing, 400, 'validation_failed');
    expect(rowsOf(ownRide())).toHaveLength(before);
  });

  test('staff do not file reports (403); without a sign-in it is 401', async () => {
    expectApiError(await api.supervisor.post(url(ownRide()), good), 403, 'forbidden');
    expectApiError(await api.anonymous.post(url(ownRide()), good), 401, 'unauthorized');
  });
});

describe('operator scope', () => {
  test('another company’s ride answers 404, reading or writing, and nothing is stored', async () => {
    const before = rowsOf(otherRide()).length;
    expectApiError(await api.operator.post(url(otherRide()), good), 404, 'not_found');
    expectApiError(await api.operator.get(url(otherRide())), 404, 'not_found');
    expect(rowsOf(otherRide())).toHaveLength(before);
  });

  test('their lists never show another company’s reports, nor can they open one', async () => {
    const theirs = incidentCreatedSchema.parse(
      (await api.operator2.post(url(otherRide()), { ...good, what: 'Drive tripped mid-cycle' })).body,
    );
    const mine = rideIncidentsResponseSchema.parse((await api.operator.get(url(ownRide()))).body);
    expect(mine.incidents.length).toBeGreaterThan(0);
    expect(mine.incidents.every((i) => i.rideId === ownRide())).toBe(true);
    expectApiError(await api.operator.get(`/api/incidents/${theirs.incident.id}`), 404, 'not_found');
    expect(
      incidentSchema.parse((await api.operator2.get(`/api/incidents/${theirs.incident.id}`)).body).id,
    ).toBe(theirs.incident.id);
    // Staff see every ride's reports.
    const staff = rideIncidentsResponseSchema.parse((await api.inspector.get(url(otherRide()))).body);
    expect(staff.incidents.map((i) => i.id)).toContain(theirs.incident.id);
  });
});

describe('stopping the ride', () => {
  test('a report with stopRide: out of service, reason, follow-up booked, audit, one transaction', async () => {
    const rideId = ownRide();
    const photo = photoPng(901);
    const sha = createHash('sha256').update(photo).digest('hex');
    const token = await signInAs(server.app, 'operator@pivotwatch.test');
    const put = await request(server.app)
      .put(`/api/photos/${sha}`)
      .set('Authorization', `Bearer ${token}`)
      .set('Content-Type', 'image/png')
      .send(photo);
    expect([200, 201]).toContain(put.status);

    const res = await api.operator.post(url(rideId), {
      ...good,
      kind: 'harm',
      what: 'Gondola B struck the platform edge on the down swing',
      ridersAffected: 6,
      anyoneHurt: true,
      stoppedAt: '2026-06-15T10:45',
      photoShas: [sha],
      stopRide: true,
    });
    expect(res.status).toBe(201);
    const created = incidentCreatedSchema.parse(res.body);
    expect(created).toMatchObject({ rideStatus: 'out_of_service', followUpBooked: true });
    expect(created.incident).toMatchObject({ stoppedRide: true, photoShas: [sha] });

    const ride = server.db.select().from(rides).where(eq(rides.id, rideId)).get()!;
    expect(ride.status).toBe('out_of_service');
    expect(ride.statusReason).toMatch(
      /^Incident reported by Priya Castellan \(Injury or damage\): Gondola B/,
    );
    const change = server.db
      .select()
      .from(rideStatusChanges)
      .where(and(eq(rideStatusChanges.rideId, rideId), eq(rideStatusChanges.event, 'incident_stop')))
      .all();
    expect(change).toHaveLength(1);
    const followUp = server.db
      .select()
      .from(inspectionSchedules)
      .where(and(eq(inspectionSchedules.rideId, rideId), eq(inspectionSchedules.inspectionType, 'follow_up')))
      .get()!;
    // The existing booking: due on the day of the stop (the status rules book it for that day).
    expect(followUp.dueOn).toBe('2026-06-15');
    const rideAudit = server.db
      .select()
      .from(auditLog)
      .where(and(eq(auditLog.rideId, rideId), eq(auditLog.entity, 'ride')))
      .all();
    expect(rideAudit.some((a) => /in_service → out_of_service/.test(a.summary))).toBe(true);

    // The photo is the operator's to see again.
    const photoRead = await request(server.app)
      .get(`/api/photos/${sha}`)
      .set('Authorization', `Bearer ${token}`);
    expect(photoRead.status).toBe(200);
  });

  test('the operator cannot restart the ride, nor stop it again with a report (nothing stored)', async () => {
    const rideId = ownRide();
    const before = rowsOf(rideId).length;
    expectApiError(
      await api.operator.post(`/api/rides/${rideId}/status`, {
        status: 'in_service',
        reason: 'All fine now',
      }),
      403,
      'forbidden',
    );
    expectApiError(
      await api.operator.patch(`/api/rides/${rideId}`, { status: 'in_service' }),
      403,
      'forbidden',
    );
    expectApiError(await api.operator.post(url(rideId), { ...good, stopRide: true }), 409, 'no_change');
    expect(rowsOf(rideId)).toHaveLength(before);
    expect(server.db.select().from(rides).where(eq(rides.id, rideId)).get()!.status).toBe('out_of_service');
  });
});

describe('the review queue', () => {
  const queue = async (q = '') =>
    queueResponseSchema.parse((await api.supervisor.get(`/api/review/queue?pageSize=100${q}`)).body);

  test('open reports are queue items, the serious one at the top; the supervisor closes one with a note', async () => {
    const page = await queue();
    const items = page.items.filter((i) => i.kind === 'incident');
    const ownRows = rowsOf(ownRide());
    const serious = ownRows.find((r) => r.stoppedRide)!;
    const mild = ownRows.find((r) => !r.stoppedRide)!;
    expect(items.find((i) => i.incidentId === serious.id)).toMatchObject({
      urgency: 'incident_serious',
      incidentKind: 'harm',
      rideStatus: 'out_of_service',
    });
    expect(items.find((i) => i.incidentId === mild.id)).toMatchObject({ urgency: 'incident' });
    // Sorted by urgency, a report that stopped the ride or hurt someone comes first.
    expect(page.items[0].urgency).toBe('incident_serious');
    expect(page.counts.incident_serious).toBeGreaterThanOrEqual(1);

    expectApiError(
      await api.operator.post(`/api/incidents/${serious.id}/review`, { note: 'ok' }),
      403,
      'forbidden',
    );
    expectApiError(
      await api.inspector.post(`/api/incidents/${serious.id}/review`, { note: 'ok' }),
      403,
      'forbidden',
    );
    expectApiError(
      await api.supervisor.post(`/api/incidents/${serious.id}/review`, { note: ' ' }),
      400,
      'validation_failed',
    );

    const reviewed = await api.supervisor.post(`/api/incidents/${serious.id}/review`, {
      note: 'Platform edge marked; follow-up booked for today.',
    });
    expect(reviewed.status).toBe(200);
    expect(incidentSchema.parse(reviewed.body)).toMatchObject({
      reviewNote: 'Platform edge marked; follow-up booked for today.',
      reviewedByName: expect.any(String),
    });
    expect((await queue()).items.some((i) => i.incidentId === serious.id)).toBe(false);
    expect(server.db.select().from(reviewQueue).where(eq(reviewQueue.incidentId, serious.id)).all()).toEqual(
      [],
    );
    expectApiError(
      await api.supervisor.post(`/api/incidents/${serious.id}/review`, { note: 'again' }),
      409,
      'already_reviewed',
    );
    // The ride stays stopped: reviewing a report is not a return to service.
    expect(server.db.select().from(rides).where(eq(rides.id, ownRide())).get()!.status).toBe(
      'out_of_service',
    );
  });

  test('the logbook read gives date, kind and one line of each report, newest first', () => {
    const rows = listIncidentsForRide(server.db, ownRide());
    expect(rows.length).toBe(rowsOf(ownRide()).length);
    expect(rows[0]).toMatchObject({ kindLabel: 'Injury or damage', reviewed: true });
    expect(rows.find((r) => r.kind === 'near_miss')?.summary).toBe(
      'Lap bar on seat 4 unlatched at the top of the swing.',
    );
  });
});
