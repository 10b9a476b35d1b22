/**
 * Opens the phone's database through expo-sqlite's async API (on the web: a worker with OPFS storage),
 * applies the bundled migrations, and hands out one shared handle for the whole app.
 */
import { type SQLiteBindValue, type SQLiteDatabase, openDatabaseAsync } from 'expo-sqlite';

import { bundledMigrations } from '@/features/device-db/bundled-migrations';
import { type DeviceDb, type SqlExecutor, createDeviceDb } from '@/features/device-db/connection';
import { DeviceDbLockedError, DeviceDbOpenError } from '@/features/device-db/errors';
import { isDatabaseLockedError } from '@/features/device-db/lock-detection';
import { applyMigrations } from '@/features/device-db/migrations';

const DEVICE_DB_NAME = 'pivotwatch-device.db';

/**
 * One statement, as drizzle's proxy driver expects (rows as value arrays). On the web every call below is
 * a message to the database's worker and back through the page's main thread, so each statement uses as
 * few as it can: one for a statement without parameters that returns nothing (BEGIN, COMMIT, a
 * migration's DDL), and for a single row no fetch of the remaining rows.
 */
function expoExecutor(conn: SQLiteDatabase): SqlExecutor {
  return async (sql, params, method) => {
    if (method === 'run' && params.length === 0) {
      await conn.execAsync(sql);
      return { rows: [] };
    }
    const statement = await conn.prepareAsync(sql);
    try {
      const bind = params as SQLiteBindValue[];
      if (method === 'run') {
        await statement.executeAsync(bind);
        return { rows: [] };
      }
      const result = await statement.executeForRawResultAsync<Record<string, SQLiteBindValue>>(bind);
      if (method === 'get') {
        const row = await result.getFirstAsync();
        // No row: undefined, as drizzle's proxy driver expects (its declared type leaves that out).
        return { rows: row ?? (undefined as never) };
      }
      return { rows: await result.getAllAsync() };
    } finally {
      await statement.finalizeAsync();
    }
  };
}

let shared: Promise<DeviceDb> | null = null;

/**
 * Opens (once per page) and migrates the device database. Rejects with DeviceDbLockedError when another
 * tab holds it, DeviceDbOpenError otherwise; a failed open is not cached, so a retry can succeed.
 */
export function openDeviceDb(): Promise<DeviceDb> {
  shared ??= openFresh().catch((err: unknown) => {
    shared = null;
    throw err;
  });
  return shared;
}

async function openFresh(): Promise<DeviceDb> {
  let conn: SQLiteDatabase;
  try {
    conn = await openDatabaseAsync(DEVICE_DB_NAME);
  } catch (err) {
    throw isDatabaseLockedError(err) ? new DeviceDbLockedError(err) : new DeviceDbOpenError(err);
  }
  const deviceDb = createDeviceDb(expoExecutor(conn), () => conn.closeAsync());
  try {
    await applyMigrations(deviceDb, bundledMigrations());
  } catch (err) {
    await conn.closeAsync().catch(() => undefined);
    throw isDatabaseLockedError(err) ? new DeviceDbLockedError(err) : new DeviceDbOpenError(err);
  }
  return deviceDb;
}
