/**
 * The loop after a notice: the operator acknowledges it, reports corrective actions with photos, and the
 * inspection body closes (note and evidence required) or reopens each finding, under the status rules
 * (features/review/status-rules.ts): closing never puts a ride back in service — the last blocking finding
 * closed books the follow-up inspection, whose approval does, with one notice — and a supervisor's
 * override is the only other way back, recorded and notified.
 */

import { and, eq } from 'drizzle-orm';

import { inspections } from '@/db/server/inspections';
import { correctiveActions, notices } from '@/db/server/notices';
import { findings, reviewQueue, rideStatusChanges } from '@/db/server/review';
import { auditLog, inspectionSchedules } from '@/db/server/schema';
import {
  findingStateResponseSchema,
  noticeDetailSchema,
  noticeListResponseSchema,
  noticeResponseSchema,
} from '@/features/notices/schema';
import { decisionResponseSchema } from '@/features/review/schema';
import { severityInfo } from '@/features/notices/finding-schema';
import { queueToday, refreshQueue } from '@/server/queue/queue-refresh';
import { analysePending } from '@/server/sync/analysis';

import { expectApiError } from './helpers';
import {
  approveAndIssue,
  inspectWithFindings,
  makeNoticeServer,
  photoPng,
  rideRow,
  type Inspected,
  type NoticeServer,
} from './notices-fixtures';
import { demoRide, makeRecord, sha256Hex, speedReading } from './sync-fixtures';

jest.setTimeout(60_000);

const start = new Date('2026-05-04T09:00:00.000Z');
let s: NoticeServer;
beforeAll(async () => {
  s = await makeNoticeServer(start);
});
afterAll(() => s.close());

const auditOf = (entity: 'notice' | 'finding' | 'corrective_action' | 'ride', entityId: string) =>
  s.db
    .select()
    .from(auditLog)
    .where(and(eq(auditLog.entity, entity), eq(auditLog.entityId, entityId)))
    .all();

