/**
 * The device database for node tests: the real schema and the real generated device migrations, run
 * through the same `createDeviceDb` as the app, over better-sqlite3 in memory instead of expo-sqlite.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';

import Database from 'better-sqlite3';

import { type DeviceDb, type SqlExecutor, createDeviceDb } from '@/features/device-db/connection';
import { noteSession } from '@/features/device-db/device-keys';
import { bindDeviceOwner } from '@/features/device-db/device-owner';
import {
  type MigrationJournal,
  applyMigrations,
  migrationsFromJournal,
} from '@/features/device-db/migrations';

const DIR = join(__dirname, '..', '..', 'drizzle', 'device');

export function deviceMigrationsFromDisk() {
  const journal = JSON.parse(readFileSync(join(DIR, 'meta', '_journal.json'), 'utf8')) as MigrationJournal;
  const sqlByKey = Object.fromEntries(
    journal.entries.map((e) => [
      `m${String(e.idx).padStart(4, '0')}`,
      readFileSync(join(DIR, `${e.tag}.sql`), 'utf8'),
    ]),
  );
  return migrationsFromJournal(journal, sqlByKey);
}

export type MemoryDeviceDb = DeviceDb & { sqlite: Database.Database; statements: string[] };

/** `from`: a copy of another one's `sqlite.serialize()`, so a test can start many cases from one built state. */
export async function memoryDeviceDb(from?: Buffer): Promise<MemoryDeviceDb> {
  const sqlite = new Database(from ?? ':memory:');
  const statements: string[] = [];
  const execute: SqlExecutor = async (sql, params, method) => {
    statements.push(sql);
    // An await between statements, like the worker round-trip in the browser, so interleaving can happen.
    await new Promise((resolve) => setImmediate(resolve));
    const stmt = sqlite.prepare(sql);
    if (method === 'run' || !stmt.reader) {
      stmt.run(...params);
      return { rows: [] };
    }
    stmt.raw(true);
    if (method === 'get') return { rows: stmt.get(...params) as unknown[] };
    return { rows: stmt.all(...params) as unknown[][] };
  };
  const dev = createDeviceDb(execute, async () => {
    sqlite.close();
  });
  await applyMigrations(dev, deviceMigrationsFromDisk());
  return Object.assign(dev, { sqlite, statements });
}

/** The person a signed-in test phone is bound to (`signedInDeviceDb`). */
export const TEST_PHONE_PERSON = 'inspector-on-test-phone';

/**
 * A phone someone has signed in on, as the app leaves it before any screen reads it: bound to the person
 * and under a session, so records it submits are signed with that sign-in's key.
 */
export async function signedInDeviceDb(userId = TEST_PHONE_PERSON): Promise<MemoryDeviceDb> {
  const dev = await memoryDeviceDb();
  await bindDeviceOwner(dev, userId);
  await noteSession(dev, `test session of ${userId}`);
  return dev;
}
