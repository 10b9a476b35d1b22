/**
 * The device database as the rest of the app sees it: a drizzle `sqlite-proxy` instance over any
 * statement executor (expo-sqlite's async API in the app, better-sqlite3 in node tests), with
 * transactions that no other statement can interleave with.
 *
 * Why not drizzle's own `db.transaction()`: over a proxy it only sends BEGIN/COMMIT through the same
 * callback, so any statement issued meanwhile by another part of the app (a draft save while the outbox
 * is being written) would run inside — and be rolled back with — someone else's transaction. Here every
 * statement outside a transaction waits on one mutex, and a transaction holds that mutex from BEGIN to
 * COMMIT, running its own statements on a second drizzle instance that bypasses the queue.
 */
import { Mutex } from 'async-mutex';
import { type AsyncRemoteCallback, type SqliteRemoteDatabase, drizzle } from 'drizzle-orm/sqlite-proxy';

import * as schema from '@/db/device/schema';

type DeviceSchema = typeof schema;
export type DeviceDrizzle = SqliteRemoteDatabase<DeviceSchema>;

/**
 * Runs one statement. drizzle's proxy contract: rows come back as arrays of column values; for `get`,
 * `rows` is the single row's array (or undefined when there is none); for `run`, rows are ignored.
 */
export type SqlExecutor = AsyncRemoteCallback;

export type DeviceDb = {
  /** Single statements, each queued behind any running transaction. Never use it inside `transaction`. */
  readonly db: DeviceDrizzle;
  /** One statement in drizzle's proxy form, queued like `db`'s (inside a transaction: its own, direct). */
  readonly run: SqlExecutor;
  /**
   * Runs `fn` between BEGIN IMMEDIATE and COMMIT with nothing else interleaving; ROLLBACK on a throw.
   * Inside, use only the `tx` handed in (its `db` skips the queue; its `transaction` simply joins).
   */
  transaction<T>(fn: (tx: DeviceDb) => Promise<T>): Promise<T>;
  close(): Promise<void>;
};

export function createDeviceDb(execute: SqlExecutor, close: () => Promise<void> = async () => {}): DeviceDb {
  const mutex = new Mutex();
  const run: SqlExecutor = (sql, params, method) => mutex.runExclusive(() => execute(sql, params, method));
  const queued = drizzle(run, { schema });
  const direct = drizzle(execute, { schema });

  // Nested calls join the running transaction: all of it commits or none of it does.
  const inTransaction: DeviceDb = {
    db: direct,
    run: execute,
    transaction: (fn) => fn(inTransaction),
    close: async () => {
      throw new Error('The device database cannot be closed inside a transaction.');
    },
  };

  return {
    db: queued,
    run,
    transaction: (fn) =>
      mutex.runExclusive(async () => {
        await execute('BEGIN IMMEDIATE', [], 'run');
        try {
          const result = await fn(inTransaction);
          await execute('COMMIT', [], 'run');
          return result;
        } catch (err) {
          try {
            await execute('ROLLBACK', [], 'run');
          } catch {
            // SQLite may already have rolled back (e.g. after SQLITE_FULL); the first error is the one to report.
          }
          throw err;
        }
      }),
    close: () => mutex.runExclusive(close),
  };
}

/**
 * A handle to a database still opening: screens can render and start their reads at once, and each
 * statement or transaction waits for `ready`, then runs on the real handle (through its queue, so nothing
 * interleaves with a transaction). Once `ready` has failed, every statement fails with its error.
 */
export function deferredDeviceDb(ready: Promise<DeviceDb>): DeviceDb {
  let real: DeviceDb | null = null;
  ready.then(
    (dev) => {
      real = dev;
    },
    () => undefined,
  );
  const settled = async () => real ?? (await ready);
  const run: SqlExecutor = async (sql, params, method) => (await settled()).run(sql, params, method);
  return {
    db: drizzle(run, { schema }),
    run,
    transaction: async (fn) => (await settled()).transaction(fn),
    close: async () => (await settled()).close(),
  };
}
