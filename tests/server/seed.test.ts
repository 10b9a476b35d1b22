import { createHash } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';

import bcrypt from 'bcryptjs';
import { and, asc, count, eq, ne } from 'drizzle-orm';

import { inspectionReadings, inspections, photos, syncBatches } from '@/db/server/inspections';
import { findings, reviewQueue } from '@/db/server/review';
import { auditLog, companies, designVersions, rides, sites, users } from '@/db/server/schema';
import { analyseInspection } from '@/features/records/analysis';
import { urgencies } from '@/features/review/schema';
import { openDb, type OpenedDb } from '@/server/db';
import {
  demoOperators,
  demoPassword,
  demoRides,
  demoSites,
  demoUsers,
  seedDemoData,
} from '@/server/seed/demo';
import { demoInspectionId } from '@/server/seed/demo-activity';
import { demoInspections } from '@/server/seed/demo-inspections';
import { demoPhotoFiles, demoPhotosDir } from '@/server/seed/demo-photos';
import { designDocuments } from '@/db/server/parts';
import { documentsDirOf } from '@/server/documents/store';
import { partReplacementsOfRide } from '@/server/parts/replacements';
import { photoPathOf, photosDirOf } from '@/server/sync/photo-store';

import { makeTempDir } from './helpers';

// Seeding the demo history analyses every demo inspection with its load cases: seconds on a busy 2-core machine.
jest.setTimeout(30_000);

const dirs: string[] = [];
const opened: OpenedDb[] = [];
function freshDb(): OpenedDb {
  const dir = makeTempDir();
  dirs.push(dir);
  const db = openDb(dir);
  opened.push(db);
  return db;
}
afterAll(() => {
  for (const db of opened) db.close();
  for (const dir of dirs) fs.rmSync(dir, { recursive: true, force: true });
});

function counts({ db }: OpenedDb) {
  return {
    companies: db.select({ n: count() }).from(companies).get()?.n,
    sites: db.select({ n: count() }).from(sites).get()?.n,
    rides: db.select({ n: count() }).from(rides).get()?.n,
    users: db.select({ n: count() }).from(users).get()?.n,
  };
}

test('seeds the whole scenario into an empty database', async () => {
  const database = freshDb();
  expect(await seedDemoData(database.db, { nodeEnv: 'development' })).toBe('seeded');
  expect(counts(database)).toEqual({
    companies: 1 + demoOperators.length,
    sites: demoSites.length,
    rides: demoRides.length,
    users: demoUsers.length,
  });

  const classes = new Set(
    database.db
      .select({ c: rides.rideClass })
      .from(rides)
      .all()
      .map((r) => r.c),
  );
  expect(classes.size).toBeGreaterThanOrEqual(4);

  const restricted = database.db.select().from(rides).where(eq(rides.status, 'restricted')).all();
  expect(restricted).toHaveLength(1);
  expect(restricted[0].statusReason?.length).toBeGreaterThan(10);

  const tamsworth = database.db
    .select()
    .from(companies)
    .where(eq(companies.name, 'Tamsworth Pier Leisure'))
    .get();
  expect(tamsworth).toMatchObject({ kind: 'operator', noticeEmails: ['notices@tamsworth-pier.test'] });
});

test('every demo user has a cost-10 bcrypt hash of the demo password and the right company', async () => {
  const database = freshDb();
  await seedDemoData(database.db, { nodeEnv: 'test' });
  for (const demo of demoUsers) {
    const row = database.db
      .select({ hash: users.passwordHash, company: companies.name, role: users.role })
      .from(users)
      .leftJoin(companies, eq(companies.id, users.companyId))
      .where(eq(users.email, demo.email))
      .get();
    expect(row).toMatchObject({ role: demo.role, company: demo.company });
    expect(bcrypt.getRounds(row?.hash ?? '')).toBe(10);
    expect(await bcrypt.compare(demoPassword, row?.hash ?? '')).toBe(true);
  }
});

test('is idempotent: a second run changes nothing', async () => {
  const database = freshDb();
  await seedDemoData(database.db, { nodeEnv: 'development' });
  const before = counts(database);
  expect(await seedDemoData(database.db, { nodeEnv: 'development' })).toBe('skipped_existing_users');
  expect(counts(database)).toEqual(before);
});

test('never seeds in production', async () => {
  const database = freshDb();
  expect(await seedDemoData(database.db, { nodeEnv: 'production' })).toBe('skipped_production');
  expect(counts(database)).toEqual({ companies: 0, sites: 0, rides: 0, users: 0 });
});