describe('reading notices', () => {
  let skylark: { id: string; reference: string };
  let tidebreaker: { id: string; reference: string };
  beforeAll(async () => {
    const a = await inspectWithFindings(s, 'Skylark', [
      { severity: 'fix_by_date', description: 'Step edge worn', dueOn: '2026-05-30' },
      { severity: 'note', description: 'Paint faded on the arm' },
    ]);
    skylark = approveAndIssue(s, a.inspectionId);
    const b = await inspectWithFindings(s, 'Tidebreaker', [
      { severity: 'fix_by_date', description: 'Sub-arm grease nipple blocked', dueOn: '2026-05-25' },
    ]);
    tidebreaker = approveAndIssue(s, b.inspectionId);
  });

  test('references run in sequence within the year', () => {
    expect([skylark.reference, tidebreaker.reference]).toEqual(['PW-2026-0001', 'PW-2026-0002']);
  });

  test('operators list their own company’s notices only, whatever the filters say; staff see all', async () => {
    const own = noticeListResponseSchema.parse((await s.api.operator.get('/api/notices')).body);
    expect(own.notices.map((n) => n.reference)).toEqual(['PW-2026-0001']);
    expect(own.notices[0]).toMatchObject({
      rideName: 'Skylark',
      operatorName: 'Tamsworth Pier Leisure',
      kind: 'inspection',
      acknowledgedAt: null,
      openFindings: 2,
      findingsTotal: 2,
      delivery: { state: 'sending', total: 1, sent: 0, failed: 0 },
    });
    const other = own.notices[0].operatorId;
    const tide = noticeListResponseSchema.parse(
      (await s.api.supervisor.get(`/api/notices?rideId=${rideRow(s.db, 'Tidebreaker').id}`)).body,
    );
    expect(tide.notices.map((n) => n.reference)).toEqual(['PW-2026-0002']);
    const forced = noticeListResponseSchema.parse(
      (await s.api.operator2.get(`/api/notices?operatorId=${other}`)).body,
    );
    expect(forced.total).toBe(0);

    const all = noticeListResponseSchema.parse((await s.api.inspector.get('/api/notices?pageSize=1')).body);
    expect(all).toMatchObject({ total: 2, page: 1, pageSize: 1 });
    expect(all.notices.map((n) => n.reference)).toEqual(['PW-2026-0002']);
    const page2 = noticeListResponseSchema.parse(
      (await s.api.admin.get('/api/notices?pageSize=1&page=2')).body,
    );
    expect(page2.notices.map((n) => n.reference)).toEqual(['PW-2026-0001']);
    const bad = expectApiError(await s.api.admin.get('/api/notices?pageSize=0'), 400, 'validation_failed');
    expect(bad.issues?.[0].path).toBe('query.pageSize');
  });

  test('the document is frozen: later changes to a finding show in its state, not in the document', async () => {
    const before = noticeDetailSchema.parse(
      (await s.api.operator.get(`/api/notices/${skylark.id}`)).body.notice,
    );
    const noteFinding = before.findings.find((f) => f.severity === 'note');
    const closed = await s.api.supervisor.post(`/api/findings/${noteFinding?.id}/close`, {
      note: 'Seen',
      evidenceRef: 'Site visit log 2026-05-04, entry 3',
    });
    expect(closed.status).toBe(200);
    const after = noticeDetailSchema.parse(
      (await s.api.operator.get(`/api/notices/${skylark.id}`)).body.notice,
    );
    expect(after.document).toEqual(before.document);
    expect(after.document.findings.find((f) => f.id === noteFinding?.id)?.state).toBe('open');
    expect(after.findings.find((f) => f.id === noteFinding?.id)).toMatchObject({
      state: 'closed',
      closedByName: 'Mira Delacourt',
      stateNote: 'Seen',
      closeEvidence: { photoShas: [], reference: 'Site visit log 2026-05-04, entry 3', correctiveActions: 0 },
    });
    expect(after.openFindings).toBe(1);
  });

  test('acknowledgement is recorded once, by the operator of that company; a repeat answers the same', async () => {
    expectApiError(await s.api.supervisor.post(`/api/notices/${skylark.id}/acknowledge`), 403, 'forbidden');
    expectApiError(await s.api.operator2.post(`/api/notices/${skylark.id}/acknowledge`), 404, 'not_found');

    s.setNow(new Date('2026-05-04T15:30:00.000Z'));
    const first = noticeResponseSchema.parse(
      (await s.api.operator.post(`/api/notices/${skylark.id}/acknowledge`)).body,
    );
    expect(first.notice).toMatchObject({
      acknowledgedAt: '2026-05-04T15:30:00.000Z',
      acknowledgedByName: 'Priya Castellan',
    });

    s.setNow(new Date('2026-05-05T08:00:00.000Z'));
    const again = await s.api.operator.post(`/api/notices/${skylark.id}/acknowledge`);
    expect(again.status).toBe(200);
    expect(again.body.notice.acknowledgedAt).toBe('2026-05-04T15:30:00.000Z');
    expect(again.body.notice.acknowledgedByName).toBe(first.notice.acknowledgedByName);
    const entries = auditOf('notice', skylark.id).filter((e) => e.action === 'update');
    expect(entries).toHaveLength(1);
    expect(entries[0].summary).toContain('acknowledged');
    s.setNow(start);
  });
});

