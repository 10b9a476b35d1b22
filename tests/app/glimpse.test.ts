/**
 * The glimpse (features/session/glimpse.ts): one person's last results of chosen queries, kept in
 * localStorage so an offline reload draws Today before the device database has opened. Checked here:
 * only the chosen keys with data are kept, per person; they come back as they were (TanStack Query's
 * dehydrate/hydrate, which never puts older data over newer); too large a glimpse or a damaged one is
 * dropped; signing out (the web token store's clear) forgets every person's.
 */
import { QueryClient } from '@tanstack/react-query';

import { GLIMPSE_MAX_CHARS, forgetGlimpses, restoreGlimpse, saveGlimpse } from '@/features/session/glimpse';
import { tokenStore } from '@/features/session/token-store.web';

/** A Map-backed Storage (the app tests' React Native environment has no localStorage). */
class MemoryStorage implements Storage {
  private items = new Map<string, string>();
  get length() {
    return this.items.size;
  }
  clear() {
    this.items.clear();
  }
  getItem(key: string) {
    return this.items.get(key) ?? null;
  }
  key(i: number) {
    return [...this.items.keys()][i] ?? null;
  }
  removeItem(key: string) {
    this.items.delete(key);
  }
  setItem(key: string, value: string) {
    this.items.set(key, String(value));
  }
}

const RIDES = ['field', 'rides'] as const;
const SENT = ['field', 'sent'] as const;
const KEYS = [RIDES, SENT];

let storage: MemoryStorage;
beforeEach(() => {
  storage = new MemoryStorage();
  Object.defineProperty(globalThis, 'localStorage', { value: storage, configurable: true });
});
afterEach(() => {
  delete (globalThis as { localStorage?: Storage }).localStorage;
});

const client = () => new QueryClient({ defaultOptions: { queries: { retry: false } } });
const rides = [
  {
    ride: { id: 'r1', name: 'Harbour Swing', siteTimeZone: 'Europe/London' },
    assignment: { rideId: 'r1', inspectionType: 'periodic', nextDueOn: '2026-12-09' },
    drafts: [{ id: 'd1', rideId: 'r1', updatedAt: '2026-12-04T09:12:00.000Z' }],
  },
];

test('keeps the chosen queries with data, and gives them back as they were to the same person only', () => {
  const before = client();
  before.setQueryData(RIDES, rides, { updatedAt: 1_000 });
  before.setQueryData(['field', 'photo', 'abc'], 'data:image/jpeg;base64,AAAA');
  before.setQueryData(['auth', 'session'], { user: { id: 'u1' } });
  saveGlimpse(before, 'u1', KEYS);

  const stored = JSON.parse(storage.getItem('pivotwatch.glimpse.u1') ?? '{}') as {
    queries: { queryKey: unknown }[];
  };
  // Only the rides: the photo, the session and the sent list (no data yet) are not part of it.
  expect(stored.queries.map((q) => q.queryKey)).toEqual([RIDES]);

  const after = client();
  expect(restoreGlimpse(after, 'u1')).toBe(true);
  expect(after.getQueryData(RIDES)).toEqual(rides);
  expect(after.getQueryState(RIDES)?.dataUpdatedAt).toBe(1_000);
  // Someone else on the same browser gets nothing of it.
  const other = client();
  expect(restoreGlimpse(other, 'u2')).toBe(false);
  expect(other.getQueryData(RIDES)).toBeUndefined();
});

test('never puts an older glimpse over newer results already in memory', () => {
  const before = client();
  before.setQueryData(RIDES, rides, { updatedAt: 1_000 });
  saveGlimpse(before, 'u1', KEYS);
  const now = client();
  now.setQueryData(RIDES, [], { updatedAt: 2_000 });
  restoreGlimpse(now, 'u1');
  expect(now.getQueryData(RIDES)).toEqual([]);
});

test('a glimpse too large to be worth reading is not kept, nor the older one', () => {
  const c = client();
  c.setQueryData(RIDES, rides);
  saveGlimpse(c, 'u1', KEYS);
  expect(storage.getItem('pivotwatch.glimpse.u1')).not.toBeNull();
  c.setQueryData(SENT, [{ note: 'x'.repeat(GLIMPSE_MAX_CHARS) }]);
  saveGlimpse(c, 'u1', KEYS);
  // The earlier, smaller one is gone too: a stale glimpse would show a list that is no longer so.
  expect(storage.getItem('pivotwatch.glimpse.u1')).toBeNull();
  expect(restoreGlimpse(client(), 'u1')).toBe(false);
});

test('a damaged glimpse is dropped, not shown', () => {
  storage.setItem('pivotwatch.glimpse.u1', '{"queries": [ {"queryKey"');
  expect(restoreGlimpse(client(), 'u1')).toBe(false);
  expect(storage.getItem('pivotwatch.glimpse.u1')).toBeNull();
});

test('signing out forgets every person’s glimpse and nothing else', async () => {
  const c = client();
  c.setQueryData(RIDES, rides);
  saveGlimpse(c, 'u1', KEYS);
  saveGlimpse(c, 'u2', KEYS);
  storage.setItem('pivotwatch:diagnostics', '1');
  await tokenStore.set({ token: 't', expiresAt: '2026-12-05T00:00:00.000Z', user: {} as never });
  await tokenStore.clear();
  expect(storage.getItem('pivotwatch.glimpse.u1')).toBeNull();
  expect(storage.getItem('pivotwatch.glimpse.u2')).toBeNull();
  expect(storage.getItem('pivotwatch.session')).toBeNull();
  expect(storage.getItem('pivotwatch:diagnostics')).toBe('1');
  forgetGlimpses();
  expect(storage.length).toBe(1);
});

test('with no localStorage (a phone’s native app) there is simply no glimpse', () => {
  delete (globalThis as { localStorage?: Storage }).localStorage;
  const c = client();
  c.setQueryData(RIDES, rides);
  expect(() => saveGlimpse(c, 'u1', KEYS)).not.toThrow();
  expect(restoreGlimpse(client(), 'u1')).toBe(false);
});
