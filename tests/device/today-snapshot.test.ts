/**
 * Drawing Today before the device database answers, without ever reading early or showing someone else's
 * data: the gated handle (nothing reaches SQLite before it is opened; afterwards everything runs in the
 * order given, on the bound person's data), the per-person snapshot store, and its life in the query cache
 * (seeded out of date, dropped on any invalidation of the phone's data).
 * Outside references: WHATWG HTML "Web storage" (getItem gives null for a missing key; setItem may throw
 * QuotaExceededError), ECMA-262 JSON.stringify (a Date becomes its ISO string through Date.prototype.toJSON,
 * an undefined property is left out) and TanStack Query's documented cache behaviour (setQueryData's
 * `updatedAt`, a query is stale once `updatedAt + staleTime` has passed; invalidateQueries marks it so).
 */
import { QueryClient } from '@tanstack/react-query';

import { createGatedDeviceDb } from '@/features/device-db/connection';
import { bindDeviceOwner } from '@/features/device-db/device-owner';
import { listDrafts, saveDraft } from '@/features/device-db/drafts';
import { fieldKeys } from '@/features/device-db/field-keys';
import {
  clearTodaySnapshot,
  hasTodaySnapshot,
  readTodaySnapshot,
  writeTodaySnapshot,
} from '@/features/device-db/today-snapshot';
import {
  SEEDED_AT,
  followTodaySnapshot,
  seedTodayFromSnapshot,
} from '@/features/device-db/today-snapshot-cache';

import { type MemoryDeviceDb, memoryDeviceDb } from '@/tests/support/memory-device-db';

/** A Web Storage stand-in with the spec's observable behaviour for the calls used (WHATWG HTML, 12.2). */
class MemoryStorage {
  private map = new Map<string, string>();
  full = false;
  getItem(key: string): string | null {
    return this.map.has(key) ? this.map.get(key)! : null;
  }
  setItem(key: string, value: string): void {
    if (this.full) throw Object.assign(new Error('quota'), { name: 'QuotaExceededError' });
    this.map.set(key, String(value));
  }
  removeItem(key: string): void {
    this.map.delete(key);
  }
  get length() {
    return this.map.size;
  }
}

let storage: MemoryStorage;
beforeEach(() => {
  storage = new MemoryStorage();
  (globalThis as { localStorage?: unknown }).localStorage = storage;
});
afterEach(() => {
  delete (globalThis as { localStorage?: unknown }).localStorage;
});

const A = '6f1c2a4e-1b7d-4c3a-9e52-0d7c1f1a0a01';
const D1 = '6f1c2a4e-1b7d-4c3a-9e52-0d7c1f1a0a02';
const D2 = '6f1c2a4e-1b7d-4c3a-9e52-0d7c1f1a0a03';
const rides = [{ ride: { id: 'r1', name: 'Invented Wheel' }, assignment: null, drafts: [] }];
const sent = [{ id: 's1', needsAction: true }];
const sync = { waiting: 2, lastSuccessAt: '2026-05-01T08:00:00.000Z' };

describe('the gated device database handle', () => {
  let real: MemoryDeviceDb;
  beforeEach(async () => {
    real = await memoryDeviceDb();
  });
  afterEach(async () => {
    await real.close();
  });

  test('statements wait until it is opened, then run in order on the bound person', async () => {
    // Alice's draft, made while she was bound.
    await bindDeviceOwner(real, 'alice');
    await saveDraft(real, { id: A, rideId: 'r1', data: { note: 'hers' } });
    await bindDeviceOwner(real, 'bob');

    const gated = createGatedDeviceDb();
    const before = real.statements.length;
    const early = listDrafts(gated.dev);
    await new Promise((resolve) => setTimeout(resolve, 20));
    // Nothing reached SQLite: the read waits.
    expect(real.statements.length).toBe(before);

    // The binding runs on the real handle first (what the provider's `prepare` does), then the gate opens.
    await bindDeviceOwner(real, 'alice');
    gated.open(real);
    const seen = await early;
    expect(seen.map((d) => d.id)).toEqual([A]);
  });

  test('a failed opening fails every waiting statement with its reason', async () => {
    const gated = createGatedDeviceDb();
    const early = listDrafts(gated.dev);
    gated.fail(new Error('Pivotwatch is open in another tab.'));
    // drizzle wraps it ("Failed query: …"), keeping the reason as the cause.
    const reason = (p: Promise<unknown>) =>
      p.then(
        () => 'ran',
        (err: Error) => String((err.cause as Error | undefined)?.message ?? err.message),
      );
    expect(await reason(early)).toBe('Pivotwatch is open in another tab.');
    expect(await reason(listDrafts(gated.dev))).toBe('Pivotwatch is open in another tab.');
  });

  test('transactions on it commit as one after it opens', async () => {
    const gated = createGatedDeviceDb();
    const tx = gated.dev.transaction(async (t) => {
      await saveDraft(t, { id: D1, rideId: 'r1', data: {} });
      await saveDraft(t, { id: D2, rideId: 'r1', data: {} });
      return 'done';
    });
    gated.open(real);
    expect(await tx).toBe('done');
    expect((await listDrafts(real)).map((d) => d.id).sort()).toEqual([D1, D2].sort());
  });
});

