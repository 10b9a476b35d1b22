import type Database from 'better-sqlite3';

import type { Db } from '@/server/db';

/*
 * drizzle's better-sqlite3 instance carries its connection as `$client`, but the app's `Db` type
 * (server/db.ts) leaves it out. The sync code needs the connection itself for prepared statements on its
 * hot path and to stop background work once a database has been closed.
 */
const hasClient = (db: Db): db is Db & { $client: Database.Database } =>
  '$client' in db && typeof db.$client === 'object' && db.$client !== null;

export function sqliteOf(db: Db): Database.Database {
  if (!hasClient(db)) throw new Error('This drizzle instance has no better-sqlite3 connection.');
  return db.$client;
}

/** False once the connection was closed (a stopped server, a finished test): background work then ends. */
export function isOpen(db: Db): boolean {
  return hasClient(db) && db.$client.open;
}
