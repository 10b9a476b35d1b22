/**
 * Notices carry the ride's pivot life as it stood when they were issued: per pivot each fatigue detail's
 * life used and projected limit date (hand-worked below, Palmgren–Miner per EN 1993-1-9), the NDT due
 * dates, with the basis, the assumptions and the standards; the PDF (read back by pdf-parse, built on
 * Mozilla's pdf.js) and the e-mail print the same words, with the caution.
 */
import { execFileSync } from 'node:child_process';
import path from 'node:path';
import { randomUUID } from 'node:crypto';

import { and, eq } from 'drizzle-orm';

import { runningLog } from '@/db/server/life';
import { inspections, type StoredAnalysis } from '@/db/server/inspections';
import { designVersions, users } from '@/db/server/schema';
import { noticeDetailSchema } from '@/features/notices/schema';
import { rideListPageSchema } from '@/features/registry/schema';
import { CAUTION_SHORT } from '@/lib/caution-text';
import { noticeEmail } from '@/server/notices/deliveries';
import { renderNoticePdf } from '@/server/notices/pdf';

import type { TestServer } from './helpers';
import { demoClients, makePinnedServer, type Clients } from './registry-helpers';

jest.setTimeout(60_000);

const today = '2026-06-15';
const now = new Date(`${today}T10:00:00Z`);
let server: TestServer;
let api: Clients;
let rideId: string;

beforeAll(async () => {
  server = await makePinnedServer(now);
  // The demo seeds a running log; these checks start from an empty one so their sums are worked by hand.
  server.db.delete(runningLog).run();
  api = await demoClients(server.app);
  const rides = rideListPageSchema.parse((await api.admin.get('/api/rides?pageSize=50')).body).rides;
  rideId = rides.find((r) => r.name === 'Twin Comet')!.id;
}, 60_000);
afterAll(() => server.close());

function pdfText(pdf: Buffer): string {
  const out = execFileSync(process.execPath, [path.join(__dirname, 'support', 'read-pdf.cjs')], {
    input: pdf,
    maxBuffer: 64 * 1024 * 1024,
  });
  return (JSON.parse(out.toString('utf8')) as { text: string }).text.replace(/\s+/g, ' ');
}

test('a status notice carries the pivot life; the app, the PDF and the e-mail say the same', async () => {
  // An analysis whose detail does 2e-3 of damage per ride cycle (Twin Comet: ride cycle 150 s).
  const design = server.db
    .select()
    .from(designVersions)
    .where(and(eq(designVersions.rideId, rideId), eq(designVersions.version, 1)))
    .get()!;
  const inspector = server.db.select().from(users).where(eq(users.role, 'inspector')).get()!;
  const at = '2026-06-01T09:00:00.000Z';
  server.db
    .insert(inspections)
    .values({
      id: randomUUID(),
      rideId,
      inspectorId: inspector.id,
      type: 'periodic',
      startedAt: at,
      submittedAt: at,
      receivedAt: at,
      batchId: randomUUID(),
      designVersionId: design.id,
      record: {} as never,
      contentSha256: randomUUID(),
      analysis: {
        engineVersion: '1.2.0',
        designVersionId: design.id,
        designVersion: 1,
        durationS: 10,
        fatigue: [
          {
            detail: 0,
            joint: 0,
            name: 'Axle in double shear',
            categoryMPa: 100,
            shear: true,
            stressPerKnMPa: 0.05,
            cases: [{ kind: 'operating', maxRangeMPa: 60, damage: 2e-3 / 15, perRideCycle: 2e-3 }],
            damagePerRideCycle: 2e-3,
            damageLimit: 1,
          },
        ],
      } as unknown as StoredAnalysis,
      analysisStatus: 'within',
      analysedAt: at,
    })
    .run();
  // 100 ride cycles on each of 2026-06-05 and 2026-06-14: 200 logged; the log is 10 days old, so the rate
  // is 200 / 10 = 20 a day. Damage 200 × 2e-3 = 0.4 → 40.0 % used; (1 − 0.4) / (20 × 2e-3) = 15 days →
  // 2026-06-30.
  for (const day of ['2026-06-05', '2026-06-14'])
    expect((await api.operator.post(`/api/rides/${rideId}/running-log`, { day, cycles: 100 })).status).toBe(
      201,
    );

  const res = await api.supervisor.post(`/api/rides/${rideId}/status`, {
    status: 'restricted',
    reason: 'Axle fatigue life to be reviewed by the maker',
  });
  expect(res.status).toBe(200);
  const notice = noticeDetailSchema.parse(
    (await api.operator.get(`/api/notices/${res.body.notice.id}`)).body.notice,
  );
  const life = notice.document.pivotLife!;
  expect(life.asOf).toBe(today);
  const axle = life.pivots.find((p) => p.lines.some((l) => l.startsWith('Axle in double shear')))!;
  expect(axle.lines).toContain('Axle in double shear: life used 40.0 % · projected limit 30 Jun 2026');
  // The pivot's NDT plans (demo design data) come with their due dates and states.
  expect(axle.lines.some((l) => /^NDT (MT|UT|PT|VT|ET) every \d+ days: due /.test(l))).toBe(true);
  expect(life.basis).toMatch(/from the inspection submitted 1 Jun 2026/);
  expect(life.log).toMatch(/2 days, .*200 ride cycles/);
  expect(life.assumptions.join(' ')).toMatch(/applied to the whole log/);
  expect(life.standards.join(' ')).toMatch(/EN 1993-1-9/);

  const text = pdfText(
    await renderNoticePdf(notice.document, { pageSize: 'A4', loadPhoto: async () => null }),
  );
  expect(text).toContain('Pivot life');
  expect(text).toContain('Axle in double shear: life used 40.0 % · projected limit 30 Jun 2026');
  expect(text).toContain('ASTM E1049-85');

  const mail = noticeEmail(notice.document);
  expect(mail.text).toContain('- Axle in double shear: life used 40.0 % · projected limit 30 Jun 2026');
  expect(mail.html).toContain('Pivot life as of');
  expect(mail.text).toContain(CAUTION_SHORT);
});
