/**
 * Decisions on a submitted inspection: approve or return (with a comment), once; approving moves the
 * ride's schedule of that inspection type; every decision is audited and leaves the review queue; the
 * inspector's phone pulls it with its findings, and no other inspector does. Also the inspection's trail.
 */
import { randomUUID } from 'node:crypto';

import { and, asc, eq } from 'drizzle-orm';
import { z } from 'zod';

import { inspections } from '@/db/server/inspections';
import { notices } from '@/db/server/notices';
import { reviewQueue, rideStatusChanges } from '@/db/server/review';
import { inspectionSchedules } from '@/db/server/schema';
import { auditListResponseSchema, scheduleSchema } from '@/features/registry/schema';
import { decisionResponseSchema } from '@/features/review/schema';
import { pullResponseSchema } from '@/features/sync/pull-schema';
import { findSessionUser } from '@/server/auth/service';
import { buildPull } from '@/server/sync/pull';

import { expectApiError, userIdOf, type TestServer } from './helpers';
import { demoClients, makePinnedServer, type Clients } from './registry-helpers';
import { auditOf, pushAccepted, secondInspector } from './review-desk-fixtures';
import { demoRide, makeRecord } from './sync-fixtures';

// The business clock is pinned, so the demo schedule (seeded on this day) has known dates: Skylark's
// periodic inspection was last done 25 days before, every 30 days.
const now = new Date('2026-05-04T12:00:00.000Z');
// Seeding hashes five passwords; on a busy machine that alone can take seconds.
jest.setTimeout(30_000);

let server: TestServer;
let api: Clients;
let skylark: ReturnType<typeof demoRide>;
beforeAll(async () => {
  server = await makePinnedServer(now);
  api = await demoClients(server.app);
  skylark = demoRide(server.db, 'Skylark');
});
afterAll(() => server.close());

const tick = () => new Promise((resolve) => setTimeout(resolve, 5));

async function submitted(patch: Parameters<typeof makeRecord>[1] = {}) {
  const record = makeRecord(skylark, { type: 'periodic', ...patch });
  await pushAccepted(server.db, api.inspector, [record]);
  return record;
}

const decide = (id: string, body: object, client = api.supervisor) =>
  client.post(`/api/inspections/${id}/decision`, body);

function skylarkSchedule(type: 'periodic' | 'annual') {
  const row = server.db
    .select()
    .from(inspectionSchedules)
    .where(and(eq(inspectionSchedules.rideId, skylark.id), eq(inspectionSchedules.inspectionType, type)))
    .get();
  if (!row) throw new Error(`no Skylark ${type} schedule`);
  return row;
}

const queueRow = (inspectionId: string) =>
  server.db
    .select()
    .from(reviewQueue)
    .where(eq(reviewQueue.key, `i:${inspectionId}`))
    .get();

