/**
 * SIGKILL during a sync push: the real server process is killed while a phone's batches are in flight,
 * then started again on the same DATA_DIR. Every record the phone was told was accepted must be there,
 * whole (all its readings), exactly once; re-sending every batch (same batch ids, as a phone that never got
 * its answer does) and re-sending every record in new batches must add no row. SQLite's own
 * `PRAGMA integrity_check` must find the database sound after the kill.
 */
import fs from 'node:fs';
import path from 'node:path';

import Database from 'better-sqlite3';

import type { InspectionRecord } from '@/features/records/schema';
import { dataDirInUse } from '@/server/backup';
import { databaseFileName, openDb } from '@/server/db';
import { seedDemoData } from '@/server/seed/demo';

import { newPhoneKey, signedBatch } from '../support/phone-keys';
import { signIn, spawnServer, type ServerProcess } from './crash-helpers';
import { makeTempDir, userIdOf } from './helpers';
import { demoRide, makeRecord, otherReading, speedReading } from './sync-fixtures';

jest.setTimeout(180_000);

const BATCHES = 12;
const PER_BATCH = 10;
const READINGS = 3;

let dataDir: string;
let server: ServerProcess | null = null;
afterAll(async () => {
  await server?.kill();
  fs.rmSync(dataDir, { recursive: true, force: true });
});

type Batch = { batchId: string; records: InspectionRecord[]; signatures?: Record<string, unknown> };
type Answer = { batchId: string; results: { id: string; status: string }[] };

async function push(url: string, token: string, batch: Batch): Promise<Answer> {
  const res = await fetch(`${url}/api/sync/push`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json', Authorization: `Bearer ${token}` },
    body: JSON.stringify(batch),
  });
  if (res.status !== 200) throw new Error(`push ${res.status}: ${await res.text()}`);
  return (await res.json()) as Answer;
}

function stored(file: string) {
  const db = new Database(file, { readonly: true });
  try {
    return {
      ok: (db.pragma('integrity_check') as { integrity_check: string }[])[0].integrity_check,
      inspections: db.prepare('SELECT id FROM inspections').all() as { id: string }[],
      readingsPer: new Map(
        (
          db
            .prepare(
              'SELECT inspection_id AS id, count(*) AS n FROM inspection_readings GROUP BY inspection_id',
            )
            .all() as {
            id: string;
            n: number;
          }[]
        ).map((r) => [r.id, r.n]),
      ),
      batches: (db.prepare('SELECT count(*) AS n FROM sync_batches').get() as { n: number }).n,
    };
  } finally {
    db.close();
  }
}

test('a SIGKILL in the middle of pushes loses no accepted record and doubles none', async () => {
  dataDir = makeTempDir('pivotwatch-crash-sync-');
  const setup = openDb(dataDir);
  await seedDemoData(setup.db, { nodeEnv: 'test', dataDir });
  const ride = demoRide(setup.db, 'Twin Comet');
  const authorId = userIdOf(setup.db, 'inspector@pivotwatch.test');
  const before = (setup.sqlite.prepare('SELECT count(*) AS n FROM inspections').get() as { n: number }).n;
  setup.close();

  // The phone's key, registered once the server runs; every record is signed with it.
  const key = newPhoneKey();
  const batches: Batch[] = Array.from({ length: BATCHES }, () =>
    signedBatch(
      Array.from({ length: PER_BATCH }, () =>
        makeRecord(ride, {
          authorId,
          photos: [],
          readings: [speedReading(11.5), ...Array.from({ length: READINGS - 1 }, (_, i) => otherReading(i))],
        }),
      ),
      key,
    ),
  );

  server = await spawnServer(dataDir);
  // The running server holds DATA_DIR: no second server, no restore.
  expect(dataDirInUse(dataDir)).toBe(true);
  const token = await signIn(server.url, 'inspector@pivotwatch.test');
  const registered = await fetch(`${server.url}/api/devices/keys`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json', Authorization: `Bearer ${token}` },
    body: JSON.stringify({ publicKey: key.publicKey }),
  });
  expect(registered.status).toBe(201);
  const accepted = new Set<string>();
  const answered: Answer[] = [];
  let next = 0;
  let killed: Promise<string> | null = null;
  const live = server;
  // Four phones' worth of pushes at once; the kill comes while later batches are still being stored.
  const lane = async () => {
    while (next < batches.length && !killed) {
      const batch = batches[next++];
      try {
        const answer = await push(live.url, token, batch);
        answered.push(answer);
        for (const r of answer.results)
          if (r.status === 'accepted' || r.status === 'duplicate') accepted.add(r.id);
        if (answered.length === 3) killed = live.kill();
      } catch {
        // The connection died with the server: the phone keeps the batch and sends it again later.
      }
    }
  };
  await Promise.all([lane(), lane(), lane(), lane()]);
  expect(await killed).toBe('SIGKILL');
  server = null;
  // The operating system dropped the lock with the killed process: nothing stale to clear by hand.
  expect(dataDirInUse(dataDir)).toBe(false);
  expect(answered.length).toBeGreaterThanOrEqual(3);
  expect(answered.length).toBeLessThan(BATCHES);
  for (const a of answered) expect(a.results.every((r) => r.status === 'accepted')).toBe(true);

  const afterKill = stored(path.join(dataDir, databaseFileName));
  expect(afterKill.ok).toBe('ok');
  const ids = new Set(afterKill.inspections.map((r) => r.id));
  for (const id of accepted) expect(ids.has(id)).toBe(true);
  // Whole or not at all: every stored record has all its readings.
  const ours = batches.flatMap((b) => b.records.map((r) => r.id)).filter((id) => ids.has(id));
  for (const id of ours) expect(afterKill.readingsPer.get(id)).toBe(READINGS);

  server = await spawnServer(dataDir);
  const again = await signIn(server.url, 'inspector@pivotwatch.test');
  // Every batch again with its own id (the phone never learnt which got through).
  for (const batch of batches) {
    const answer = await push(server.url, again, batch);
    expect(answer.results.map((r) => r.status)).toEqual(batch.records.map(() => 'accepted'));
  }
  // The same records in new batches: the server already has each one.
  const sample = batches.slice(0, 4).flatMap((b) => b.records);
  const dup = await push(server.url, again, signedBatch(sample, key));
  expect(new Set(dup.results.map((r) => r.status))).toEqual(new Set(['duplicate']));
  await server.kill();
  server = null;

  const final = stored(path.join(dataDir, databaseFileName));
  expect(final.ok).toBe('ok');
  expect(final.inspections).toHaveLength(before + BATCHES * PER_BATCH);
  expect(new Set(final.inspections.map((r) => r.id)).size).toBe(final.inspections.length);
  for (const b of batches) for (const r of b.records) expect(final.readingsPer.get(r.id)).toBe(READINGS);
  expect(final.batches).toBe(BATCHES + 1);
});
