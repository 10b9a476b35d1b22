/**
 * A design revision that loosens a limit needs a second person: it waits as pending, the version in force
 * stays in force for the ride page, the phones' pull and the server's analysis, and only another
 * supervisor or admin (never its proposer) approves or rejects it. A revision that only tightens takes
 * effect at once. The "second person" rule is common practice for safety-relevant design changes
 * (four-eyes principle); which changes loosen a limit is tested in tests/engine/design-diff.test.ts.
 */

import { and, eq } from 'drizzle-orm';

import { auditLog, designVersions } from '@/db/server/schema';
import type { DesignData } from '@/features/loads/design-schema';
import { designAuditLines, entryChanges } from '@/features/registry/audit-diff';
import {
  auditListResponseSchema,
  designPendingResponseSchema,
  designResponseSchema,
  designVersionListResponseSchema,
  rideDetailResponseSchema,
} from '@/features/registry/schema';
import { analysePending } from '@/server/sync/analysis';

import { expectApiError, makeTestServer, type TestServer } from './helpers';
import { demoClients, type Clients } from './registry-helpers';
import { demoRide, makeRecord, otherReading, speedReading } from './sync-fixtures';

let server: TestServer;
let api: Clients;
let comet: ReturnType<typeof demoRide>;
beforeAll(async () => {
  server = await makeTestServer();
  api = await demoClients(server.app);
  comet = demoRide(server.db, 'Twin Comet');
});
afterAll(() => server.close());

/** The in-force design with pivot 0's clearance limit set, everything else as it is. */
const withClearance = (d: DesignData, maxClearanceM: number): DesignData => ({
  ...d,
  source: { ...d.source, revision: `${d.source.revision}+${maxClearanceM}` },
  pivots: d.pivots.map((p) => (p.joint === 0 ? { ...p, maxClearanceM } : p)),
});

const importJson = (
  who: Clients['admin'],
  data: DesignData,
  reason = 'Maker’s revision with new wear limits',
) => who.post(`/api/rides/${comet.id}/design/import`, { format: 'json', content: data, reason });

const current = async () =>
  designResponseSchema.parse((await api.inspector.get(`/api/rides/${comet.id}/design`)).body).design;
const pendingOf = async (who: Clients['admin'] = api.admin) =>
  designPendingResponseSchema.parse((await who.get(`/api/rides/${comet.id}/design/pending`)).body);
const decide = (who: Clients['admin'], version: number, decision: 'approve' | 'reject', reason: string) =>
  who.post(`/api/rides/${comet.id}/design/versions/${version}/decision`, { decision, reason });
const rowCount = () =>
  server.db.select().from(designVersions).where(eq(designVersions.rideId, comet.id)).all().length;

