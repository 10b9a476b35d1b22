/**
 * Real network state on a phone (features/sync/network.ts), with expo-network's native side stood in for
 * the way jest-expo stands in for every native module: `requireNativeModule('ExpoNetwork')` is jest-expo's
 * mock object, whose `getNetworkStateAsync` and `addListener` are given the phone's answers here; the
 * library's own JavaScript (expo-network's `addNetworkStateListener`, `getNetworkStateAsync`) runs as in
 * the app. The state shape `{ type, isConnected, isInternetReachable }` and its meanings are expo-network's
 * documented `NetworkState` (docs.expo.dev, "Network", SDK 56).
 *
 * Checked: which states count as offline; react-query's onlineManager and focusManager follow the phone
 * (TanStack Query v5 docs: "onlineManager", "focusManager", React Native section); a query refetches when
 * the connection returns; the sync controller sends nothing while offline and sends the waiting record by
 * itself when the connection returns. Records and people are invented.
 */
// First: the phone's network stand-in must be in place before the app's modules load.
import {
  appStateBecomes,
  networkBecomes,
  networkListenerCount,
  noNetwork as none,
  wifi,
} from '@/tests/support/phone-network';
import {
  QueryClient,
  QueryClientProvider,
  focusManager,
  onlineManager,
  useQuery,
} from '@tanstack/react-query';
import { act, renderHook, waitFor } from '@testing-library/react-native';
import type { NetworkState } from 'expo-network';

import { bindDeviceOwner } from '@/features/device-db';
import { saveDraft, submitDraft } from '@/features/device-db/drafts';
import { isOnline, onlineOf } from '@/features/sync/network';
import { useOnline } from '@/features/sync/online-state';
import { getSyncController } from '@/features/sync/sync-controller';
import { offlineLine } from '@/features/inspections/sync-panel';

import { FakeSyncServer } from '@/tests/device/fake-sync-server';
import { makeRecord } from '@/tests/support/inspection-fixtures';
import { type MemoryDeviceDb, memoryDeviceDb } from '@/tests/support/memory-device-db';

jest.setTimeout(30_000);

// jest-expo's expo-crypto answers nothing; the batch ids must be real UUIDs.
jest.mock('expo-crypto', () => ({ randomUUID: () => jest.requireActual('node:crypto').randomUUID() }));

const mockUserId = 'u-ins-network';
jest.mock('@/features/session/token-store', () => ({
  tokenStore: {
    get: async () => ({ token: 't', user: { id: mockUserId } }),
    set: async () => {},
    clear: async () => {},
  },
}));

afterEach(() => networkBecomes(wifi));

describe('what counts as offline (expo-network NetworkState)', () => {
  test.each([
    ['Wi-Fi with the internet reachable', wifi, true],
    ['no network at all (type NONE)', none, false],
    ['connected, internet not reachable (a captive portal)', { ...wifi, isInternetReachable: false }, false],
    [
      'connected, reachability not known yet (undefined while the system checks)',
      { isConnected: true },
      true,
    ],
    ['nothing known yet (an empty state)', {}, true],
  ])('%s', (_what, state, online) => {
    expect(onlineOf(state as NetworkState)).toBe(online);
  });
});

test("react-query's onlineManager follows the phone: offline, then online again", async () => {
  await waitFor(() => expect(networkListenerCount()).toBeGreaterThan(0));
  expect(onlineManager.isOnline()).toBe(true);
  networkBecomes(none);
  expect(isOnline()).toBe(false);
  expect(onlineManager.isOnline()).toBe(false);
  networkBecomes(wifi);
  expect(onlineManager.isOnline()).toBe(true);
});

test('a reading asked for before a change (the app coming back) does not undo the change it missed', async () => {
  networkBecomes(none);
  appStateBecomes('active'); // re-reads the state: the answer (no network) arrives after the next event
  networkBecomes(wifi);
  await act(() => new Promise((r) => setTimeout(r, 0)));
  expect(isOnline()).toBe(true);
});

test("react-query's focusManager follows the app going to the background and coming back", () => {
  appStateBecomes('background');
  expect(focusManager.isFocused()).toBe(false);
  appStateBecomes('active');
  expect(focusManager.isFocused()).toBe(true);
});

test('a query fetches again by itself when the connection returns', async () => {
  const client = new QueryClient({ defaultOptions: { queries: { retry: false, gcTime: Infinity } } });
  let calls = 0;
  const { result, unmount } = renderHook(
    () => useQuery({ queryKey: ['rides'], queryFn: async () => ++calls, networkMode: 'offlineFirst' }),
    { wrapper: ({ children }) => <QueryClientProvider client={client}>{children}</QueryClientProvider> },
  );
  await waitFor(() => expect(result.current.data).toBe(1));
  networkBecomes(none);
  networkBecomes(wifi);
  await waitFor(() => expect(result.current.data).toBe(2));
  unmount();
  client.clear();
});

test('the connection banner follows the network: gone, then back', () => {
  const { result } = renderHook(() => useOnline());
  expect(result.current).toBe(true);
  networkBecomes(none);
  expect(result.current).toBe(false);
  networkBecomes(wifi);
  expect(result.current).toBe(true);
});

describe('the sync controller', () => {
  let dev: MemoryDeviceDb;
  beforeEach(async () => {
    dev = await memoryDeviceDb();
    await bindDeviceOwner(dev, mockUserId);
  });
  afterEach(async () => {
    await dev.close();
  });

  test('sends nothing while offline, and sends what waits by itself when the connection returns', async () => {
    const server = new FakeSyncServer();
    const rec = makeRecord();
    await saveDraft(dev, { id: rec.id, rideId: rec.rideId, data: { step: 'done' } });
    await submitDraft(dev, rec);

    networkBecomes(none);
    const controller = getSyncController(dev, server);
    const stop = controller.subscribe(() => undefined);
    try {
      await waitFor(() => expect(controller.getSnapshot().loaded).toBe(true));
      expect(controller.getSnapshot()).toMatchObject({ online: false, waiting: 1, running: false });
      // Asked to sync (a tap, the half-minute timer, the app coming back): nothing goes out.
      await act(() => controller.syncNow());
      appStateBecomes('active');
      expect(server.batchIdsSeen).toEqual([]);
      expect(controller.getSnapshot()).toMatchObject({ online: false, waiting: 1, lastError: null });

      // The connection returns: the record goes without anyone asking, once.
      networkBecomes(wifi);
      await waitFor(() => expect(controller.getSnapshot()).toMatchObject({ waiting: 0, accepted: 1 }));
      expect(controller.getSnapshot().online).toBe(true);
      expect([...server.records.keys()]).toEqual([rec.id]);
    } finally {
      stop();
    }
  });
});

test('the sync panel says plainly that the phone is offline and what waits on it', () => {
  expect(offlineLine({ waiting: 1, photosWaiting: 0 })).toBe(
    'This phone is offline. 1 inspection waits here and will be sent when the connection returns.',
  );
  expect(offlineLine({ waiting: 2, photosWaiting: 3 })).toBe(
    'This phone is offline. 2 inspections and 3 photos wait here and will be sent when the connection returns.',
  );
  expect(offlineLine({ waiting: 0, photosWaiting: 0 })).toMatch(
    /^This phone is offline\. Nothing is waiting/,
  );
});