describe('approving', () => {
  test('approves, moves the schedule’s last-done date and next due date, audits both, leaves the queue', async () => {
    const record = await submitted();
    expect(queueRow(record.id)).toBeDefined();
    const schedule = skylarkSchedule('periodic');
    expect(schedule.lastDoneOn).toBe('2026-04-09');

    const res = await decide(record.id, { decision: 'approve', note: '  ' });
    expect(res.status).toBe(200);
    expect(decisionResponseSchema.parse(res.body)).toEqual({
      // No findings, so no notice to the operator.
      notice: null,
      inspectionId: record.id,
      reviewState: 'approved',
      reviewedAt: now.toISOString(),
      reviewedByName: 'Mira Delacourt',
      reviewNote: null,
      // No status in the decision: the ride stays as it was.
      ride: { status: 'in_service', statusReason: null, changed: false },
    });
    const detail = (await api.supervisor.get(`/api/inspections/${record.id}`)).body.inspection;
    expect(detail).toMatchObject({ reviewState: 'approved', reviewedByName: 'Mira Delacourt' });

    // The inspection was submitted on 2026-05-04: the periodic schedule (every 30 days) is due 30 days on.
    const schedules = z
      .array(scheduleSchema)
      .parse((await api.supervisor.get(`/api/rides/${skylark.id}/schedules`)).body.schedules);
    expect(schedules.find((s) => s.inspectionType === 'periodic')).toMatchObject({
      lastDoneOn: '2026-05-04',
      nextDueOn: '2026-06-03',
    });

    const [entry] = auditOf(server.db, 'inspection', record.id);
    expect(entry).toMatchObject({
      action: 'update',
      rideId: skylark.id,
      userId: userIdOf(server.db, 'supervisor@pivotwatch.test'),
      summary: 'Skylark: inspection approved',
      before: { reviewState: 'submitted', reviewedAt: null, reviewedByName: null, reviewNote: null },
      after: { reviewState: 'approved', reviewedAt: now.toISOString(), reviewedByName: 'Mira Delacourt' },
    });
    const scheduleEntries = auditOf(server.db, 'schedule', schedule.id);
    expect(scheduleEntries.at(-1)).toMatchObject({
      summary: 'Skylark: periodic inspection schedule changed',
      before: { lastDoneOn: '2026-04-09', nextDueOn: '2026-05-09' },
      after: { lastDoneOn: '2026-05-04', nextDueOn: '2026-06-03' },
    });
    expect(queueRow(record.id)).toBeUndefined();
  });

  test('an older inspection does not move the schedule back; a type without a schedule moves none', async () => {
    const before = skylarkSchedule('periodic');
    const older = await submitted({
      startedAt: '2026-03-01T08:00:00.000Z',
      submittedAt: '2026-03-01T09:00:00.000Z',
    });
    expect((await decide(older.id, { decision: 'approve' })).status).toBe(200);
    expect(skylarkSchedule('periodic')).toEqual(before);

    const followUp = await submitted({ type: 'follow_up' });
    const countBefore = (await api.supervisor.get('/api/audit?entity=schedule')).body.total;
    expect((await decide(followUp.id, { decision: 'approve' })).status).toBe(200);
    expect((await api.supervisor.get('/api/audit?entity=schedule')).body.total).toBe(countBefore);
  });

  test('a decision is made once: a second one is a 409 naming the first', async () => {
    const record = await submitted();
    expect((await decide(record.id, { decision: 'approve' })).status).toBe(200);
    const err = expectApiError(
      await decide(record.id, { decision: 'return', note: 'Too late' }),
      409,
      'already_decided',
    );
    expect(err.message).toBe(
      'This inspection was already approved by Mira Delacourt on 2026-05-04; a decision is made once.',
    );
    expect(auditOf(server.db, 'inspection', record.id)).toHaveLength(1);
  });

  test('an inspection the inspector has amended is decided through its amendment (409)', async () => {
    const original = await submitted();
    const amendment = makeRecord(skylark, { type: 'periodic', amendsId: original.id });
    await pushAccepted(server.db, api.inspector, [amendment]);
    expectApiError(await decide(original.id, { decision: 'approve' }), 409, 'amended');
    expect((await decide(amendment.id, { decision: 'approve' })).status).toBe(200);
  });
});

describe('returning', () => {
  test('needs a comment for the inspector; with one, it is returned, audited, and leaves the queue', async () => {
    const record = await submitted();
    const schedule = skylarkSchedule('periodic');
    const err = expectApiError(await decide(record.id, { decision: 'return' }), 400, 'validation_failed');
    expect(err.issues).toEqual([{ path: 'note', message: 'Tell the inspector what to correct' }]);
    const bad = expectApiError(await decide(record.id, { decision: 'maybe' }), 400, 'validation_failed');
    expect(bad.issues?.[0]).toEqual({ path: 'decision', message: 'approve or return' });
    expect(auditOf(server.db, 'inspection', record.id)).toEqual([]);

    const note = 'Photo of the axle retaining plate missing; add it and send an amendment.';
    const res = await decide(record.id, { decision: 'return', note });
    expect(decisionResponseSchema.parse(res.body)).toMatchObject({
      reviewState: 'returned',
      reviewNote: note,
    });
    expect(auditOf(server.db, 'inspection', record.id)[0]).toMatchObject({
      summary: 'Skylark: inspection returned to Tomas Reyne',
      after: { reviewState: 'returned', reviewNote: note },
    });
    // Returning is not doing: the schedule stays as it was.
    expect(skylarkSchedule('periodic')).toEqual(schedule);
    expect(queueRow(record.id)).toBeUndefined();
  });
});

