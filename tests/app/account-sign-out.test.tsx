/**
 * Signing out on a shared phone, on the Account screen over the real device database (SQLite in memory,
 * real migrations): with unsent work the inspector is told what and how much, offered "Send now" when
 * online, and can sign out keeping it sealed on the phone; the server is told (POST /api/auth/sign-out),
 * the token goes, the shared caches go, the unsent work stays. With nothing unsent there is no warning.
 * A desk role just signs out. People and rides are invented demo data.
 */
import type { QueryClient } from '@tanstack/react-query';
import { Text } from 'react-native';
import { act, fireEvent, screen, waitFor } from 'expo-router/testing-library';

import { bindDeviceOwner, getDeviceOwner } from '@/features/device-db/device-owner';
import { saveDraft, submitDraft } from '@/features/device-db/drafts';
import { DeviceDbProvider } from '@/features/device-db/provider';
import type { SessionUser } from '@/features/session/schema';
import { AccountScreen } from '@/features/shell/account-screen';

import { makeRecord } from '@/tests/support/inspection-fixtures';
import { type MemoryDeviceDb, memoryDeviceDb } from '@/tests/support/memory-device-db';
import { renderScreens, sessionClient } from '@/tests/support/app-screens';
import { standInApi } from '@/tests/support/stand-in-api';

jest.setTimeout(30_000);

const mockTokenClear = jest.fn(async () => {});
jest.mock('@/features/session/token-store', () => ({
  tokenStore: {
    get: async () => ({
      token: 'tok',
      expiresAt: '2099-01-01T00:00:00.000Z',
      user: { id: 'u-ins', email: 'x', name: 'x', role: 'inspector', companyId: null, companyName: null },
    }),
    set: async () => {},
    clear: () => mockTokenClear(),
  },
}));

const mockSyncNow = jest.fn(async () => {});
let mockOnline = true;
jest.mock('@/features/sync/use-sync-status', () => ({
  useSyncStatus: () => ({
    running: false,
    online: mockOnline,
    syncNow: mockSyncNow,
    refresh: async () => {},
  }),
}));
jest.mock('@/features/sync/online-state', () => ({ useOnline: () => mockOnline }));

const inspector: SessionUser = {
  id: 'u-ins',
  email: 'tobin.reyes@halvard.example',
  name: 'Tobin Reyes',
  role: 'inspector',
  companyId: null,
  companyName: null,
};

let dev: MemoryDeviceDb;
beforeEach(async () => {
  dev = await memoryDeviceDb();
  await bindDeviceOwner(dev, inspector.id);
  mockTokenClear.mockClear();
  mockSyncNow.mockClear();
  mockOnline = true;
});
afterEach(async () => {
  jest.useRealTimers();
  // No cache timer may outlive its test.
  for (const c of clients) c.clear();
  clients = [];
  jest.restoreAllMocks();
  await dev.close();
});

let clients: QueryClient[] = [];

function renderAccount(user = inspector) {
  const client = sessionClient(user);
  clients.push(client);
  const view = renderScreens(
    client,
    { account: () => <AccountScreen />, 'sign-in': () => <Text>Sign-in page</Text> },
    '/account',
    (slot) =>
      user.role === 'inspector' ? <DeviceDbProvider open={async () => dev}>{slot}</DeviceDbProvider> : slot,
  );
  // renderRouter turns on fake timers; the in-memory database waits on real ones between statements.
  jest.useRealTimers();
  return view;
}

async function withUnsentWork() {
  const queued = makeRecord();
  await saveDraft(dev, { id: queued.id, rideId: queued.rideId, data: {} });
  await submitDraft(dev, queued);
  const draftId = makeRecord().id;
  await saveDraft(dev, { id: draftId, rideId: 'ride-demo-1', data: {} });
  dev.sqlite.prepare(`INSERT INTO cached_rides (id, json, updated_at) VALUES ('r1', '{}', '')`).run();
  return { queued, draftId };
}

