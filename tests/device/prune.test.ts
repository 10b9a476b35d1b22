/**
 * The phone lets go of sent work (features/device-db/prune.ts). 200 inspections with photos go through
 * the real submit, push and photo upload against the fake server (tests/device/fake-sync-server.ts) on
 * pinned days, decisions arrive by a real pull, and unsent work sits beside them: queued and refused
 * records, drafts, a correction being recorded, photos still to upload. After pruning, the test checks
 * both sides against its own reading of the policy, written out below from the scenario's facts (not by
 * calling the module's rule): exactly the expected records and photos went, and every unsent record,
 * every draft and every photo any of them names is still there, byte for byte.
 *
 * The policy is ours (issue 15, item 8): 30 days after the server accepted a record, longer while its
 * decision is awaited (up to 180 days) or a returned record's correction has not reached the server.
 */
import { randomUUID } from 'node:crypto';

import { saveDraft, submitDraft } from '@/features/device-db/drafts';
import { getPhotoBytes, putPhotoBlob } from '@/features/device-db/photos';
import { defaultPrunePolicy, freeSpacePolicy, pruneDevice } from '@/features/device-db/prune';
import type { InspectionRecord, PhotoRef } from '@/features/records/schema';
import { uploadPhotos } from '@/features/sync/photo-upload';
import { pull } from '@/features/sync/pull';
import { pushOutbox } from '@/features/sync/push';
import { syncOnce } from '@/features/sync/sync-run';

import { FakeSyncServer } from './fake-sync-server';
import { fakeJpeg, makeRecord, photoRef } from '@/tests/support/inspection-fixtures';
import { type MemoryDeviceDb, memoryDeviceDb, signedInDeviceDb } from '@/tests/support/memory-device-db';

jest.mock('@/features/session/token-store', () => ({ tokenStore: { get: async () => null } }));

// Building 200 inspections through the real submit, push and upload takes a few seconds on a slow machine.
jest.setTimeout(60_000);

const DAY = 86_400_000;
const T0 = Date.parse('2026-03-01T09:00:00.000Z');
const day = (d: number) => new Date(T0 + d * DAY);
/** The moment the policy is applied: day 60 of the scenario. */
const NOW = day(60);

let dev: MemoryDeviceDb;
let server: FakeSyncServer;
let seed = 0;

beforeEach(async () => {
  dev = await signedInDeviceDb();
  server = new FakeSyncServer();
});
afterEach(async () => {
  await dev.close();
});

async function newPhoto(at: Date): Promise<PhotoRef> {
  const bytes = fakeJpeg(++seed, 200 + (seed % 50));
  const { sha256 } = await putPhotoBlob(dev, { bytes, mime: 'image/jpeg' }, at);
  return photoRef(sha256, 'image/jpeg', bytes.length);
}

/** Records a draft then submits it, as the recording screen does. */
async function submitWith(at: Date, photos: PhotoRef[], overrides: Partial<InspectionRecord> = {}) {
  const rec = makeRecord({
    photos,
    submittedAt: at.toISOString(),
    startedAt: at.toISOString(),
    ...overrides,
  });
  await saveDraft(dev, { id: rec.id, rideId: rec.rideId, data: { photos } }, at);
  return submitDraft(dev, rec, at);
}

/** One sync's sending half on a given day: the record is accepted, its photos uploaded, at that time. */
async function sendOn(at: Date) {
  const clock = () => at;
  await pushOutbox(server, dev, { newId: randomUUID, now: clock, force: true });
  await uploadPhotos(server, dev, { now: clock, force: true });
}

type Scenario = {
  accepted: { rec: InspectionRecord; day: number; decision: string | null }[];
  /** Records the phone must keep whatever their age: their ids and why. */
  unsentIds: string[];
  draftIds: string[];
  /** Photos a draft or an unsent record names. */
  neededShas: Set<string>;
  /** Original ids with a correction being recorded, or one sent but not yet accepted. */
  correctionPending: Set<string>;
  /** Original ids whose correction the server accepted. */
  correctionAccepted: Set<string>;
  /** Accepted records with a photo forced back to "not uploaded". */
  photoStillUploading: Set<string>;
  orphanOld: string;
  orphanNew: string;
};

