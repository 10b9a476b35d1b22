/**
 * The push stores a batch's accepted records together (multi-row INSERTs, one savepoint) and checks them
 * with the record schema compiled by zod. These tests hold the batched path to what the record-by-record
 * path answered and stored: every column of every row as the record says, a record the database refuses
 * costing only itself, and the compiled parser agreeing with zod's own runtime parser (the reference,
 * from the npm library itself) on good and bad records.
 */

import Database from 'better-sqlite3';
import { eq, inArray } from 'drizzle-orm';
import * as fc from 'fast-check';

import { inspectionPhotos, inspectionReadings, inspections } from '@/db/server/inspections';
import { inspectionRecordSchema, pushResultSchema } from '@/features/records/schema';
import { sqliteOf } from '@/server/sqlite-client';
import { compiledRecordSchema } from '@/server/sync/ingest';
import { designDataLookup } from '@/server/sync/plausibility-check';

import { makeTestServer, type TestServer } from './helpers';
import { demoClients, type Clients } from './registry-helpers';
import { demoRide, imageBytes, makeRecord, otherReading, photoRefFor, speedReading } from './sync-fixtures';

let server: TestServer;
let api: Clients;
let comet: ReturnType<typeof demoRide>;
beforeAll(async () => {
  server = await makeTestServer();
  api = await demoClients(server.app);
  comet = demoRide(server.db, 'Twin Comet');
});
afterAll(() => server.close());

const push = (records: unknown[]) => api.inspector.push(records);

test('a batch larger than one statement stores every row with the values the records carry', async () => {
  // 50 records (two inspection statements) of 12 readings (six reading statements), one with photos.
  const records = Array.from({ length: 50 }, (_, i) =>
    makeRecord(comet, {
      readings: [speedReading(11.5), ...Array.from({ length: 11 }, (_, k) => otherReading(i * 20 + k))],
      photos: i === 7 ? [photoRefFor(imageBytes(70)), photoRefFor(imageBytes(71))] : [],
    }),
  );
  const res = await push(records);
  expect(res.status).toBe(200);
  const body = pushResultSchema.parse(res.body);
  expect(body.results.map((r) => r.status)).toEqual(records.map(() => 'accepted'));

  const ids = records.map((r) => r.id);
  const stored = server.db.select().from(inspections).where(inArray(inspections.id, ids)).all();
  expect(stored).toHaveLength(50);
  for (const record of records) {
    const row = stored.find((s) => s.id === record.id);
    expect(row?.record).toEqual(record);
    expect(row).toMatchObject({ rideId: comet.id, designVersionId: comet.designVersionId, failedItems: 1 });
    const readings = server.db
      .select()
      .from(inspectionReadings)
      .where(eq(inspectionReadings.inspectionId, record.id))
      .all();
    expect(readings).toHaveLength(12);
    for (const r of record.readings)
      expect(readings.find((x) => x.id === r.id)).toMatchObject({
        rideId: comet.id,
        kind: r.kind,
        joint: r.joint,
        label: r.label,
        valueSi: r.valueSI,
        unit: r.unit,
        method: r.method,
        spreadSi: r.spreadSI ?? null,
        takenAt: r.takenAt,
        note: r.note ?? null,
      });
  }
  const photos = server.db
    .select()
    .from(inspectionPhotos)
    .where(eq(inspectionPhotos.inspectionId, records[7].id))
    .all();
  expect(photos.map((p) => p.sha256).sort()).toEqual(records[7].photos.map((p) => p.sha256).sort());
});

test('an amendment of a record earlier in the same batch is accepted and linked', async () => {
  const original = makeRecord(comet);
  const amendment = makeRecord(comet, { amendsId: original.id, notes: 'Corrected the speed' });
  const body = pushResultSchema.parse((await push([original, amendment])).body);
  expect(body.results.map((r) => r.status)).toEqual(['accepted', 'accepted']);
  const row = server.db.select().from(inspections).where(eq(inspections.id, amendment.id)).get();
  expect(row?.amendsId).toBe(original.id);
});

