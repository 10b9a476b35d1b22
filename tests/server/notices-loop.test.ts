/**
 * The loop after a notice: the operator acknowledges it, reports corrective actions with photos, and the
 * inspection body closes or reopens each finding; the ride's status follows the findings that forbid
 * operation (severityInfo in features/review/schema.ts), and each change of status issues a status notice.
 */
import { and, eq } from 'drizzle-orm';

import { correctiveActions, notices } from '@/db/server/notices';
import { reviewQueue } from '@/db/server/review';
import { auditLog } from '@/db/server/schema';
import {
  findingStateResponseSchema,
  noticeDetailSchema,
  noticeListResponseSchema,
  noticeResponseSchema,
} from '@/features/notices/schema';
import { severityInfo } from '@/features/review/schema';
import { returnToServiceReason } from '@/server/notices/loop';
import { queueToday, refreshQueue } from '@/server/review/queue-refresh';

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
import { sha256Hex } from './sync-fixtures';

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
    const closed = await s.api.supervisor.post(`/api/findings/${noteFinding?.id}/close`, { note: 'Seen' });
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
    expect(notice.document.reinspection.reason).toContain('Findings 1, 3');
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
      await s.api.supervisor.post(`/api/findings/${findingId}/close`, {}),
      409,
      'already_closed',
    );
    expectApiError(
      await s.api.operator.post(`/api/findings/${findingId}/actions`, { note: 'More', photoShas: [] }),
      409,
      'finding_closed',
    );
  });

  test('closing the last finding that forbids operation returns the ride to service, with a status notice', async () => {
    expect(severityInfo.stop_now.mayOperate).toBe(false);
    expect(severityInfo.fix_by_date.mayOperate).toBe(true);
    const findingId = inspected.findingIds[stop];
    // A later inspection waiting for review puts the ride in the review queue, with its status.
    await inspectWithFindings(s, 'Twin Comet', [], 0);
    refreshQueue(s.db, queueToday(s.now()), [inspected.rideId]);
    const queued = () =>
      s.db.select().from(reviewQueue).where(eq(reviewQueue.rideId, inspected.rideId)).all();
    expect(queued().map((r) => r.rideStatus)).toEqual(['out_of_service']);
    s.setNow(new Date('2026-05-08T10:00:00.000Z'));
    const res = await s.api.supervisor.post(`/api/findings/${findingId}/close`, {
      note: 'Weld repaired, MT clear',
    });
    expect(res.status).toBe(200);
    const body = findingStateResponseSchema.parse(res.body);
    // The fix-by-date finding is still open, but it allows operation.
    expect(body.ride).toEqual({
      id: inspected.rideId,
      status: 'in_service',
      statusReason: returnToServiceReason,
    });
    expect(body.statusNotice).not.toBeNull();

    const ride = rideRow(s.db, 'Twin Comet');
    expect(ride).toMatchObject({ status: 'in_service', statusSince: '2026-05-08T10:00:00.000Z' });
    expect(auditOf('ride', ride.id).at(-1)?.summary).toContain('out_of_service → in_service');
    // Refreshed in the same transaction as the change.
    expect(queued().map((r) => r.rideStatus)).toEqual(['in_service']);

    const status = noticeDetailSchema.parse(
      (await s.api.operator.get(`/api/notices/${body.statusNotice?.id}`)).body.notice,
    );
    expect(status.kind).toBe('status_change');
    expect(status.document.operatingStatus).toEqual({ status: 'in_service', reason: returnToServiceReason });
    expect(status.document.reinspection.required).toBe(false);
    expect(status.document.inspection).toBeNull();
    // The status notice lists what is still open: the fix-by-date finding.
    expect(status.document.findings.map((f) => f.id)).toEqual([inspected.findingIds[dated]]);
    expect(status.deliveries.map((d) => d.status)).toEqual(['pending']);
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
    expectApiError(await s.api.supervisor.post(`/api/findings/${id}/close`, {}), 409, 'not_issued');
    expectApiError(await s.api.operator.post(`/api/findings/${id}/actions`, { note: 'x' }), 404, 'not_found');
  });
});