test('the database is opened with WAL, commits synced to disk and foreign keys on, and refuses a ride for an unknown company', () => {
  const database = freshDb();
  expect(database.sqlite.pragma('journal_mode', { simple: true })).toBe('wal');
  expect(database.sqlite.pragma('foreign_keys', { simple: true })).toBe(1);
  // FULL (2) syncs the WAL at every commit: an accepted push survives a power cut. At NORMAL (1), the WAL
  // default better-sqlite3 builds with, a commit may roll back after a power loss (SQLite's "PRAGMA
  // synchronous" documentation).
  expect(database.sqlite.pragma('synchronous', { simple: true })).toBe(2);
  expect(() =>
    database.db.insert(rides).values({ name: 'Orphan', rideClass: 'other', operatorCompanyId: 'nope' }).run(),
  ).toThrow(/FOREIGN KEY/);
});

describe('the demo’s inspection history', () => {
  const seedDay = new Date('2026-05-04T09:30:00.000Z');
  // The operators' daily checks are inspection records too (server/seed/demo-daily-checks.ts); not counted here.
  const notDaily = ne(inspections.type, 'daily_pre_opening');
  const inspectionCount = (db: OpenedDb['db']) =>
    db.select({ n: count() }).from(inspections).where(notDaily).get()?.n;

  test('a development server’s data directory gets it: a useful review desk and trends on first start', async () => {
    const database = freshDb();
    const dataDir = dirs[dirs.length - 1];
    expect(await seedDemoData(database.db, { nodeEnv: 'development', dataDir }, { now: seedDay })).toBe(
      'seeded',
    );
    const { db } = database;
    const rows = db.select().from(inspections).where(notDaily).all();
    expect(rows).toHaveLength(demoInspections.length);
    // Every one analysed by the server's own analysis, as a pushed inspection is.
    expect(rows.every((r) => r.analysedAt !== null && r.analysis !== null)).toBe(true);
    for (const r of rows) {
      const design = db
        .select()
        .from(designVersions)
        .where(eq(designVersions.id, r.designVersionId ?? ''))
        .get();
      if (!design) throw new Error(`demo inspection ${r.id} has no design data`);
      expect(r.analysis?.joints.map((j) => j.peakForceN)).toEqual(
        analyseInspection(design.data, r.record.readings).joints.map((j) => j.peakForce.value),
      );
    }

    // Waiting for a decision: one over its limit, one with failed items, one near a limit, one with nothing.
    const waiting = rows.filter((r) => r.reviewState === 'submitted');
    const byId = (key: string) => rows.find((r) => r.id === demoInspectionId(key));
    expect(byId('tidebreaker-follow-up-0')).toMatchObject({
      reviewState: 'submitted',
      analysisStatus: 'over',
    });
    expect(
      byId('tidebreaker-follow-up-0')?.analysis?.envelope.find((e) => e.id === 'joints.1.force')?.status,
    ).toBe('over');
    expect(byId('whirligig-setup-0')).toMatchObject({ failedItems: 2, analysisStatus: 'within' });
    expect(byId('skylark-periodic-1')).toMatchObject({ analysisStatus: 'near', failedItems: 0 });
    // That one came from a phone with an older app, so the analysis says where its preview differs.
    expect(byId('skylark-periodic-1')?.analysis?.differences.length).toBeGreaterThan(0);
    expect(byId('wheel-periodic-0')).toMatchObject({ analysisStatus: 'within', failedItems: 0 });
    expect(waiting).toHaveLength(4);
    const queue = db.select().from(reviewQueue).all();
    // "overdue": the ride the demo's daily checks leave with a missed day (server/seed/demo-daily-checks.ts).
    expect(new Set(queue.map((q) => urgencies[q.urgency]))).toEqual(
      new Set(['over', 'failed', 'near', 'awaiting', 'past_due', 'overdue']),
    );
    expect(queue.filter((q) => q.dailyMissedOn !== null).map((q) => q.rideName)).toEqual(['Tidebreaker']);

    // History: decided inspections on several rides, with wear readings drifting over months.
    const decided = rows.filter((r) => r.reviewState !== 'submitted');
    expect(decided.every((r) => r.reviewedAt !== null && r.reviewedBy !== null)).toBe(true);
    expect(new Set(decided.map((r) => r.rideId)).size).toBeGreaterThanOrEqual(4);
    for (const [serial, joint] of [
      ['ORW-PX15-0412', 0],
      ['ORW-RX30-0158', 1],
    ] as const) {
      const ride = db.select().from(rides).where(eq(rides.serial, serial)).get();
      // The approved inspections' clearances, oldest first: rising toward the limit.
      const clearances = db
        .select({
          v: inspectionReadings.valueSi,
          kind: inspectionReadings.kind,
          joint: inspectionReadings.joint,
        })
        .from(inspectionReadings)
        .innerJoin(inspections, eq(inspections.id, inspectionReadings.inspectionId))
        .where(and(eq(inspectionReadings.rideId, ride?.id ?? ''), eq(inspections.reviewState, 'approved')))
        .orderBy(asc(inspections.submittedAt))
        .all()
        .filter((r) => r.kind === 'clearance' && r.joint === joint)
        .map((r) => r.v);
      expect(clearances.length).toBeGreaterThanOrEqual(5);
      expect([...clearances].sort((a, b) => a - b)).toEqual(clearances);
    }
    expect(db.select({ n: count() }).from(findings).get()?.n).toBeGreaterThan(0);

    // Photos: the bytes are on disk and in the photos table, for every photo a demo inspection refers to.
    const referenced = new Set(rows.flatMap((r) => r.record.photos.map((p) => p.sha256)));
    expect(referenced.size).toBeGreaterThanOrEqual(3);
    for (const sha of referenced) {
      const file = photoPathOf(dataDir, sha);
      expect(createHash('sha256').update(fs.readFileSync(file)).digest('hex')).toBe(sha);
      expect(db.select().from(photos).where(eq(photos.sha256, sha)).get()?.mime).toBe('image/jpeg');
    }
    // Skylark's maker's manual on its design data in force and two part replacements, one with its
    // certificate: each PDF stored whole, its bytes hashing (SHA-256, Node's crypto) to the name kept.
    const skylark = db.select().from(rides).where(eq(rides.serial, 'ORW-PX15-0412')).get();
    const docs = db
      .select()
      .from(designDocuments)
      .where(eq(designDocuments.rideId, skylark?.id ?? ''))
      .all();
    expect(docs.map((d) => [d.kind, d.version])).toEqual([['makers_manual', 1]]);
    const parts = partReplacementsOfRide(db, skylark?.id ?? '');
    expect(parts.map((p) => p.documents.length)).toEqual([1, 0]);
    for (const sha of [docs[0].sha256, parts[0].documents[0].sha256]) {
      const bytes = fs.readFileSync(path.join(documentsDirOf(dataDir), sha));
      expect(bytes.subarray(0, 5).toString('latin1')).toBe('%PDF-');
      expect(createHash('sha256').update(bytes).digest('hex')).toBe(sha);
    }

    // The demo pictures are small JPEGs of our own.
    for (const { name } of demoPhotoFiles) {
      const size = fs.statSync(path.join(demoPhotosDir, `${name}.jpg`)).size;
      expect(size).toBeGreaterThan(2_000);
      expect(size).toBeLessThan(80_000);
    }
  });

  test('tests and databases without a data directory get the register only', async () => {
    const database = freshDb();
    await seedDemoData(database.db, { nodeEnv: 'test', dataDir: dirs[dirs.length - 1] });
    expect(inspectionCount(database.db)).toBe(0);
    const other = freshDb();
    await seedDemoData(other.db, { nodeEnv: 'development' });
    expect(inspectionCount(other.db)).toBe(0);
  });

  test('an existing demo database gets the history on its next start, exactly once', async () => {
    const database = freshDb();
    const dataDir = dirs[dirs.length - 1];
    await seedDemoData(database.db, { nodeEnv: 'development', dataDir }, { now: seedDay, activity: false });
    expect(inspectionCount(database.db)).toBe(0);
    const { db } = database;
    const everything = () => ({
      inspections: inspectionCount(db),
      findings: db.select({ n: count() }).from(findings).get()?.n,
      photos: db.select({ n: count() }).from(photos).get()?.n,
      batches: db.select({ n: count() }).from(syncBatches).get()?.n,
      audit: db.select({ n: count() }).from(auditLog).get()?.n,
      files: fs.readdirSync(photosDirOf(dataDir)).length,
    });

    const later = new Date(seedDay.getTime() + 3 * 86_400_000);
    expect(await seedDemoData(db, { nodeEnv: 'development', dataDir }, { now: later })).toBe(
      'skipped_existing_users',
    );
    const once = everything();
    expect(once.inspections).toBe(demoInspections.length);
    expect(once.photos).toBe(demoPhotoFiles.length);
    expect(once.files).toBe(demoPhotoFiles.length);
    expect(once.audit).toBe(0);

    await seedDemoData(
      db,
      { nodeEnv: 'development', dataDir },
      { now: new Date(later.getTime() + 86_400_000) },
    );
    expect(everything()).toEqual(once);
  });
});