test('a record the database refuses is rejected alone; the rest of its batch is stored', async () => {
  const sqlite = sqliteOf(server.db);
  // A refusal no check foresees: the database itself raises a constraint error on one reading's label.
  sqlite.exec(`CREATE TRIGGER test_refuse BEFORE INSERT ON inspection_readings
    WHEN NEW.label = 'Refused by the database' BEGIN SELECT RAISE(ABORT, 'refused'); END`);
  try {
    const refused = makeRecord(comet, {
      readings: [speedReading(11.5), { ...otherReading(900), label: 'Refused by the database' }],
    });
    const before = makeRecord(comet);
    const after = makeRecord(comet);
    const again = { ...refused };
    const body = pushResultSchema.parse((await push([before, refused, after, again])).body);
    expect(body.results.map((r) => r.status)).toEqual(['accepted', 'rejected', 'accepted', 'rejected']);
    expect(body.results[1].issues?.[0]?.message).toMatch(/could not store this record/);
    const ids = [before.id, refused.id, after.id];
    const stored = server.db
      .select({ id: inspections.id })
      .from(inspections)
      .where(inArray(inspections.id, ids));
    expect(
      stored
        .all()
        .map((r) => r.id)
        .sort(),
    ).toEqual([before.id, after.id].sort());
    // Nothing of the refused record is left behind, not even its readings that went in before the refusal.
    const orphans = server.db
      .select()
      .from(inspectionReadings)
      .where(eq(inspectionReadings.inspectionId, refused.id))
      .all();
    expect(orphans).toEqual([]);
  } finally {
    sqlite.exec('DROP TRIGGER test_refuse');
  }
});

test('a design version whose stored data changes is judged by the new data in the next batch', async () => {
  // Reading far from the design speed, unconfirmed: refused against the real design...
  const fast = () => makeRecord(comet, { readings: [speedReading(40)] }, { confirm: false });
  const first = pushResultSchema.parse((await push([fast()])).body);
  expect(first.results[0].status).toBe('rejected');
  // ...and accepted once the same version says 40 rpm (the parsed design is never reused stale).
  const sqlite = sqliteOf(server.db);
  const { data } = sqlite
    .prepare('SELECT data FROM design_versions WHERE id = ?')
    .get(comet.designVersionId) as {
    data: string;
  };
  const design = JSON.parse(data);
  const changed = {
    ...design,
    motion: design.motion.map((m: { joint: number }) => (m.joint === 0 ? { ...m, rpm: 40 } : m)),
  };
  sqlite
    .prepare('UPDATE design_versions SET data = ? WHERE id = ?')
    .run(JSON.stringify(changed), comet.designVersionId);
  try {
    const second = pushResultSchema.parse((await push([fast()])).body);
    expect(second.results[0].status).toBe('accepted');
  } finally {
    sqlite.prepare('UPDATE design_versions SET data = ? WHERE id = ?').run(data, comet.designVersionId);
  }
});

test('two databases naming the same design version with different data each get their own', () => {
  // Parsed designs are kept for the process, keyed by id and the exact stored text: another database (a
  // restarted server's, a copy) whose version of the same id says 40 rpm must not get this one's parse.
  const { data } = sqliteOf(server.db)
    .prepare('SELECT data FROM design_versions WHERE id = ?')
    .get(comet.designVersionId) as { data: string };
  const design = JSON.parse(data);
  const changed = {
    ...design,
    motion: design.motion.map((m: { joint: number }) => (m.joint === 0 ? { ...m, rpm: 40 } : m)),
  };
  const databaseWith = (text: string) => {
    const db = new Database(':memory:');
    db.exec('CREATE TABLE design_versions (id TEXT PRIMARY KEY, data TEXT NOT NULL)');
    db.prepare('INSERT INTO design_versions (id, data) VALUES (?, ?)').run(comet.designVersionId, text);
    return db;
  };
  const first = databaseWith(data);
  const second = databaseWith(JSON.stringify(changed));
  try {
    const rpm = (db: Database.Database) =>
      designDataLookup(db)(comet.designVersionId)?.motion.find((m) => m.joint === 0)?.rpm;
    // In turn, so each lookup follows the other database's.
    for (let i = 0; i < 2; i++) {
      expect(rpm(first)).toBe(design.motion.find((m: { joint: number }) => m.joint === 0).rpm);
      expect(rpm(second)).toBe(40);
      expect(rpm(sqliteOf(server.db))).toBe(rpm(first));
    }
  } finally {
    first.close();
    second.close();
  }
});

describe('the compiled record parser answers as zod’s runtime parser does', () => {
  const sample = () => makeRecord(comet, { readings: [speedReading(11.5), otherReading(1)] });

  test('on valid records, the same output', () => {
    for (let i = 0; i < 20; i++) {
      const record = { ...sample(), notes: `  padded note ${i}  ` };
      expect(compiledRecordSchema.safeParse(record)).toEqual(inspectionRecordSchema.safeParse(record));
    }
  });

  test('on records with a field replaced by anything, the same success and the same issues', () => {
    const base = sample();
    const keys = Object.keys(base);
    fc.assert(
      fc.property(fc.constantFrom(...keys), fc.anything(), (key, value) => {
        const record = { ...base, [key]: value };
        const runtime = inspectionRecordSchema.safeParse(record);
        const compiled = compiledRecordSchema.safeParse(record);
        expect(compiled.success).toBe(runtime.success);
        expect(compiled.error?.issues).toEqual(runtime.error?.issues);
        if (runtime.success) expect(compiled.data).toEqual(runtime.data);
      }),
      { seed: 16, numRuns: 400 },
    );
  });
});
