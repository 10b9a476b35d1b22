/**
 * Today fetches the round by itself only on a phone that has never synced — and it can tell that only
 * after reading the phone's record of the last sync. Until then every opening looked like a first visit,
 * so each reload (offline too) started a sync. Ride and people are invented demo data.
 */
import { Text } from 'react-native';
import { screen } from 'expo-router/testing-library';

import { makeQueryClient } from '@/features/api/query-client';
import { DeviceDbProvider } from '@/features/device-db/provider';
import { TodayScreen } from '@/features/inspections/today-screen';
import type { SessionUser } from '@/features/session/schema';

import { type MemoryDeviceDb, memoryDeviceDb } from '@/tests/support/memory-device-db';
import { renderScreens, sessionClient } from '@/tests/support/app-screens';
import { noSignal } from '@/tests/support/stand-in-api';

jest.setTimeout(30_000);

jest.mock('@/features/session/token-store', () => ({
  tokenStore: { get: async () => null, set: async () => {}, clear: async () => {} },
}));

// What the sync panel would show; `syncNow` records each call.
const mockSyncNow = jest.fn(async () => {});
let mockStatus = { loaded: false, lastSuccessAt: null as string | null };
jest.mock('@/features/sync/use-sync-status', () => ({
  useSyncStatus: () => ({
    waiting: 0,
    accepted: 0,
    photosWaiting: 0,
    photoBytesWaiting: 0,
    currentPhoto: null,
    lastAttemptAt: null,
    lastError: null,
    online: false,
    running: false,
    needsAttention: [],
    photosRefused: [],
    ...mockStatus,
    syncNow: mockSyncNow,
    refresh: async () => {},
    retryRecord: async () => {},
    retryPhoto: async () => {},
  }),
}));

const inspector: SessionUser = {
  id: 'u-ins',
  email: 'tobin.reyes@halvard.example',
  name: 'Tobin Reyes',
  role: 'inspector',
  companyId: null,
  companyName: null,
};

let dev: MemoryDeviceDb;
let clients: ReturnType<typeof makeQueryClient>[] = [];

beforeEach(async () => {
  dev = await memoryDeviceDb();
  noSignal();
  mockSyncNow.mockClear();
});

afterEach(async () => {
  jest.useRealTimers();
  for (const c of clients) c.clear();
  clients = [];
  await dev.close();
});

async function openToday() {
  const queries = sessionClient(inspector, true);
  clients.push(queries);
  renderScreens(
    queries,
    { today: TodayScreen, 'inspect/[id]': () => <Text>Recording screen</Text> },
    '/today',
    (slot) => <DeviceDbProvider open={async () => dev}>{slot}</DeviceDbProvider>,
  );
  jest.useRealTimers();
  await screen.findByText(/^Good (morning|afternoon|evening), Tobin$/);
}

test('before the last sync has been read from the phone, opening Today starts no sync', async () => {
  mockStatus = { loaded: false, lastSuccessAt: null };
  await openToday();
  expect(mockSyncNow).not.toHaveBeenCalled();
});

test('a phone that has synced before: opening Today starts no sync of its own', async () => {
  mockStatus = { loaded: true, lastSuccessAt: '2026-06-03T07:00:00.000Z' };
  await openToday();
  expect(mockSyncNow).not.toHaveBeenCalled();
});

test('a phone that has never synced: opening Today fetches the round once', async () => {
  mockStatus = { loaded: true, lastSuccessAt: null };
  await openToday();
  expect(mockSyncNow).toHaveBeenCalledTimes(1);
});
