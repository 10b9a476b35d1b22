/**
 * The inspector's Today shows an assigned ride's due date in the one date format ("3 Dec 2026") and
 * judges "overdue" on the ride's site clock, from the phone's own copy (offline). The offsets are from the
 * IANA tz database: America/Los_Angeles keeps PST (UTC−8) and Europe/London GMT (UTC+0) in December, so at
 * 05:00 UTC on 4 Dec 2026 it is still 3 Dec in Los Angeles. Rides, sites and people are invented demo data.
 */
import { screen, within } from 'expo-router/testing-library';
import { Text } from 'react-native';

import { makeQueryClient } from '@/features/api/query-client';
import { DeviceDbProvider } from '@/features/device-db/provider';
import { TodayScreen } from '@/features/inspections/today-screen';
import type { RideSummary } from '@/features/rides/schema';
import { makeRideSummary } from '@/tests/support/inspection-fixtures';
import type { SessionUser } from '@/features/session/schema';
import { writeAssignments, writeRides } from '@/features/sync/cache';
import { formatDate, formatDateTime, formatLocalStamp, formatShortStamp } from '@/lib/dates';

import { renderScreens, sessionClient } from '@/tests/support/app-screens';
import { type MemoryDeviceDb, memoryDeviceDb } from '@/tests/support/memory-device-db';
import { noSignal } from '@/tests/support/stand-in-api';

jest.setTimeout(30_000);

jest.mock('@/features/session/token-store', () => ({
  tokenStore: { get: async () => null, set: async () => {}, clear: async () => {} },
}));

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
    loaded: true,
    lastSuccessAt: '2026-12-03T20:00:00.000Z',
    syncNow: async () => {},
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

const ride = (id: string, name: string, siteName: string, siteTimeZone: string): RideSummary =>
  makeRideSummary({
    id,
    name,
    siteId: `site-${id}`,
    siteName,
    siteTimeZone,
    operatorName: 'Corvane Travelling Shows',
  });

const assignment = (rideId: string, rideName: string) => ({
  id: `a-${rideId}`,
  rideId,
  rideName,
  rideClass: 'rotating_arm',
  rideStatus: 'in_service',
  siteName: null,
  operatorName: 'Corvane Travelling Shows',
  inspectionType: 'periodic',
  intervalDays: null,
  lastDoneOn: null,
  dueOn: '2026-12-03',
  nextDueOn: '2026-12-03',
  // As pulled the evening before (UTC); the phone works the status out again on the site's clock.
  dueStatus: 'due',
  daysUntilDue: 0,
  assignedTo: { id: 'u-ins', name: 'Tobin Reyes' },
  assignedAt: '2026-11-20T09:00:00.000Z',
  notes: null,
  createdAt: '2026-11-20T09:00:00.000Z',
});

let dev: MemoryDeviceDb;
const clients: ReturnType<typeof makeQueryClient>[] = [];

beforeEach(async () => {
  dev = await memoryDeviceDb();
  noSignal();
});

afterEach(() => {
  jest.useRealTimers();
  for (const c of clients) c.clear();
  // The raw connection: the device database's own close waits for reads the unmounted screen left queued.
  dev.sqlite.close();
});

test('due dates read "3 Dec 2026"; overdue in London, not yet in Los Angeles, at 05:00 UTC on 4 Dec', async () => {
  await writeRides(dev, [
    ride('r-la', 'Gullwing Flyer', 'Lowfield Common fairground', 'America/Los_Angeles'),
    ride('r-ldn', 'Skylark Swing', 'Tamsworth Pier', 'Europe/London'),
  ]);
  await writeAssignments(dev, [assignment('r-la', 'Gullwing Flyer'), assignment('r-ldn', 'Skylark Swing')]);
  // Only the clock is pinned: the phone's database answers through real setImmediate turns.
  jest.useFakeTimers({
    now: new Date('2026-12-04T05:00:00Z'),
    doNotFake: [
      'setImmediate',
      'clearImmediate',
      'setTimeout',
      'clearTimeout',
      'setInterval',
      'clearInterval',
      'queueMicrotask',
      'nextTick',
      'requestAnimationFrame',
      'cancelAnimationFrame',
      'requestIdleCallback',
      'cancelIdleCallback',
      'hrtime',
      'performance',
    ],
  });
  const queries = sessionClient(inspector, true);
  clients.push(queries);
  renderScreens(
    queries,
    { today: TodayScreen, 'inspect/[id]': () => <Text>Recording screen</Text> },
    '/today',
    (slot) => <DeviceDbProvider open={async () => dev}>{slot}</DeviceDbProvider>,
  );
  const la = await screen.findByLabelText('Ride Gullwing Flyer');
  const ldn = await screen.findByLabelText('Ride Skylark Swing');
  const line = (card: typeof la) =>
    [within(card).getByText(/^Assigned: /).props.children].flat(Infinity).join('');
  expect(line(la)).toBe('Assigned: Periodic · due 3 Dec 2026');
  expect(line(ldn)).toBe('Assigned: Periodic · due 3 Dec 2026 · overdue');
  jest.useRealTimers();
  screen.unmount();
});

test('one date format and one date-time format, whatever the platform locale', () => {
  // Calendar dates are never shifted; instants read on the given clock (IANA offsets as above).
  expect(formatDate('2026-12-08')).toBe('8 Dec 2026');
  expect(formatDateTime('2026-12-03T03:56:55Z', 'Europe/London')).toBe('3 Dec 2026, 03:56');
  // The phone's own list stamps use the same format (the device's clock; shape checked).
  expect(formatLocalStamp('2026-12-03T03:56:55Z')).toMatch(/^\d{1,2} [A-Z][a-z]{2} 2026, \d{2}:\d{2}$/);
  expect(formatShortStamp('2026-12-03T03:56:55Z')).toBe(formatLocalStamp('2026-12-03T03:56:55Z'));
});
