/**
 * An operator's corrective action may attach only photos they (their company) uploaded or can already
 * see on their notices. Knowing another photo's SHA-256 is not enough: it is answered as a photo not yet
 * uploaded, the same words as one that does not exist, and nothing is stored.
 */
import { correctiveActions } from '@/db/server/notices';

import { expectApiError } from './helpers';
import {
  approveAndIssue,
  inspectWithFindings,
  makeNoticeServer,
  photoPng,
  type Inspected,
  type NoticeServer,
} from './notices-fixtures';
import { sha256Hex } from './sync-fixtures';

jest.setTimeout(60_000);

const start = new Date('2026-05-04T09:00:00.000Z');
let s: NoticeServer;
let inspected: Inspected;
beforeAll(async () => {
  s = await makeNoticeServer(start);
  inspected = await inspectWithFindings(
    s,
    'Twin Comet',
    [{ severity: 'fix_before_operation', description: 'Gondola B lap bar slow to lock', photos: [0] }],
    1,
  );
  approveAndIssue(s, inspected.inspectionId);
});
afterAll(() => s.close());

const report = (client: NoticeServer['api']['operator'], photoShas: string[]) =>
  client.post(`/api/findings/${inspected.findingIds[0]}/actions`, {
    note: 'Lap bar latch replaced',
    photoShas,
  });

test('a staff photo on no notice of theirs, or another company’s upload, reads as not uploaded', async () => {
  const staffOnly = await inspectWithFindings(s, 'Lantern Wheel', [], 1);
  const theirs = photoPng(501);
  const theirSha = sha256Hex(theirs);
  expect((await s.putPhoto('operator2@pivotwatch.test', theirs, theirSha)).status).toBe(201);

  const err = expectApiError(
    await report(s.api.operator, [staffOnly.photoShas[0], theirSha]),
    400,
    'validation_failed',
  );
  expect(err.issues).toEqual([
    { path: 'photoShas.0', message: expect.stringMatching(/not been uploaded/) },
    { path: 'photoShas.1', message: expect.stringMatching(/not been uploaded/) },
  ]);
  expect(s.db.select().from(correctiveActions).all()).toHaveLength(0);
});

test('their own upload and a photo on their notice are attached', async () => {
  const own = photoPng(502);
  const ownSha = sha256Hex(own);
  expect((await s.putPhoto('operator@pivotwatch.test', own, ownSha)).status).toBe(201);
  const res = await report(s.api.operator, [ownSha, inspected.photoShas[0]]);
  expect(res.status).toBe(201);
  const stored = s.db.select().from(correctiveActions).all();
  expect(stored).toHaveLength(1);
  expect(stored[0].photoShas).toEqual([ownSha, inspected.photoShas[0]]);
});
