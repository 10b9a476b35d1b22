/**
 * Unused photos are removed after the grace period (server/sync/photo-cleanup.ts), and a photo named by
 * anything stored is never removed: an inspection (its photo list and its record), a finding's photos or
 * closing evidence, a corrective action, an issued notice's document. Each kind of reference is tried on
 * a photo that nothing else names.
 */
import fs from 'node:fs';
import { randomUUID } from 'node:crypto';

import { eq, sql } from 'drizzle-orm';

import { inspectionPhotos, photos } from '@/db/server/inspections';
import { correctiveActions, notices } from '@/db/server/notices';
import { findings } from '@/db/server/review';
import { storageOf } from '@/server/storage';
import { photoPathOf } from '@/server/sync/photo-store';
import { removeUnreferencedPhotos, startPhotoCleanup } from '@/server/sync/photo-cleanup';

import { userIdOf } from './helpers';
import {
  approveAndIssue,
  inspectWithFindings,
  makeNoticeServer,
  photoPng,
  type NoticeServer,
} from './notices-fixtures';
import { sha256Hex } from './sync-fixtures';

const start = new Date('2026-05-04T08:00:00Z');
let s: NoticeServer;
beforeAll(async () => {
  s = await makeNoticeServer(start);
});
afterAll(() => s.close());

const upload = async (seed: number, email = 'operator@pivotwatch.test') => {
  const bytes = photoPng(seed);
  const sha = sha256Hex(bytes);
  const res = await s.putPhoto(email, bytes, sha);
  if (res.status !== 201) throw new Error(`upload failed: ${res.text}`);
  return sha;
};
const kept = (sha: string) =>
  s.db.select().from(photos).where(eq(photos.sha256, sha)).get() !== undefined &&
  fs.existsSync(photoPathOf(s.config.dataDir, sha));

test('only photos that nothing names and that are older than the grace period are removed', async () => {
  // An inspection with two photos, a finding on it and its notice.
  const inspected = await inspectWithFindings(
    s,
    'Skylark',
    [{ severity: 'fix_by_date', description: 'Step edge worn', dueOn: '2026-05-30', photos: [0] }],
    2,
  );
  const notice = approveAndIssue(s, inspected.inspectionId);
  const [findingId] = inspected.findingIds;

  // One photo per other kind of reference, each named by nothing else.
  const onFinding = await upload(101, 'supervisor@pivotwatch.test');
  const onEvidence = await upload(102, 'supervisor@pivotwatch.test');
  const onAction = await upload(103);
  const onNotice = await upload(104);
  const onPhotoList = await upload(105, 'inspector@pivotwatch.test');
  const unusedOld = await upload(106);
  const unusedYoung = await upload(107);

  s.db
    .update(findings)
    .set({
      photoShas: [inspected.photoShas[0], onFinding],
      closeEvidence: { photoShas: [onEvidence], reference: null, correctiveActions: 1 },
    })
    .where(eq(findings.id, findingId))
    .run();
  s.db
    .insert(correctiveActions)
    .values({
      id: randomUUID(),
      findingId,
      reportedBy: userIdOf(s.db, 'operator@pivotwatch.test'),
      reportedAt: start.toISOString(),
      note: 'Step edge replaced.',
      photoShas: [onAction],
    })
    .run();
  s.db.run(
    sql`UPDATE ${notices} SET document = json_insert(document, '$.findings[0].photos[#]', json_object('sha256', ${onNotice})) WHERE id = ${notice.id}`,
  );
  s.db
    .insert(inspectionPhotos)
    .values({
      id: randomUUID(),
      inspectionId: inspected.inspectionId,
      sha256: onPhotoList,
      mime: 'image/png',
      bytes: 1,
      caption: 'Added later',
      takenAt: start.toISOString(),
    })
    .run();

  // Everything but the young photo was stored 30 days ago.
  s.db
    .update(photos)
    .set({ storedAt: new Date(start.getTime() - 30 * 86_400_000).toISOString() })
    .where(sql`${photos.sha256} <> ${unusedYoung}`)
    .run();
  const now = new Date(start.getTime() + 60_000);

  const removed = await removeUnreferencedPhotos(s.db, storageOf(s.config), { now, graceDays: 14 });
  expect(removed).toEqual([unusedOld]);
  expect(fs.existsSync(photoPathOf(s.config.dataDir, unusedOld))).toBe(false);
  for (const sha of [
    ...inspected.photoShas,
    onFinding,
    onEvidence,
    onAction,
    onNotice,
    onPhotoList,
    unusedYoung,
  ])
    expect(kept(sha)).toBe(true);

  // Run again: nothing more goes. Fifteen days on, the young one has passed its grace period too.
  expect(await removeUnreferencedPhotos(s.db, storageOf(s.config), { now, graceDays: 14 })).toEqual([]);
  const later = new Date(now.getTime() + 15 * 86_400_000);
  expect(await removeUnreferencedPhotos(s.db, storageOf(s.config), { now: later, graceDays: 14 })).toEqual([
    unusedYoung,
  ]);
});

test('the daily job runs the clean-up on its schedule', async () => {
  const sha = await upload(201);
  s.db.update(photos).set({ storedAt: '2020-01-01T00:00:00.000Z' }).where(eq(photos.sha256, sha)).run();
  // Every second, for this test only.
  const job = startPhotoCleanup({
    db: s.db,
    storage: storageOf(s.config),
    graceDays: 14,
    schedule: '* * * * * *',
  });
  try {
    const deadline = Date.now() + 5000;
    while (kept(sha) && Date.now() < deadline) await new Promise((r) => setTimeout(r, 100));
    expect(kept(sha)).toBe(false);
  } finally {
    job.stop();
  }
});