describe('a loosening revision waits for a second person', () => {
  let v1: DesignData;
  let pendingVersion: number;

  test('the import is stored as pending; the version in force stays current everywhere', async () => {
    const before = await current();
    v1 = before.data;
    const oldLimit = v1.pivots[0].maxClearanceM;
    const res = await importJson(api.supervisor, withClearance(v1, oldLimit * 1.5));
    expect(res.status).toBe(201);
    const created = designResponseSchema.parse(res.body).design;
    expect(created).toMatchObject({ approvalState: 'pending', basedOnVersion: before.version });
    pendingVersion = created.version;

    expect((await current()).version).toBe(before.version);
    const detail = rideDetailResponseSchema.parse((await api.inspector.get(`/api/rides/${comet.id}`)).body);
    expect(detail.design?.version).toBe(before.version);

    // Admins and supervisors see it with the version it would replace; inspectors do not see it at all.
    const p = await pendingOf(api.admin);
    expect(p.pending?.version).toBe(pendingVersion);
    expect(p.current?.version).toBe(before.version);
    const listed = designVersionListResponseSchema.parse(
      (await api.inspector.get(`/api/rides/${comet.id}/design/versions`)).body,
    ).versions;
    expect(listed.map((v) => v.version)).not.toContain(pendingVersion);
    expectApiError(
      await api.inspector.get(`/api/rides/${comet.id}/design/versions/${pendingVersion}`),
      404,
      'not_found',
    );
    const forSupervisor = designVersionListResponseSchema.parse(
      (await api.supervisor.get(`/api/rides/${comet.id}/design/versions`)).body,
    ).versions;
    expect(forSupervisor[0]).toMatchObject({ version: pendingVersion, approvalState: 'pending' });
  });

  test('the phones’ pull and the analysis use the version in force', async () => {
    const pull = await api.inspector.get('/api/sync/pull');
    expect(pull.status).toBe(200);
    const pulled = (pull.body.designs as { rideId: string; version: number }[]).find(
      (d) => d.rideId === comet.id,
    );
    expect(pulled?.version).toBe(pendingVersion - 1);

    // A record that names no design version is analysed with the one in force, never the pending one.
    const record = makeRecord(
      { id: comet.id, designVersionId: null, design: v1 },
      {
        readings: [speedReading(11.5), otherReading(0)],
      },
    );
    const push = await api.inspector.push([record]);
    expect(push.body.results[0].status).toBe('accepted');
    await analysePending(server.db);
    const got = (await api.supervisor.get(`/api/inspections/${record.id}`)).body.inspection;
    expect(got.analysis.designVersion).toBe(pendingVersion - 1);
  });

  test('a record that names the pending revision is refused, so it is never analysed', async () => {
    const pendingId = (await pendingOf()).pending?.id ?? '';
    const record = makeRecord({ id: comet.id, designVersionId: pendingId, design: v1 });
    const push = await api.inspector.push([record]);
    expect(push.body.results[0].status).toBe('rejected');
    expect(push.body.results[0].issues).toContainEqual(expect.objectContaining({ path: 'designVersionId' }));
  });

  test('no other version can be made while one is pending', async () => {
    const n = rowCount();
    const res = await importJson(api.admin, withClearance(v1, v1.pivots[0].maxClearanceM * 0.9));
    expectApiError(res, 409, 'design_pending');
    expect(rowCount()).toBe(n);
  });

  test('inspectors and operators may not see or decide a pending revision (403)', async () => {
    expectApiError(await api.inspector.get(`/api/rides/${comet.id}/design/pending`), 403, 'forbidden');
    expectApiError(await api.operator.get(`/api/rides/${comet.id}/design/pending`), 403, 'forbidden');
    expectApiError(await decide(api.inspector, pendingVersion, 'approve', 'Looks fine'), 403, 'forbidden');
    expectApiError(await decide(api.operator, pendingVersion, 'approve', 'Looks fine'), 403, 'forbidden');
    expect((await pendingOf()).pending?.approvalState).toBe('pending');
  });

  test('bad input is refused with 400 and changes nothing', async () => {
    const noReason = await decide(api.admin, pendingVersion, 'approve', '   ');
    expectApiError(noReason, 400, 'validation_failed');
    expect(noReason.body.error.issues.map((i: { path: string }) => i.path)).toContain('reason');
    expectApiError(
      await api.admin.post(`/api/rides/${comet.id}/design/versions/${pendingVersion}/decision`, {
        decision: 'maybe',
        reason: 'x',
      }),
      400,
      'validation_failed',
    );
    expectApiError(await decide(api.admin, 0, 'approve', 'x'), 400, 'validation_failed');
    expect((await pendingOf()).pending?.approvalState).toBe('pending');
  });

  test('the proposer cannot approve their own revision', async () => {
    const res = await decide(api.supervisor, pendingVersion, 'approve', 'I checked it myself');
    expectApiError(res, 403, 'own_revision');
    expect((await pendingOf()).pending?.version).toBe(pendingVersion);
  });

  test('another person approves: in force at once, with the decision kept and the audit in words', async () => {
    const res = await decide(
      api.admin,
      pendingVersion,
      'approve',
      'Checked against the maker’s letter 2026-04',
    );
    expect(res.status).toBe(200);
    const approved = designResponseSchema.parse(res.body).design;
    expect(approved).toMatchObject({
      approvalState: 'in_force',
      decidedByName: 'Rowan Ashby',
      createdByName: 'Mira Delacourt',
      decisionReason: 'Checked against the maker’s letter 2026-04',
    });
    expect(approved.decidedAt).not.toBeNull();
    expect((await current()).version).toBe(pendingVersion);
    expect((await pendingOf()).pending).toBeNull();
    // A second decision on the same version is refused.
    expectApiError(await decide(api.admin, pendingVersion, 'reject', 'Too late'), 409, 'design_not_pending');

    const pull = await api.inspector.get('/api/sync/pull');
    const pulled = (pull.body.designs as { rideId: string; version: number }[]).find(
      (d) => d.rideId === comet.id,
    );
    expect(pulled?.version).toBe(pendingVersion);

    const log = auditListResponseSchema.parse(
      (await api.admin.get(`/api/audit?entity=design&rideId=${comet.id}`)).body,
    ).entries;
    const approval = log.find((e) => e.action === 'update');
    expect(approval?.summary).toMatch(/version \d+ approved, now in force/);
    const oldMm = v1.pivots[0].maxClearanceM * 1000;
    const newMm = Number((oldMm * 1.5).toPrecision(12));
    const lines = designAuditLines(approval?.before, approval?.after, 'si') ?? [];
    expect(lines).toContain(`Max clearance at ${v1.pivots[0].name}: ${oldMm} mm → ${newMm} mm (loosened)`);
    const proposal = log.find((e) => e.action === 'create' && e.summary.includes('proposed'));
    expect(proposal?.summary).toMatch(/loosens 1 limit, waits for a second person/);
    expect(designAuditLines(proposal?.before, proposal?.after, 'si')).toContain(
      `Max clearance at ${v1.pivots[0].name}: ${oldMm} mm → ${newMm} mm (loosened)`,
    );
    // The log lists the change by its name and unit, not by stored keys ("data.pivots").
    const rows = entryChanges('design', proposal?.before, proposal?.after, 'si');
    expect(rows.some((c) => c.field.startsWith('data'))).toBe(false);
    expect(rows).toContainEqual(
      expect.objectContaining({
        field: `Max clearance at ${v1.pivots[0].name}`,
        before: `${oldMm} mm`,
        after: `${newMm} mm`,
        effect: 'loosened',
      }),
    );
    expect(rows).toContainEqual(
      expect.objectContaining({ field: 'Approval', after: 'Waiting for a second person' }),
    );
  });
});