describe('the inspector’s phone', () => {
  test('pulls the decision with its findings, again when a finding changes; another inspector never does', async () => {
    const inspector = findSessionUser(server.db, userIdOf(server.db, 'inspector@pivotwatch.test'));
    if (!inspector) throw new Error('no demo inspector');
    const other = await secondInspector(server.app, server.db);
    const record = await submitted();
    const finding = (
      await api.supervisor.post(`/api/inspections/${record.id}/findings`, {
        severity: 'fix_before_operation',
        description: 'Seat 3 lap bar slow to lock.',
        requiredAction: 'Clean and adjust the latch; test 20 cycles.',
      })
    ).body.finding;
    const before = buildPull(server.db, inspector, null, { overlapMs: 0 });
    expect(before.decisions?.some((d) => d.inspectionId === record.id)).toBe(false);
    await tick();

    await decide(record.id, { decision: 'return', note: 'Retake the lap bar photo.' });
    const res = await api.inspector.get(`/api/sync/pull?cursor=${encodeURIComponent(before.cursor)}`);
    const pulled = pullResponseSchema.parse(res.body);
    // The route looks a few seconds behind the cursor, so earlier decisions of this file may come again.
    expect(pulled.decisions?.filter((d) => d.rideId === skylark.id && d.inspectionId === record.id)).toEqual([
      {
        inspectionId: record.id,
        rideId: skylark.id,
        state: 'returned',
        note: 'Retake the lap bar photo.',
        decidedAt: now.toISOString(),
        decidedByName: 'Mira Delacourt',
        findings: [
          {
            id: finding.id,
            number: 1,
            severity: 'fix_before_operation',
            description: 'Seat 3 lap bar slow to lock.',
            requiredAction: 'Clean and adjust the latch; test 20 cycles.',
            dueOn: null,
            state: 'open',
          },
        ],
      },
    ]);
    const otherPull = pullResponseSchema.parse((await other.get('/api/sync/pull')).body);
    expect(otherPull.decisions).toEqual([]);

    // Nothing changed: nothing sent. A finding changed: the decision comes again, with it.
    const quiet = buildPull(server.db, inspector, pulled.cursor, { overlapMs: 0 });
    expect(quiet.decisions).toEqual([]);
    await tick();
    await api.supervisor.patch(`/api/findings/${finding.id}`, { severity: 'stop_now' });
    const again = buildPull(server.db, inspector, quiet.cursor, { overlapMs: 0 });
    expect(again.decisions?.map((d) => [d.inspectionId, (d.findings ?? []).map((f) => f.severity)])).toEqual([
      [record.id, ['stop_now']],
    ]);
    await tick();
    await api.supervisor.delete(`/api/findings/${finding.id}`);
    const removed = buildPull(server.db, inspector, again.cursor, { overlapMs: 0 });
    expect(removed.decisions?.map((d) => [d.inspectionId, d.findings])).toEqual([[record.id, []]]);
  });
});

describe('the trail', () => {
  test('its own and its findings’ entries, and the ride’s since submission, newest first', async () => {
    // Submitted "just now" by the real clock, which stamps the audit log.
    const submittedAt = new Date(Date.now() - 60_000).toISOString();
    const record = await submitted({ submittedAt, startedAt: submittedAt });
    const earlier = await submitted();
    await tick();
    const made = (
      await api.supervisor.post(`/api/inspections/${record.id}/findings`, {
        severity: 'note',
        description: 'Paint chipped at the gondola door.',
      })
    ).body.finding;
    await api.supervisor.post(`/api/inspections/${earlier.id}/findings`, {
      severity: 'note',
      description: 'Another inspection’s finding',
    });
    await api.supervisor.patch(`/api/rides/${skylark.id}`, {
      status: 'restricted',
      statusReason: 'Gondola door latch under repair; door 2 kept closed.',
    });
    await decide(record.id, { decision: 'approve', note: 'Good record.' });

    const res = await api.supervisor.get(`/api/inspections/${record.id}/trail`);
    expect(res.status).toBe(200);
    const entries = auditListResponseSchema.shape.entries.parse(res.body.entries);
    const summaries = entries.map((e) => e.summary);
    // The approval with a finding and the status change each issued the operator a notice; the restricted
    // ride is owed a follow-up inspection, booked by the approval (status rules).
    expect(summaries.slice(0, 7)).toEqual([
      'Skylark: notice PW-2026-0002 issued to Tamsworth Pier Leisure',
      'Skylark: follow-up inspection schedule added',
      'Skylark: periodic inspection schedule changed',
      'Skylark: inspection approved',
      'Skylark: notice PW-2026-0001 issued to Tamsworth Pier Leisure',
      expect.stringMatching(/^Ride Skylark changed/),
      `Skylark: finding ${made.number} added (Note)`,
    ]);
    expect(entries.find((e) => e.entityId === made.id)?.userName).toBe('Mira Delacourt');
    expect(summaries).not.toContain(`Skylark: finding ${made.number + 1} added (Note)`);
    expect(entries.filter((e) => e.entity === 'finding').every((e) => e.entityId === made.id)).toBe(true);
    const times = entries.map((e) => e.at);
    expect([...times].sort().reverse()).toEqual(times);

    // An inspection submitted later than those ride changes does not show them (a phone clock ahead,
    // within the five minutes ingest allows).
    const later = await submitted({
      submittedAt: new Date(Date.now() + 240_000).toISOString(),
      startedAt: new Date(Date.now() + 60_000).toISOString(),
    });
    expect((await api.supervisor.get(`/api/inspections/${later.id}/trail`)).body.entries).toEqual([]);

    expect((await api.inspector.get(`/api/inspections/${record.id}/trail`)).status).toBe(200);
    const other = await secondInspector(server.app, server.db, 'trail.other@pivotwatch.test');
    expectApiError(await other.get(`/api/inspections/${record.id}/trail`), 404, 'not_found');
    expectApiError(await api.operator.get(`/api/inspections/${record.id}/trail`), 403, 'forbidden');
  });
});

