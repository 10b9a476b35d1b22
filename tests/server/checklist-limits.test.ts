/**
 * Checklist values with limits on the server: the push refuses a Pass on a value over its limit without a
 * written reason (naming the field), and an accepted record whose checklist value is over its limit is
 * analysed as over and lands in the review queue as "over". The limits are the demo's invented design
 * data (Twin Comet main axle: nominal 120 mm, minimum 119.2 mm, clearance limit 0.5 mm); a value exactly
 * at a limit is allowed and one beyond it is not (common practice for wear limits; from memory).
 */

import { and, eq } from 'drizzle-orm';

import { checklistTemplates, checklistTemplateVersions } from '@/db/server/schema';
import type { ChecklistAnswer } from '@/features/records/schema';
import { queueResponseSchema } from '@/features/review/schema';
import { type ChecklistContent, storedChecklistContentSchema } from '@/features/registry/schema';
import { toSI } from '@/lib/units';
import { analysePending } from '@/server/sync/analysis';

import { makeTestServer, type TestServer } from './helpers';
import { demoClients, type Clients } from './registry-helpers';
import { demoRide, makeRecord } from './sync-fixtures';

let server: TestServer;
let api: Clients;
let comet: ReturnType<typeof demoRide>;
let template: { id: string; version: number; content: ChecklistContent };
beforeAll(async () => {
  server = await makeTestServer();
  api = await demoClients(server.app);
  comet = demoRide(server.db, 'Twin Comet');
  const row = server.db
    .select({
      id: checklistTemplates.id,
      version: checklistTemplateVersions.version,
      content: checklistTemplateVersions.content,
    })
    .from(checklistTemplates)
    .innerJoin(checklistTemplateVersions, eq(checklistTemplateVersions.templateId, checklistTemplates.id))
    .where(and(eq(checklistTemplates.rideClass, 'rotating_arm')))
    .get();
  if (!row) throw new Error('the demo has no rotating-arm template');
  template = { ...row, content: storedChecklistContentSchema.parse(row.content) };
}, 60_000);
afterAll(() => server.close());

const mm = (v: number) => toSI(v, 'lengthSmall', 'mm');
const push = (records: unknown[]) => api.inspector.push(records);

/** Every item answered Pass, with the given values (mm) on the measured items named. */
function answers(values: Record<string, number>, patch: Record<string, Partial<ChecklistAnswer>> = {}) {
  return template.content.areas.flatMap((area) =>
    area.items.map((item): ChecklistAnswer => ({
      itemId: item.id,
      area: area.title,
      text: item.text,
      result: 'pass',
      ...(values[item.id] !== undefined ? { measurement: { valueSI: mm(values[item.id]), unit: 'mm' } } : {}),
      ...patch[item.id],
    })),
  );
}

const withTemplate = (checklist: ChecklistAnswer[]) =>
  makeRecord(comet, { templateId: template.id, templateVersion: template.version, checklist, readings: [] });

test('the demo template ties the main pin and clearance to the pivot’s design limits', () => {
  const items = new Map(template.content.areas.flatMap((a) => a.items.map((i) => [i.id, i])));
  expect(items.get('pins.main-diameter')?.limit).toEqual({
    source: 'design',
    joint: 0,
    quantity: 'pin_diameter',
  });
  expect(items.get('pins.main-clearance')?.limit).toEqual({
    source: 'design',
    joint: 0,
    quantity: 'clearance',
  });
  expect(items.get('drive.brake-gap')?.limit).toMatchObject({
    source: 'template',
    min: 0.25e-3,
    max: 0.75e-3,
  });
});

describe('Pass on a value over its limit', () => {
  test('is refused without a reason, with an issue naming the field; nothing is stored', async () => {
    const checklist = answers({ 'pins.main-diameter': 119.15 });
    const index = checklist.findIndex((a) => a.itemId === 'pins.main-diameter');
    const record = withTemplate(checklist);
    const res = await push([record]);
    expect(res.status).toBe(200);
    const result = res.body.results[0];
    expect(result.status).toBe('rejected');
    expect(result.issues).toEqual([
      {
        path: `checklist.${index}.overLimitReason`,
        message: expect.stringMatching(
          /^Over its limit: 119\.15 mm against ≥ 119\.2 mm \(design data: Main axle\)/,
        ),
      },
    ]);
    expect((await api.supervisor.get(`/api/inspections/${record.id}`)).status).toBe(404);
  });

  test('a value exactly at its limit passes without a reason; a blank reason is no reason', async () => {
    const atLimit = withTemplate(answers({ 'pins.main-diameter': 119.2, 'pins.main-clearance': 0.5 }));
    expect((await push([atLimit])).body.results[0].status).toBe('accepted');
    const blank = withTemplate(
      answers({ 'pins.main-clearance': 0.51 }, { 'pins.main-clearance': { overLimitReason: '   ' } }),
    );
    expect((await push([blank])).body.results[0].status).toBe('rejected');
  });

  test('is accepted with a reason, or marked Fail, and the record lands in the queue as over', async () => {
    const reasoned = withTemplate(
      answers(
        { 'pins.main-clearance': 0.62 },
        { 'pins.main-clearance': { overLimitReason: 'Bushing replaced during the visit; see the readings' } },
      ),
    );
    const failed = withTemplate(
      answers(
        { 'drive.brake-gap': 0.9 },
        { 'drive.brake-gap': { result: 'fail', note: 'Brake gap too wide, adjuster seized' } },
      ),
    );
    const res = await push([reasoned, failed]);
    expect(res.body.results.map((r: { status: string }) => r.status)).toEqual(['accepted', 'accepted']);
    await analysePending(server.db);

    for (const [record, id, ratio] of [
      [reasoned, 'checklist:pins.main-clearance', 0.62 / 0.5],
      [failed, 'checklist:drive.brake-gap', 0.4 / 0.25], // (0.9 − 0.5)/(0.75 − 0.5) from the middle of the range
    ] as const) {
      const got = (await api.supervisor.get(`/api/inspections/${record.id}`)).body.inspection;
      expect(got.analysisStatus).toBe('over');
      const item = got.analysis.envelope.find((e: { id: string }) => e.id === id);
      expect(item).toMatchObject({ status: 'over', quantity: 'lengthSmall' });
      expect(item.ratio).toBeCloseTo(ratio, 9);
    }

    const q = queueResponseSchema.parse(
      (await api.supervisor.get('/api/review/queue?urgency=over&pageSize=100')).body,
    );
    const ids = q.items.map((i) => i.inspectionId);
    expect(ids).toEqual(expect.arrayContaining([reasoned.id, failed.id]));
    expect(q.counts.over).toBeGreaterThanOrEqual(2);
  });
});