describe('corrective actions, verification and the ride’s status', () => {
  let inspected: Inspected;
  let noticeId: string;
  const [blocking, dated, stop] = [0, 1, 2];

  beforeAll(async () => {
    inspected = await inspectWithFindings(
      s,
      'Twin Comet',
      [
        {
          severity: 'fix_before_operation',
          description: 'Gondola A restraint lock pin worn',
          requiredAction: 'Replace the lock pin and test the restraint',
          photos: [0],
        },
        { severity: 'fix_by_date', description: 'Fence mesh torn', dueOn: '2026-05-15' },
        {
          severity: 'stop_now',
          description: 'Crack at the arm’s hub weld',
          requiredAction: 'NDT and repair',
        },
      ],
      1,
    );
    noticeId = approveAndIssue(s, inspected.inspectionId, {
      rideStatus: { status: 'out_of_service', reason: 'Hub weld crack and restraint lock pin' },
    }).id;
  });

  test('the notice says re-inspection is required and why, and carries the stop', async () => {
    const notice = noticeDetailSchema.parse(
      (await s.api.operator.get(`/api/notices/${noticeId}`)).body.notice,
    );
    expect(notice.document.operatingStatus).toEqual({
      status: 'out_of_service',
      reason: 'Hub weld crack and restraint lock pin',
    });
    expect(notice.document.reinspection.required).toBe(true);
    const numbers = notice.document.findings.map((f) => f.number);
    expect(notice.document.reinspection.reason).toContain(`Findings ${numbers[blocking]}, ${numbers[stop]}`);
    expect(notice.document.reinspection.reason).toContain('follow-up inspection');
    // Numbered on the ride: one number, one finding, across all the ride's inspections.
    const onRide = s.db
      .select({ n: findings.rideNumber })
      .from(findings)
      .where(eq(findings.rideId, inspected.rideId))
      .all()
      .map((f) => f.n);
    expect(onRide.every((n) => n !== null)).toBe(true);
    expect(new Set(onRide).size).toBe(onRide.length);
    expect(notice.document.findings[0].photos).toEqual([
      { sha256: inspected.photoShas[0], caption: 'Pivot photo 1' },
    ]);
  });

  test('operators see their notices’ photos and their own uploads, nothing else', async () => {
    expect((await s.api.operator.get(`/api/photos/${inspected.photoShas[0]}`)).status).toBe(200);
    expectApiError(await s.api.operator2.get(`/api/photos/${inspected.photoShas[0]}`), 403, 'forbidden');
    // A staff photo on no notice of theirs.
    const staffOnly = await inspectWithFindings(s, 'Lantern Wheel', [], 1);
    expectApiError(await s.api.operator.get(`/api/photos/${staffOnly.photoShas[0]}`), 403, 'forbidden');
  });

  test('a corrective action needs its photos uploaded first, then moves the finding to action reported', async () => {
    const evidence = photoPng(99);
    const sha = sha256Hex(evidence);
    const findingId = inspected.findingIds[blocking];
    const missing = expectApiError(
      await s.api.operator.post(`/api/findings/${findingId}/actions`, {
        note: 'Lock pin replaced with the maker’s part; restraint tested 20 times',
        photoShas: [inspected.photoShas[0], sha],
      }),
      400,
      'validation_failed',
    );
    expect(missing.issues).toEqual([
      { path: 'photoShas.1', message: expect.stringMatching(/not been uploaded/) },
    ]);
    expect(s.db.select().from(correctiveActions).all()).toHaveLength(0);

    const bad = expectApiError(
      await s.api.operator.post(`/api/findings/${findingId}/actions`, { note: ' ' }),
      400,
      'validation_failed',
    );
    expect(bad.issues?.[0].path).toBe('note');

    expect((await s.putPhoto('operator@pivotwatch.test', evidence, sha)).status).toBe(201);
    expect((await s.api.operator.get(`/api/photos/${sha}`)).status).toBe(200);
    expectApiError(await s.api.operator2.get(`/api/photos/${sha}`), 403, 'forbidden');

    expectApiError(
      await s.api.operator2.post(`/api/findings/${findingId}/actions`, { note: 'Not ours', photoShas: [] }),
      404,
      'not_found',
    );
    expectApiError(
      await s.api.supervisor.post(`/api/findings/${findingId}/actions`, { note: 'Staff', photoShas: [] }),
      403,
      'forbidden',
    );

    const res = await s.api.operator.post(`/api/findings/${findingId}/actions`, {
      note: 'Lock pin replaced with the maker’s part; restraint tested 20 times',
      photoShas: [sha],
    });
    expect(res.status).toBe(201);
    const body = findingStateResponseSchema.parse(res.body);
    expect(body.finding.state).toBe('action_reported');
    expect(body.finding.correctiveActions).toEqual([
      expect.objectContaining({ photoShas: [sha], note: expect.stringContaining('Lock pin replaced') }),
    ]);
    expect(body.ride.status).toBe('out_of_service');
    expect(body.statusNotice).toBeNull();
    expect(auditOf('finding', findingId).map((e) => e.summary)).toEqual([
      expect.stringContaining('action reported'),
    ]);

    const notice = noticeDetailSchema.parse(
      (await s.api.operator.get(`/api/notices/${noticeId}`)).body.notice,
    );
    expect(notice.findings[blocking].correctiveActions).toHaveLength(1);
  });

  test('only the inspection body verifies; closing one finding that stops the ride leaves it stopped while another remains', async () => {
    const findingId = inspected.findingIds[blocking];
    expectApiError(await s.api.operator.post(`/api/findings/${findingId}/close`, {}), 403, 'forbidden');
    const res = await s.api.inspector.post(`/api/findings/${findingId}/close`, {
      note: 'New pin seen fitted',
    });
    expect(res.status).toBe(200);
    const body = findingStateResponseSchema.parse(res.body);
    expect(body.finding).toMatchObject({
      state: 'closed',
      stateNote: 'New pin seen fitted',
      closedByName: 'Tomas Reyne',
    });
    // The stop-now hub weld finding is still open: the ride stays out of service.
    expect(body.ride.status).toBe('out_of_service');
    expect(body.statusNotice).toBeNull();
    expectApiError(
      await s.api.supervisor.post(`/api/findings/${findingId}/close`, { note: 'Again', evidenceRef: 'WO-9' }),
      409,
      'already_closed',
    );
    expectApiError(
      await s.api.operator.post(`/api/findings/${findingId}/actions`, { note: 'More', photoShas: [] }),
      409,
      'finding_closed',
    );
  });

  test('closing needs the verifier’s note and evidence; nothing changes without them', async () => {
    const findingId = inspected.findingIds[stop];
    const noNote = expectApiError(
      await s.api.supervisor.post(`/api/findings/${findingId}/close`, { evidenceRef: 'MT report 118' }),
      400,
      'validation_failed',
    );
    expect(noNote.issues?.map((i) => i.path)).toEqual(['note']);
    // No photo, no document, and the operator has reported nothing on this finding.
    const noEvidence = expectApiError(
      await s.api.supervisor.post(`/api/findings/${findingId}/close`, { note: 'Looked fine' }),
      400,
      'validation_failed',
    );
    expect(noEvidence.issues?.map((i) => i.path)).toEqual(['evidence']);
    const notUploaded = expectApiError(
      await s.api.supervisor.post(`/api/findings/${findingId}/close`, {
        note: 'Weld repaired',
        photoShas: [sha256Hex(photoPng(4242))],
      }),
      400,
      'validation_failed',
    );
    expect(notUploaded.issues?.[0].path).toBe('photoShas.0');
    const row = s.db.select().from(findings).where(eq(findings.id, findingId)).get();
    expect(row?.state).toBe('open');
  });

  test('closing the last finding that forbids operation leaves the ride stopped and books its follow-up on the inspector’s Today', async () => {
    expect(severityInfo.stop_now.mayOperate).toBe(false);
    expect(severityInfo.fix_by_date.mayOperate).toBe(true);
    const findingId = inspected.findingIds[stop];
    // A later inspection waiting for review puts the ride in the review queue, with its status.
    await inspectWithFindings(s, 'Twin Comet', [], 0);
    refreshQueue(s.db, queueToday(s.now()), [inspected.rideId]);
    const queued = () =>
      s.db.select().from(reviewQueue).where(eq(reviewQueue.rideId, inspected.rideId)).all();
    expect(queued().map((r) => r.rideStatus)).toEqual(['out_of_service']);
    const noticesBefore = s.db
      .select()
      .from(notices)
      .where(eq(notices.rideId, inspected.rideId))
      .all().length;
    expect((await s.api.inspector.get('/api/assignments/mine')).body.assignments).not.toContainEqual(
      expect.objectContaining({ rideId: inspected.rideId, inspectionType: 'follow_up' }),
    );
    s.setNow(new Date('2026-05-08T10:00:00.000Z'));
    const res = await s.api.supervisor.post(`/api/findings/${findingId}/close`, {
      note: 'Weld repaired, MT clear',
      evidenceRef: 'MT report 118 by the certified NDT technician',
    });
    expect(res.status).toBe(200);
    const body = findingStateResponseSchema.parse(res.body);
    // Nothing blocks any more, but only the follow-up inspection (or an override) returns the ride.
    expect(body.ride).toEqual({
      id: inspected.rideId,
      status: 'out_of_service',
      statusReason: 'Hub weld crack and restraint lock pin',
    });
    expect(body.statusNotice).toBeNull();
    expect(s.db.select().from(notices).where(eq(notices.rideId, inspected.rideId)).all()).toHaveLength(
      noticesBefore,
    );
    expect(queued().map((r) => r.rideStatus)).toEqual(['out_of_service']);
    // The follow-up is booked for today and assigned to the inspector who last inspected the ride.
    const mine = (await s.api.inspector.get('/api/assignments/mine')).body.assignments;
    expect(mine).toContainEqual(
      expect.objectContaining({
        rideId: inspected.rideId,
        inspectionType: 'follow_up',
        nextDueOn: '2026-05-08',
        dueStatus: 'due',
      }),
    );
  });

  test('approving the follow-up inspection returns the ride to service, with exactly one notice', async () => {
    const ride = rideRow(s.db, 'Twin Comet');
    // A periodic inspection is no follow-up: approving it leaves the ride stopped.
    const pending = s.db
      .select({ id: inspections.id })
      .from(inspections)
      .where(and(eq(inspections.rideId, ride.id), eq(inspections.reviewState, 'submitted')))
      .all();
    for (const p of pending) {
      const r = await s.api.supervisor.post(`/api/inspections/${p.id}/decision`, { decision: 'approve' });
      expect(r.status).toBe(200);
      expect(decisionResponseSchema.parse(r.body).ride).toMatchObject({
        status: 'out_of_service',
        changed: false,
      });
    }
    const followUp = makeRecord(demoRide(s.db, 'Twin Comet'), {
      type: 'follow_up',
      readings: [speedReading(11.5)],
      submittedAt: '2026-05-08T11:00:00.000Z',
      startedAt: '2026-05-08T10:30:00.000Z',
    });
    const pushed = await s.api.inspector.push([followUp]);
    expect(pushed.body.results[0].status).toBe('accepted');
    await analysePending(s.db);
    const before = s.db.select().from(notices).where(eq(notices.rideId, ride.id)).all().length;
    const res = await s.api.supervisor.post(`/api/inspections/${followUp.id}/decision`, {
      decision: 'approve',
      note: 'Hub weld and lock pin repaired; ride checked through a full cycle.',
    });
    expect(res.status).toBe(200);
    const decided = decisionResponseSchema.parse(res.body);
    expect(decided.ride).toEqual({ status: 'in_service', statusReason: null, changed: true });
    const after = s.db.select().from(notices).where(eq(notices.rideId, ride.id)).all();
    expect(after).toHaveLength(before + 1);
    const notice = noticeDetailSchema.parse(
      (await s.api.operator.get(`/api/notices/${decided.notice?.id}`)).body.notice,
    );
    expect(notice.document.operatingStatus.status).toBe('in_service');
    expect(notice.document.reinspection.required).toBe(false);
    expect(rideRow(s.db, 'Twin Comet').status).toBe('in_service');
    const change = s.db
      .select()
      .from(rideStatusChanges)
      .where(eq(rideStatusChanges.rideId, ride.id))
      .all()
      .at(-1);
    expect(change).toMatchObject({ event: 'follow_up_approved', toStatus: 'in_service', override: false });
    // The booking is met: the follow-up leaves the inspector's Today.
    const mine = (await s.api.inspector.get('/api/assignments/mine')).body.assignments;
    expect(mine).not.toContainEqual(
      expect.objectContaining({ rideId: ride.id, inspectionType: 'follow_up' }),
    );
    s.setNow(start);
  });

  test('reopening needs a comment; reopening a finding that forbids operation stops a ride in service', async () => {
    const findingId = inspected.findingIds[blocking];
    const missing = expectApiError(
      await s.api.supervisor.post(`/api/findings/${findingId}/reopen`, {}),
      400,
      'validation_failed',
    );
    expect(missing.issues?.[0].path).toBe('note');
    expectApiError(
      await s.api.supervisor.post(`/api/findings/${inspected.findingIds[dated]}/reopen`, { note: 'x' }),
      409,
      'already_open',
    );
    const before = s.db.select().from(notices).where(eq(notices.rideId, inspected.rideId)).all().length;

    const res = await s.api.supervisor.post(`/api/findings/${findingId}/reopen`, {
      note: 'Lock pin from the wrong batch; the maker has recalled it',
    });
    expect(res.status).toBe(200);
    const body = findingStateResponseSchema.parse(res.body);
    expect(body.finding).toMatchObject({
      state: 'open',
      closedAt: null,
      stateNote: 'Lock pin from the wrong batch; the maker has recalled it',
    });
    expect(body.ride).toMatchObject({
      status: 'out_of_service',
      statusReason: 'Lock pin from the wrong batch; the maker has recalled it',
    });
    expect(body.statusNotice).not.toBeNull();
    expect(s.db.select().from(notices).where(eq(notices.rideId, inspected.rideId)).all()).toHaveLength(
      before + 1,
    );
    const status = noticeDetailSchema.parse(
      (await s.api.operator.get(`/api/notices/${body.statusNotice?.id}`)).body.notice,
    );
    expect(status.document.operatingStatus.status).toBe('out_of_service');
    expect(status.document.reinspection.required).toBe(true);
    const entries = auditOf('finding', findingId);
    expect(entries.at(-1)).toMatchObject({
      before: expect.objectContaining({ state: 'closed' }),
      after: expect.objectContaining({ state: 'open' }),
    });
  });

  test('findings of an inspection not yet approved are not part of the loop', async () => {
    const pending = await inspectWithFindings(s, 'Lantern Wheel', [
      { severity: 'fix_by_date', description: 'Gondola door seal split', dueOn: '2026-06-01' },
    ]);
    const id = pending.findingIds[0];
    expectApiError(
      await s.api.supervisor.post(`/api/findings/${id}/close`, { note: 'Done', evidenceRef: 'WO-1' }),
      409,
      'not_issued',
    );
    expectApiError(await s.api.operator.post(`/api/findings/${id}/actions`, { note: 'x' }), 404, 'not_found');
  });

  test('a photo taken at the verification is evidence, kept with the finding, and the operator sees it', async () => {
    const findingId = inspected.findingIds[dated];
    const shot = photoPng(5151);
    const sha = sha256Hex(shot);
    expect((await s.putPhoto('inspector@pivotwatch.test', shot, sha)).status).toBe(201);
    expectApiError(await s.api.operator.get(`/api/photos/${sha}`), 403, 'forbidden');
    const res = await s.api.inspector.post(`/api/findings/${findingId}/close`, {
      note: 'Fence mesh replaced; photographed from the queue side.',
      photoShas: [sha],
    });
    expect(res.status).toBe(200);
    const body = findingStateResponseSchema.parse(res.body);
    expect(body.finding.closeEvidence).toEqual({ photoShas: [sha], reference: null, correctiveActions: 0 });
    expect((await s.api.operator.get(`/api/photos/${sha}`)).status).toBe(200);
    expectApiError(await s.api.operator2.get(`/api/photos/${sha}`), 403, 'forbidden');
  });
});