describe('who may decide', () => {
  test('supervisors and admins; inspectors and operators 403, anonymous 401, unknown 404', async () => {
    const record = await submitted();
    expectApiError(await decide(record.id, { decision: 'approve' }, api.inspector), 403, 'forbidden');
    expectApiError(await decide(record.id, { decision: 'approve' }, api.operator), 403, 'forbidden');
    expectApiError(await decide(record.id, { decision: 'approve' }, api.anonymous), 401, 'unauthorized');
    expectApiError(await decide(randomUUID(), { decision: 'approve' }), 404, 'not_found');
    const res = await decide(record.id, { decision: 'approve' }, api.admin);
    expect(res.body.reviewedByName).toBe('Rowan Ashby');
  });
});

describe('one decision, one notice (the status rules)', () => {
  const noticesOfSkylark = () =>
    server.db.select().from(notices).where(eq(notices.rideId, skylark.id)).orderBy(asc(notices.seq)).all();

  test('a finding that forbids operation: approval needs the stop in the same decision, and issues one notice naming it', async () => {
    const record = await submitted();
    const made = (
      await api.supervisor.post(`/api/inspections/${record.id}/findings`, {
        severity: 'stop_now',
        description: 'Arm hub weld cracked at the lower gusset.',
        requiredAction: 'Lock out; NDT and repair by the maker.',
      })
    ).body.finding;
    const before = noticesOfSkylark().length;

    // Kept running (or only restricted) on a finding that forbids operation: refused, nothing changes.
    expectApiError(await decide(record.id, { decision: 'approve' }), 409, 'stop_required');
    expectApiError(
      await decide(record.id, {
        decision: 'approve',
        rideStatus: { status: 'restricted', reason: 'Gondola 2 closed.' },
      }),
      409,
      'stop_required',
    );
    const noReason = expectApiError(
      await decide(record.id, { decision: 'approve', rideStatus: { status: 'out_of_service' } }),
      400,
      'validation_failed',
    );
    expect(noReason.issues?.map((i) => i.path)).toEqual(['rideStatus.reason']);
    expect(noticesOfSkylark()).toHaveLength(before);
    expect(server.db.select().from(inspections).where(eq(inspections.id, record.id)).get()?.reviewState).toBe(
      'submitted',
    );

    const res = await decide(record.id, {
      decision: 'approve',
      rideStatus: { status: 'out_of_service', reason: 'Hub weld crack.' },
    });
    expect(res.status).toBe(200);
    const decided = decisionResponseSchema.parse(res.body);
    expect(decided.ride).toEqual({
      status: 'out_of_service',
      statusReason: 'Hub weld crack.',
      changed: true,
    });
    const after = noticesOfSkylark();
    expect(after).toHaveLength(before + 1);
    const [notice] = after.slice(-1);
    expect(notice.id).toBe(decided.notice?.id);
    expect(notice.kind).toBe('inspection');
    expect(notice.inspectionId).toBe(record.id);
    // The stop, its reason and its cause on the one notice; the finding by its number on the ride.
    expect(notice.document.operatingStatus.status).toBe('out_of_service');
    expect(notice.document.operatingStatus.reason).toBe(
      `Hub weld crack. — Because of finding ${made.number} (Stop now): Arm hub weld cracked at the lower gusset..`,
    );
    expect(notice.document.findings.map((f) => f.number)).toEqual([made.number]);
    expect(notice.document.reinspection.required).toBe(true);
    // The change is on the ride's status record, tied to the decision.
    const change = server.db
      .select()
      .from(rideStatusChanges)
      .where(eq(rideStatusChanges.inspectionId, record.id))
      .all();
    expect(change).toEqual([
      expect.objectContaining({ event: 'stop', toStatus: 'out_of_service', override: false }),
    ]);
  });

  test('a return with no status change issues no notice; the ride stays as it is', async () => {
    const record = await submitted();
    const before = noticesOfSkylark().length;
    const res = await decide(record.id, { decision: 'return', note: 'Photograph the hub, please.' });
    expect(res.status).toBe(200);
    expect(decisionResponseSchema.parse(res.body)).toMatchObject({
      notice: null,
      ride: { status: 'out_of_service', changed: false },
    });
    expect(noticesOfSkylark()).toHaveLength(before);
  });
});
