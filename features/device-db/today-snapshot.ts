/**
 * The last Today an inspector saw, kept in the browser's localStorage so that a reload (usually offline)
 * can draw Today at once, while the device database still opens in its worker; the database's answer
 * replaces it moments later. It is a copy of what the database said, never a source: writes (starting an
 * inspection, a sync) go to the database, which they wait for.
 *
 * One snapshot per browser, stamped with its person. It is shown only to that same person, and dropped when
 * anyone signs out, when the phone is bound to someone else, and as soon as anything that Today shows is
 * marked out of date (a write invalidates the field queries: features/inspections/use-today-data.ts), until Today reads again.
 * Pure (no React); on a phone without localStorage every call does nothing.
 */
const KEY = 'pivotwatch.today-snapshot';
/** Bumped when the shape of what Today reads changes: an older snapshot is then simply not used. */
const VERSION = 1;

export type TodaySnapshot<Rides = unknown, Sent = unknown, Sync = unknown> = {
  v: number;
  userId: string;
  savedAt: string;
  rides: Rides;
  sent: Sent;
  /** The sync panel's counts and last outcome as the database last gave them. */
  sync: Sync;
};

function storage(): Storage | null {
  try {
    return typeof localStorage === 'undefined' ? null : localStorage;
  } catch {
    // Storage disabled (a privacy setting): no snapshot, Today waits for the database as before.
    return null;
  }
}

/** The snapshot saved for `userId`, or null (none, another person's, an older shape, unreadable). */
export function readTodaySnapshot(userId: string): TodaySnapshot | null {
  const raw = storage()?.getItem(KEY);
  if (!raw) return null;
  try {
    const snap = JSON.parse(raw) as Partial<TodaySnapshot>;
    if (snap.v !== VERSION || snap.userId !== userId || !('rides' in snap) || !('sent' in snap)) return null;
    return snap as TodaySnapshot;
  } catch {
    return null;
  }
}

export function hasTodaySnapshot(userId: string): boolean {
  return readTodaySnapshot(userId) !== null;
}

/**
 * Saves what Today read for `userId`, replacing any earlier snapshot. Values that JSON would change (a
 * Date, a Map, undefined inside an array) are not saved: the snapshot must draw exactly what the database drew.
 */
export function writeTodaySnapshot(
  userId: string,
  data: Pick<TodaySnapshot, 'rides' | 'sent' | 'sync'>,
): boolean {
  const store = storage();
  if (!store) return false;
  const snap: TodaySnapshot = { v: VERSION, userId, savedAt: new Date().toISOString(), ...data };
  const json = JSON.stringify(snap);
  if (!sameAfterJson(data, (JSON.parse(json) as TodaySnapshot) ?? {})) {
    clearTodaySnapshot();
    return false;
  }
  try {
    store.setItem(KEY, json);
    return true;
  } catch {
    // Storage full: better no snapshot than an old one.
    clearTodaySnapshot();
    return false;
  }
}

export function clearTodaySnapshot(): void {
  try {
    storage()?.removeItem(KEY);
  } catch {
    // Nothing stored can be read back either.
  }
}

function sameAfterJson(data: Pick<TodaySnapshot, 'rides' | 'sent' | 'sync'>, back: Partial<TodaySnapshot>) {
  return (
    deepEqual(data.rides, back.rides) && deepEqual(data.sent, back.sent) && deepEqual(data.sync, back.sync)
  );
}

function deepEqual(a: unknown, b: unknown): boolean {
  if (a === b) return true;
  if (typeof a !== 'object' || typeof b !== 'object' || a === null || b === null) return false;
  if (Array.isArray(a) !== Array.isArray(b)) return false;
  if (Object.getPrototypeOf(a) !== Object.prototype && !Array.isArray(a)) return false;
  // JSON leaves out an object's undefined properties; reading one back gives undefined just the same.
  const defined = (o: object) =>
    Object.keys(o).filter((k) => (o as Record<string, unknown>)[k] !== undefined);
  const ka = defined(a);
  const kb = defined(b);
  if (ka.length !== kb.length) return false;
  return ka.every((k) => deepEqual((a as Record<string, unknown>)[k], (b as Record<string, unknown>)[k]));
}