/**
 * 200 accepted inspections, four a day over days 0–49, each with its own photo and one shared with the
 * next record; decisions by `i % 10`: 0–5 and 8 approved, 6 returned, 7 none yet, 9 a state this app does
 * not know. Then the special cases the rule must get right, and unsent work.
 */
async function buildScenario(): Promise<Scenario> {
  const accepted: Scenario['accepted'] = [];
  let shared: PhotoRef | null = null;
  for (let d = 0; d < 50; d++) {
    for (let k = 0; k < 4; k++) {
      const i = d * 4 + k;
      const own = await newPhoto(day(d));
      const next = await newPhoto(day(d));
      const rec = await submitWith(day(d), shared ? [own, shared] : [own]);
      shared = next;
      const decision =
        i % 10 === 6 ? 'returned' : i % 10 === 7 ? null : i % 10 === 9 ? 'withdrawn_by_desk' : 'approved';
      accepted.push({ rec, day: d, decision });
    }
    await sendOn(day(d));
  }
  // The last "next" photo is named by nothing submitted: give it to a draft.
  const draftIds: string[] = [];
  const neededShas = new Set<string>();
  const lateDraft = randomUUID();
  await saveDraft(dev, { id: lateDraft, rideId: 'ride-demo-1', data: { photos: [shared] } }, day(55));
  draftIds.push(lateDraft);
  neededShas.add(shared!.sha256);

  // A draft reusing a photo of an old approved record (index 0, day 0): that photo must stay.
  const reuse = accepted[0].rec.photos[0];
  const reuseDraft = randomUUID();
  await saveDraft(dev, { id: reuseDraft, rideId: 'ride-demo-1', data: { photos: [reuse] } }, day(58));
  draftIds.push(reuseDraft);
  neededShas.add(reuse.sha256);

  // Returned originals (indexes 6, 16, 26 are returned and 60 days old):
  // 6: its correction reached the server → the original may go; 16: a correction is being recorded;
  // 26: a correction was submitted and waits in the outbox.
  const correctionAccepted = new Set([accepted[6].rec.id]);
  const correctionPending = new Set([accepted[16].rec.id, accepted[26].rec.id]);
  const fix6 = await submitWith(day(52), [await newPhoto(day(52))], { amendsId: accepted[6].rec.id });
  await sendOn(day(52));
  accepted.push({ rec: fix6, day: 52, decision: null });
  const fix16 = randomUUID();
  await saveDraft(
    dev,
    { id: fix16, rideId: 'ride-demo-1', data: { amendsId: accepted[16].rec.id } },
    day(59),
  );
  draftIds.push(fix16);

  // Unsent: one refused by the server, then queued records (never pushed) and a correction queued.
  const unsentIds: string[] = [];
  const refused = await submitWith(day(3), [await newPhoto(day(3)), accepted[1].rec.photos[0]], {
    rideId: server.rejectRideId,
  });
  await sendOn(day(3.5));
  unsentIds.push(refused.id);
  refused.photos.forEach((p) => neededShas.add(p.sha256));
  for (let q = 0; q < 5; q++) {
    const rec = await submitWith(day(1 + q), [await newPhoto(day(1 + q))]);
    unsentIds.push(rec.id);
    rec.photos.forEach((p) => neededShas.add(p.sha256));
  }
  const fix26 = await submitWith(day(59), [accepted[26].rec.photos[0]], { amendsId: accepted[26].rec.id });
  unsentIds.push(fix26.id);
  fix26.photos.forEach((p) => neededShas.add(p.sha256));

  // Decisions arrive by pull, as the server sends them.
  server.pullPages.push({
    cursor: 'c1',
    decisions: accepted
      .filter((a) => a.decision !== null)
      .map((a) => ({
        inspectionId: a.rec.id,
        rideId: a.rec.rideId,
        state: a.decision,
        decidedAt: day(a.day + 1).toISOString(),
      })),
  });
  await pull(server, dev, { now: () => day(59) });

  // An old approved record whose second photo has not gone up yet (its upload keeps failing).
  const stillUploading = accepted[40].rec;
  dev.sqlite
    .prepare("UPDATE photo_blobs SET upload_state = 'pending' WHERE sha256 = ?")
    .run(stillUploading.photos[1].sha256);

  // Photos no draft or record names: one stored 20 days ago, one 2 days ago (its draft may be about to save).
  const orphanOld = (await newPhoto(day(40))).sha256;
  const orphanNew = (await newPhoto(day(58))).sha256;

  return {
    accepted,
    unsentIds,
    draftIds,
    neededShas,
    correctionPending,
    correctionAccepted,
    photoStillUploading: new Set([stillUploading.id]),
    orphanOld,
    orphanNew,
  };
}