describe('rejecting and tightening', () => {
  test('a rejected revision never takes effect; the reason is kept', async () => {
    const inForce = await current();
    const res = await importJson(
      api.admin,
      withClearance(inForce.data, inForce.data.pivots[0].maxClearanceM * 2),
    );
    const proposed = designResponseSchema.parse(res.body).design;
    expect(proposed.approvalState).toBe('pending');
    const rejected = await decide(api.supervisor, proposed.version, 'reject', 'No source for the new limit');
    expect(rejected.status).toBe(200);
    expect(designResponseSchema.parse(rejected.body).design).toMatchObject({
      approvalState: 'rejected',
      decidedByName: 'Mira Delacourt',
      decisionReason: 'No source for the new limit',
    });
    expect((await current()).version).toBe(inForce.version);
    const entry = server.db
      .select()
      .from(auditLog)
      .where(and(eq(auditLog.entityId, proposed.id), eq(auditLog.action, 'update')))
      .get();
    expect(entry?.summary).toMatch(/rejected .*stays in force — No source for the new limit/);
  });

  test('a tightening revision is in force at once, no second person', async () => {
    const inForce = await current();
    const res = await importJson(
      api.supervisor,
      withClearance(inForce.data, inForce.data.pivots[0].maxClearanceM * 0.8),
      'Tighter wear limit after the bushing survey',
    );
    expect(res.status).toBe(201);
    const made = designResponseSchema.parse(res.body).design;
    expect(made.approvalState).toBe('in_force');
    expect((await current()).version).toBe(made.version);
    expect((await pendingOf()).pending).toBeNull();
  });

  test('the editor path (PUT) follows the same rule', async () => {
    const inForce = await current();
    const res = await api.admin.put(`/api/rides/${comet.id}/design`, {
      reason: 'Raised force limit',
      data: {
        ...inForce.data,
        pivots: inForce.data.pivots.map((p) =>
          p.joint === 0 ? { ...p, maxForceN: (p.maxForceN ?? 1e5) * 2 } : p,
        ),
      },
      basedOnVersion: inForce.version,
    });
    expect(res.status).toBe(201);
    expect(designResponseSchema.parse(res.body).design.approvalState).toBe('pending');
    expect((await current()).version).toBe(inForce.version);
    // Clean up: the supervisor rejects it, so other tests see no pending revision.
    expect((await decide(api.supervisor, inForce.version + 1, 'reject', 'Not sourced')).status).toBe(200);
  });
});
