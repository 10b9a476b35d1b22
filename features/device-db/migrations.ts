/**
 * Applies drizzle-kit's generated device migrations in journal order, each in its own transaction,
 * recording the applied tags in `__migrations`. drizzle's expo migrator needs its sync driver, and the
 * proxy migrator reads files from disk, so neither fits the async expo-sqlite path; this is the same
 * idea (journal order, statement breakpoints) over our executor.
 */
import { sql } from 'drizzle-orm';

import type { DeviceDb } from '@/features/device-db/connection';

export type DeviceMigration = { tag: string; statements: string[] };

/** The parts of drizzle-kit's `meta/_journal.json` used here. */
export type MigrationJournal = { entries: { idx: number; tag: string }[] };

/** Turns the journal plus the SQL text of each migration (keyed `m0000`, as `migrations.js` does) into steps. */
export function migrationsFromJournal(
  journal: MigrationJournal,
  sqlByKey: Record<string, string>,
): DeviceMigration[] {
  return [...journal.entries]
    .sort((a, b) => a.idx - b.idx)
    .map((entry) => {
      const source = sqlByKey[`m${String(entry.idx).padStart(4, '0')}`];
      if (source === undefined) throw new Error(`Device migration ${entry.tag} is missing from the bundle.`);
      return {
        tag: entry.tag,
        statements: source
          .split('--> statement-breakpoint')
          .map((s) => s.trim())
          .filter((s) => s.length > 0),
      };
    });
}

/**
 * The tags already applied. A database that has them reads them in one statement (the common case: every
 * start of the app); only a fresh one, without the table yet, creates it first.
 */
async function appliedTags(deviceDb: DeviceDb): Promise<Set<string>> {
  const read = async () =>
    new Set((await deviceDb.db.values<[string]>('SELECT tag FROM __migrations')).map((row) => row[0]));
  try {
    return await read();
  } catch {
    // No table yet (a fresh database). Any other failure repeats below and is reported from there.
    await deviceDb.db.run(
      'CREATE TABLE IF NOT EXISTS __migrations (tag TEXT PRIMARY KEY NOT NULL, applied_at TEXT NOT NULL)',
    );
    return read();
  }
}

/** Runs the migrations not yet applied; returns the tags it applied. */
export async function applyMigrations(deviceDb: DeviceDb, migrations: DeviceMigration[]): Promise<string[]> {
  const done = await appliedTags(deviceDb);
  const applied: string[] = [];
  for (const migration of migrations) {
    if (done.has(migration.tag)) continue;
    await deviceDb.transaction(async (tx) => {
      for (const statement of migration.statements) await tx.db.run(statement);
      await tx.db.run(
        sql`INSERT INTO __migrations (tag, applied_at) VALUES (${migration.tag}, ${new Date().toISOString()})`,
      );
    });
    applied.push(migration.tag);
  }
  return applied;
}