test('unsent work: the warning says what and how much; keeping it signs out and wipes only the caches', async () => {
  const api = standInApi({ '/api/auth/sign-out': () => ({ status: 204 }) });
  const { queued, draftId } = await withUnsentWork();
  renderAccount();
  // The screen also carries the password change and (an inspector's) phone storage.
  await screen.findByText(/Changing it signs you out on every/);
  await screen.findByLabelText('Storage on this phone');
  fireEvent.press(await screen.findByRole('button', { name: 'Sign out' }));
  await screen.findByText('Not yet on the server', {}, { timeout: 10_000 });
  screen.getByText('• 1 inspection being recorded (not yet submitted)');
  screen.getByText('• 1 submitted inspection not yet sent');
  screen.getByRole('button', { name: 'Send now' });
  expect(api.callsTo('POST', '/api/auth/sign-out')).toHaveLength(0);
  expect(mockTokenClear).not.toHaveBeenCalled();

  fireEvent.press(screen.getByRole('button', { name: 'Sign out and keep it for me here' }));
  await screen.findByText('Sign-in page', {}, { timeout: 10_000 });
  expect(api.callsTo('POST', '/api/auth/sign-out')).toHaveLength(1);
  expect(mockTokenClear).toHaveBeenCalledTimes(1);
  expect(await getDeviceOwner(dev)).toBeNull();
  expect(dev.sqlite.prepare('SELECT count(*) AS n FROM cached_rides').get()).toEqual({ n: 0 });
  expect(dev.sqlite.prepare('SELECT id FROM outbox').all()).toEqual([{ id: queued.id }]);
  expect(dev.sqlite.prepare('SELECT id FROM drafts').all()).toEqual([{ id: draftId }]);
});

test('"Send now" syncs first and counts again; "Stay signed in" keeps everything', async () => {
  standInApi({});
  await withUnsentWork();
  renderAccount();
  fireEvent.press(await screen.findByRole('button', { name: 'Sign out' }));
  const sendNow = await screen.findByRole('button', { name: 'Send now' }, { timeout: 10_000 });
  await act(async () => {
    fireEvent.press(sendNow);
  });
  expect(mockSyncNow).toHaveBeenCalledTimes(1);
  // Nothing went (the sync is a stand-in): the warning stays, and says so.
  await screen.findByText(/Not everything went through/);
  fireEvent.press(screen.getByRole('button', { name: 'Stay signed in' }));
  await screen.findByRole('button', { name: 'Sign out' });
  expect(mockTokenClear).not.toHaveBeenCalled();
  expect(await getDeviceOwner(dev)).toBe(inspector.id);
});

test('offline: no "Send now", the sign-out still goes through on the phone', async () => {
  mockOnline = false;
  jest.spyOn(global, 'fetch').mockRejectedValue(new TypeError('Network request failed'));
  await withUnsentWork();
  renderAccount();
  fireEvent.press(await screen.findByRole('button', { name: 'Sign out' }));
  await screen.findByText(/No connection/, {}, { timeout: 10_000 });
  expect(screen.queryByRole('button', { name: 'Send now' })).toBeNull();
  fireEvent.press(screen.getByRole('button', { name: 'Sign out and keep it for me here' }));
  await screen.findByText('Sign-in page', {}, { timeout: 10_000 });
  expect(mockTokenClear).toHaveBeenCalledTimes(1);
  expect(await getDeviceOwner(dev)).toBeNull();
});

test('nothing unsent: no warning, straight to sign-in', async () => {
  const api = standInApi({ '/api/auth/sign-out': () => ({ status: 204 }) });
  dev.sqlite.prepare(`INSERT INTO cached_rides (id, json, updated_at) VALUES ('r1', '{}', '')`).run();
  renderAccount();
  fireEvent.press(await screen.findByRole('button', { name: 'Sign out' }));
  await screen.findByText('Sign-in page', {}, { timeout: 10_000 });
  expect(screen.queryByText('Not yet on the server')).toBeNull();
  expect(api.callsTo('POST', '/api/auth/sign-out')).toHaveLength(1);
  await waitFor(() =>
    expect(dev.sqlite.prepare('SELECT count(*) AS n FROM cached_rides').get()).toEqual({ n: 0 }),
  );
});

test('a desk role signs out without a device database', async () => {
  const api = standInApi({ '/api/auth/sign-out': () => ({ status: 204 }) });
  renderAccount({ ...inspector, id: 'u-sup', role: 'supervisor' });
  await screen.findByText(/Changing it signs you out on every/);
  expect(screen.queryByLabelText('Storage on this phone')).toBeNull();
  fireEvent.press(await screen.findByRole('button', { name: 'Sign out' }));
  await screen.findByText('Sign-in page', {}, { timeout: 10_000 });
  expect(api.callsTo('POST', '/api/auth/sign-out')).toHaveLength(1);
  expect(mockTokenClear).toHaveBeenCalledTimes(1);
});