describe('the Today snapshot store', () => {
  test('is read back only for the person it was saved for', () => {
    expect(writeTodaySnapshot('alice', { rides, sent, sync })).toBe(true);
    expect(readTodaySnapshot('alice')).toMatchObject({ userId: 'alice', rides, sent, sync });
    expect(readTodaySnapshot('bob')).toBeNull();
    expect(hasTodaySnapshot('bob')).toBe(false);
  });

  test('one snapshot per browser: saving for another person replaces it', () => {
    writeTodaySnapshot('alice', { rides, sent, sync });
    writeTodaySnapshot('bob', { rides: [], sent: [], sync });
    expect(readTodaySnapshot('alice')).toBeNull();
    expect(readTodaySnapshot('bob')?.rides).toEqual([]);
  });

  test('cleared, it is gone', () => {
    writeTodaySnapshot('alice', { rides, sent, sync });
    clearTodaySnapshot();
    expect(readTodaySnapshot('alice')).toBeNull();
    expect(storage.length).toBe(0);
  });

  test('data JSON would change is not saved, and the old snapshot goes (ECMA-262 Date.prototype.toJSON)', () => {
    writeTodaySnapshot('alice', { rides, sent, sync });
    const withDate = [{ ...rides[0], at: new Date('2026-05-01T08:00:00Z') }];
    expect(writeTodaySnapshot('alice', { rides: withDate, sent, sync })).toBe(false);
    expect(readTodaySnapshot('alice')).toBeNull();
  });

  test('an undefined property is fine: JSON leaves it out and reading gives undefined alike', () => {
    const withUndefined = [{ ...rides[0], note: undefined }];
    expect(writeTodaySnapshot('alice', { rides: withUndefined, sent, sync })).toBe(true);
  });

  test('a full storage leaves no snapshot rather than an old one (QuotaExceededError)', () => {
    writeTodaySnapshot('alice', { rides, sent, sync });
    storage.full = true;
    expect(writeTodaySnapshot('alice', { rides: [], sent, sync })).toBe(false);
    expect(readTodaySnapshot('alice')).toBeNull();
  });

  test('unreadable or older snapshots are not used', () => {
    storage.setItem('pivotwatch.today-snapshot', '{not json');
    expect(readTodaySnapshot('alice')).toBeNull();
    storage.setItem('pivotwatch.today-snapshot', JSON.stringify({ v: 0, userId: 'alice', rides, sent }));
    expect(readTodaySnapshot('alice')).toBeNull();
  });

  test('with no localStorage (a phone) nothing is kept and nothing breaks', () => {
    delete (globalThis as { localStorage?: unknown }).localStorage;
    expect(writeTodaySnapshot('alice', { rides, sent, sync })).toBe(false);
    expect(readTodaySnapshot('alice')).toBeNull();
    expect(() => clearTodaySnapshot()).not.toThrow();
  });
});

describe('the snapshot in the query cache', () => {
  let client: QueryClient;
  beforeEach(() => {
    client = new QueryClient({ defaultOptions: { queries: { retry: false } } });
  });
  afterEach(() => client.clear());

  test('is seeded only for its person, out of date so that the database is read at once', () => {
    writeTodaySnapshot('alice', { rides, sent, sync });
    expect(seedTodayFromSnapshot(client, 'bob')).toBe(false);
    expect(client.getQueryData(fieldKeys.rides())).toBeUndefined();

    expect(seedTodayFromSnapshot(client, 'alice')).toBe(true);
    expect(client.getQueryData(fieldKeys.rides())).toEqual(rides);
    expect(client.getQueryData(fieldKeys.sent())).toEqual(sent);
    const state = client.getQueryState(fieldKeys.rides())!;
    expect(state.dataUpdatedAt).toBe(SEEDED_AT);
    // staleTime 0 (field-api's DEVICE_STALE_MS): stale, so a mounting reader fetches from the database.
    expect(client.getQueryCache().find({ queryKey: fieldKeys.rides() })!.isStaleByTime(0)).toBe(true);
  });

  test('does not overwrite what the cache already holds', () => {
    client.setQueryData(fieldKeys.rides(), ['from the database']);
    writeTodaySnapshot('alice', { rides, sent, sync });
    seedTodayFromSnapshot(client, 'alice');
    expect(client.getQueryData(fieldKeys.rides())).toEqual(['from the database']);
  });

  test('is dropped when any of the phone data is invalidated or removed, not for other queries', async () => {
    const stop = followTodaySnapshot(client);
    writeTodaySnapshot('alice', { rides, sent, sync });
    client.setQueryData(['auth', 'session'], { user: { id: 'alice' } });
    client.setQueryData(fieldKeys.rides(), rides);
    await client.invalidateQueries({ queryKey: ['auth'] });
    expect(readTodaySnapshot('alice')).not.toBeNull();

    // A write (a draft started) invalidates the rides list.
    await client.invalidateQueries({ queryKey: fieldKeys.rides() });
    expect(readTodaySnapshot('alice')).toBeNull();

    writeTodaySnapshot('alice', { rides, sent, sync });
    client.removeQueries({ predicate: (q) => q.queryKey[0] !== 'auth' });
    expect(readTodaySnapshot('alice')).toBeNull();
    stop();
  });
});
