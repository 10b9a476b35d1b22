import fs from 'node:fs';

import bcrypt from 'bcryptjs';
import { count, eq } from 'drizzle-orm';

import { companies, rides, sites, users } from '@/db/server/schema';
import { openDb, type OpenedDb } from '@/server/db';
import {
  demoOperators,
  demoPassword,
  demoRides,
  demoSites,
  demoUsers,
  seedDemoData,
} from '@/server/seed/demo';

import { makeTempDir } from './helpers';

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

test('the database is opened with WAL and foreign keys on, and refuses a ride for an unknown company', () => {
  const database = freshDb();
  expect(database.sqlite.pragma('journal_mode', { simple: true })).toBe('wal');
  expect(database.sqlite.pragma('foreign_keys', { simple: true })).toBe(1);
  expect(() =>
    database.db.insert(rides).values({ name: 'Orphan', rideClass: 'other', operatorCompanyId: 'nope' }).run(),
  ).toThrow(/FOREIGN KEY/);
});