describe('a supervisor’s override', () => {
  test('stops and returns a ride without a follow-up only with a reason, recorded and notified once each', async () => {
    const ride = rideRow(s.db, 'Lantern Wheel');
    const count = () => s.db.select().from(notices).where(eq(notices.rideId, ride.id)).all().length;
    const before = count();
    const stop = await s.api.supervisor.post(`/api/rides/${ride.id}/status`, {
      status: 'out_of_service',
      reason: 'Drive coupling noise reported by the operator; stopped pending a look.',
    });
    expect(stop.status).toBe(200);
    expect(count()).toBe(before + 1);
    // A stop with nothing blocking books the follow-up at once.
    expect((await s.api.inspector.get('/api/assignments/mine')).body.assignments).toContainEqual(
      expect.objectContaining({ rideId: ride.id, inspectionType: 'follow_up' }),
    );

    expectApiError(
      await s.api.admin.post(`/api/rides/${ride.id}/status`, { status: 'in_service', reason: 'Fine' }),
      403,
      'forbidden',
    );
    expectApiError(
      await s.api.inspector.post(`/api/rides/${ride.id}/status`, { status: 'in_service', reason: 'Fine' }),
      403,
      'forbidden',
    );
    const noReason = expectApiError(
      await s.api.supervisor.post(`/api/rides/${ride.id}/status`, { status: 'in_service' }),
      400,
      'validation_failed',
    );
    expect(noReason.issues?.map((i) => i.path)).toEqual(['reason']);
    expectApiError(
      await s.api.supervisor.patch(`/api/rides/${ride.id}`, { status: 'in_service' }),
      409,
      'override_required',
    );
    expect(count()).toBe(before + 1);
    expect(rideRow(s.db, 'Lantern Wheel').status).toBe('out_of_service');

    const reason = 'Maker’s engineer inspected the coupling on site and signed it off (report CE-31).';
    const res = await s.api.supervisor.post(`/api/rides/${ride.id}/status`, { status: 'in_service', reason });
    expect(res.status).toBe(200);
    expect(res.body.ride).toMatchObject({ status: 'in_service', statusReason: null });
    expect(count()).toBe(before + 2);
    const notice = noticeDetailSchema.parse(
      (await s.api.operator.get(`/api/notices/${res.body.notice.id}`)).body.notice,
    );
    expect(notice.kind).toBe('status_change');
    expect(notice.document.operatingStatus).toEqual({
      status: 'in_service',
      reason: `Override by Mira Delacourt: ${reason}`,
    });
    const change = s.db
      .select()
      .from(rideStatusChanges)
      .where(eq(rideStatusChanges.rideId, ride.id))
      .all()
      .at(-1);
    expect(change).toMatchObject({ event: 'override', override: true, reason, toStatus: 'in_service' });
    expect(auditOf('ride', ride.id).at(-1)?.summary).toContain('by override');
    // The override stands in for the follow-up: its booking is cleared.
    const schedule = s.db
      .select()
      .from(inspectionSchedules)
      .where(
        and(eq(inspectionSchedules.rideId, ride.id), eq(inspectionSchedules.inspectionType, 'follow_up')),
      )
      .get();
    expect(schedule).toMatchObject({ dueOn: null, assignedTo: null });
  });
});