/** The policy as the issue states it, applied to the scenario's own facts. */
function expectedKept(s: Scenario, keepDays: number): Set<string> {
  const kept = new Set<string>();
  for (const a of s.accepted) {
    const ageDays = (NOW.getTime() - day(a.day).getTime()) / DAY;
    const settled =
      a.decision === 'approved' ||
      (a.decision === 'returned' && s.correctionAccepted.has(a.rec.id) && !s.correctionPending.has(a.rec.id));
    const keep =
      s.photoStillUploading.has(a.rec.id) ||
      s.correctionPending.has(a.rec.id) ||
      (a.decision === 'returned' && !settled) ||
      (!settled && ageDays < defaultPrunePolicy.pendingDays) ||
      (settled && ageDays < keepDays);
    if (keep) kept.add(a.rec.id);
  }
  return kept;
}

const outboxIds = () =>
  new Set(
    dev.sqlite
      .prepare('SELECT id FROM outbox')
      .all()
      .map((r) => (r as { id: string }).id),
  );
const blobShas = () =>
  new Set(
    dev.sqlite
      .prepare('SELECT sha256 FROM photo_blobs')
      .all()
      .map((r) => (r as { sha256: string }).sha256),
  );

describe('200 synced inspections with photos beside unsent work', () => {
  let s: Scenario;
  let built: Buffer;
  // Built once through the real code, then each case starts from a copy of the database.
  beforeAll(async () => {
    const first = await signedInDeviceDb();
    dev = first;
    server = new FakeSyncServer();
    s = await buildScenario();
    built = first.sqlite.serialize();
    await first.close();
  });
  beforeEach(async () => {
    await dev.close();
    dev = await memoryDeviceDb(built);
  });

  test('only what the policy keeps remains and nothing unsent is lost', async () => {
    expect(s.accepted).toHaveLength(201);
    const before = {
      outbox: dev.sqlite
        .prepare('SELECT id, state, json, updated_at FROM outbox WHERE state <> ?')
        .all('accepted'),
      drafts: dev.sqlite.prepare('SELECT id, json, updated_at FROM drafts ORDER BY id').all(),
      needed: new Map(
        await Promise.all(
          [...s.neededShas].map(async (sha) => [sha, await getPhotoBytes(dev, sha)] as const),
        ),
      ),
    };
    expect([...before.needed.values()].every((b) => b !== null)).toBe(true);

    const report = await pruneDevice(dev, { now: NOW });

    const kept = expectedKept(s, defaultPrunePolicy.keepDays);
    const remaining = outboxIds();
    const removedRecords = s.accepted.filter((a) => !kept.has(a.rec.id)).map((a) => a.rec.id);
    // Both sides: every expected record remains, and no other accepted record does.
    for (const id of kept) expect(remaining.has(id)).toBe(true);
    for (const id of removedRecords) expect(remaining.has(id)).toBe(false);
    expect(report.records).toBe(removedRecords.length);
    // The boundary: index 120 (approved) was accepted on day 30, exactly 30 days ago, so its time has run out;
    // index 124 (approved, day 31) has a day left.
    expect(remaining.has(s.accepted[120].rec.id)).toBe(false);
    expect(remaining.has(s.accepted[124].rec.id)).toBe(true);
    // A sanity check on the scenario itself, so a mistake in the oracle cannot pass silently.
    expect(removedRecords.length).toBeGreaterThan(70);
    expect(kept.size).toBeGreaterThan(100);

    // Unsent records and drafts: all there, unchanged.
    expect(
      dev.sqlite.prepare('SELECT id, state, json, updated_at FROM outbox WHERE state <> ?').all('accepted'),
    ).toEqual(before.outbox);
    expect(before.outbox.map((r) => (r as { id: string }).id).sort()).toEqual([...s.unsentIds].sort());
    expect(dev.sqlite.prepare('SELECT id, json, updated_at FROM drafts ORDER BY id').all()).toEqual(
      before.drafts,
    );
    expect(before.drafts).toHaveLength(s.draftIds.length);

    // Photos: kept exactly when a remaining record or a draft names them, or they are not on the server yet.
    const shas = blobShas();
    for (const [sha, bytes] of before.needed) expect(await getPhotoBytes(dev, sha)).toEqual(bytes);
    const namedByKept = new Set(
      s.accepted.filter((a) => kept.has(a.rec.id)).flatMap((a) => a.rec.photos.map((p) => p.sha256)),
    );
    for (const sha of namedByKept) expect(shas.has(sha)).toBe(true);
    const allAcceptedShas = new Set(s.accepted.flatMap((a) => a.rec.photos.map((p) => p.sha256)));
    const removedShas = [...allAcceptedShas].filter((sha) => !namedByKept.has(sha) && !s.neededShas.has(sha));
    for (const sha of removedShas) expect(shas.has(sha)).toBe(false);
    expect(shas.has(s.orphanOld)).toBe(false);
    expect(shas.has(s.orphanNew)).toBe(true);
    expect(report.photos).toBe(removedShas.length + 1);
    // Nothing on the phone is left without its photo.
    const unnamed = dev.sqlite
      .prepare(
        `SELECT o.id FROM outbox o, json_each(o.json, '$.photos') p
       WHERE NOT EXISTS (SELECT 1 FROM photo_blobs b WHERE b.sha256 = json_extract(p.value, '$.sha256'))`,
      )
      .all();
    expect(unnamed).toEqual([]);

    // Applying it again the same day removes nothing more.
    expect(await pruneDevice(dev, { now: NOW })).toEqual({ records: 0, photos: 0, photoBytes: 0 });
  });

  test('"free space now" removes every settled record at once but keeps awaited decisions, returns and unsent work', async () => {
    await pruneDevice(dev, { now: NOW, policy: freeSpacePolicy });
    const kept = expectedKept(s, 0);
    const remaining = outboxIds();
    for (const a of s.accepted) expect(remaining.has(a.rec.id)).toBe(kept.has(a.rec.id));
    // What stays: no decision yet, an unknown state, returned without a correction on the server, a photo uploading.
    for (const a of s.accepted.filter((x) => x.decision === null || x.decision === 'withdrawn_by_desk'))
      expect(remaining.has(a.rec.id)).toBe(true);
    for (const id of s.unsentIds) expect(remaining.has(id)).toBe(true);
    expect(dev.sqlite.prepare('SELECT count(*) AS n FROM drafts').get()).toEqual({ n: s.draftIds.length });
    for (const sha of s.neededShas) expect(blobShas().has(sha)).toBe(true);
  });
});

test('a record whose decision never comes stays 180 days, then goes', async () => {
  const rec = await submitWith(day(0), [await newPhoto(day(0))]);
  await sendOn(day(0));
  expect(await pruneDevice(dev, { now: new Date(T0 + 179 * DAY) })).toMatchObject({ records: 0, photos: 0 });
  expect(outboxIds().has(rec.id)).toBe(true);
  expect(await pruneDevice(dev, { now: new Date(T0 + 180 * DAY) })).toMatchObject({ records: 1, photos: 1 });
  expect(outboxIds().has(rec.id)).toBe(false);
  expect(dev.sqlite.prepare('SELECT count(*) AS n FROM photo_blobs').get()).toEqual({ n: 0 });
});

test('nothing unsent goes, however old: queued, sending, refused records and their photos', async () => {
  const refused = await submitWith(day(0), [await newPhoto(day(0))], { rideId: server.rejectRideId });
  await sendOn(day(0));
  const queued = await submitWith(day(0), [await newPhoto(day(0))]);
  const sending = await submitWith(day(0), [await newPhoto(day(0))]);
  // As an interrupted run leaves it: marked sending under a batch id, no answer yet.
  dev.sqlite.prepare("UPDATE outbox SET state = 'sending', batch_id = 'b-1' WHERE id = ?").run(sending.id);
  const before = dev.sqlite.prepare('SELECT * FROM outbox ORDER BY id').all();
  const beforeBlobs = dev.sqlite
    .prepare('SELECT sha256, upload_state, data FROM photo_blobs ORDER BY sha256')
    .all();
  expect(new Map(before.map((r) => [(r as { id: string }).id, (r as { state: string }).state]))).toEqual(
    new Map([
      [refused.id, 'rejected'],
      [queued.id, 'queued'],
      [sending.id, 'sending'],
    ]),
  );
  expect(await pruneDevice(dev, { now: day(3650), policy: freeSpacePolicy })).toEqual({
    records: 0,
    photos: 0,
    photoBytes: 0,
  });
  expect(dev.sqlite.prepare('SELECT * FROM outbox ORDER BY id').all()).toEqual(before);
  expect(
    dev.sqlite.prepare('SELECT sha256, upload_state, data FROM photo_blobs ORDER BY sha256').all(),
  ).toEqual(beforeBlobs);
});

test('a sent record that a draft names stays, whatever its decision (a correction starts from it)', async () => {
  const rec = await submitWith(day(0), [await newPhoto(day(0))]);
  await sendOn(day(0));
  server.pullPages.push({ cursor: 'c1', decisions: [{ inspectionId: rec.id, state: 'approved' }] });
  await pull(server, dev, { now: () => day(1) });
  const draftId = randomUUID();
  await saveDraft(dev, { id: draftId, rideId: rec.rideId, data: { amendsId: rec.id } }, day(40));
  expect(await pruneDevice(dev, { now: day(60) })).toEqual({ records: 0, photos: 0, photoBytes: 0 });
  expect(outboxIds().has(rec.id)).toBe(true);
  dev.sqlite.prepare('DELETE FROM drafts WHERE id = ?').run(draftId);
  expect(await pruneDevice(dev, { now: day(60) })).toMatchObject({ records: 1, photos: 1 });
});

test('every sync ends by applying the policy: a decision pulled in that run lets an old record go', async () => {
  const rec = await submitWith(day(0), [await newPhoto(day(0))]);
  const first = await syncOnce(server, dev, { newId: randomUUID, now: () => day(0) });
  expect(first).toMatchObject({ error: null, pruned: { records: 0, photos: 0 } });
  expect(outboxIds().has(rec.id)).toBe(true);
  server.pullPages.push({ cursor: 'c2', decisions: [{ inspectionId: rec.id, state: 'approved' }] });
  const later = await syncOnce(server, dev, { newId: randomUUID, now: () => day(31) });
  expect(later.pruned).toMatchObject({ records: 1, photos: 1 });
  expect(outboxIds().size).toBe(0);
});
