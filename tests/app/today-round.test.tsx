/**
 * Today in the planner's order, from the phone's own database with no signal (issue #19): assigned rides
 * by the day of the round, then the day's travel order, whatever their names; a ride whose set-up waits
 * for its inspection says it may not run there. Rides, sites and people are invented demo data.
 */
import { screen, within } from 'expo-router/testing-library';
import { Text } from 'react-native';

import { makeQueryClient } from '@/features/api/query-client';
import { DeviceDbProvider } from '@/features/device-db/provider';
import { TodayScreen } from '@/features/inspections/today-screen';
import type { RideSummary } from '@/features/rides/schema';
import type { SessionUser } from '@/features/session/schema';
import { writeAssignments, writeRides } from '@/features/sync/cache';
import { makeRideSummary } from '@/tests/support/inspection-fixtures';
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

const assignment = (rideId: string, rideName: string, plan: object) => ({
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
  ...plan,
});

let dev: MemoryDeviceDb;
const clients: ReturnType<typeof makeQueryClient>[] = [];

beforeEach(async () => {
  dev = await memoryDeviceDb();
  noSignal();
});

afterEach(() => {
  for (const c of clients) c.clear();
  dev.sqlite.close();
});

test('offline, Today lists the round by day and stop; a set-up awaiting inspection says the ride may not run', async () => {
  const waiting = {
    ...ride('r-3', 'Aster Swing', 'Brackley Meadow showground', 'Europe/London'),
    status: 'out_of_service' as const,
    statusReason:
      'Set up at Brackley Meadow showground: it may not run there until its set-up inspection is approved.',
  };
  await writeRides(dev, [
    ride('r-1', 'Alder Whirl', 'Lowfield Common fairground', 'Europe/London'),
    ride('r-2', 'Birch Flyer', 'Lowfield Common fairground', 'Europe/London'),
    waiting,
    ride('r-4', 'Cedar Loop', 'Tamsworth Pier', 'Europe/London'),
  ]);
  await writeAssignments(dev, [
    // Friday, second stop.
    assignment('r-1', 'Alder Whirl', { plannedOn: '2026-12-04', roundPosition: 1 }),
    // Not planned: after every planned one.
    assignment('r-2', 'Birch Flyer', {}),
    // Friday, first stop: the set-up inspection.
    assignment('r-3', 'Aster Swing', {
      plannedOn: '2026-12-04',
      roundPosition: 0,
      inspectionType: 'setup_after_assembly',
    }),
    // Thursday: the day before comes first, whatever the stop.
    assignment('r-4', 'Cedar Loop', { plannedOn: '2026-12-03', roundPosition: 5 }),
  ]);
  const queries = sessionClient(inspector, true);
  clients.push(queries);
  renderScreens(
    queries,
    { today: TodayScreen, 'inspect/[id]': () => <Text>Recording screen</Text> },
    '/today',
    (slot) => <DeviceDbProvider open={async () => dev}>{slot}</DeviceDbProvider>,
  );
  await screen.findByLabelText('Ride Aster Swing');
  const cards = screen
    .getAllByLabelText(/^Ride [A-Z]/)
    .map((c) => c.props.accessibilityLabel ?? c.props['aria-label']);
  expect(cards).toEqual(['Ride Cedar Loop', 'Ride Aster Swing', 'Ride Alder Whirl', 'Ride Birch Flyer']);
  const aster = screen.getByLabelText('Ride Aster Swing');
  const words = (el: ReturnType<typeof within>, re: RegExp) =>
    [el.getByText(re).props.children].flat(Infinity).join('');
  expect(words(within(aster), /^Round: /)).toBe('Round: 4 Dec 2026 · stop 1');
  within(aster).getByText(
    'Set up at Brackley Meadow showground: it may not run there until its set-up inspection is approved.',
  );
  expect(words(within(screen.getByLabelText('Ride Alder Whirl')), /^Round: /)).toBe(
    'Round: 4 Dec 2026 · stop 2',
  );
  expect(within(screen.getByLabelText('Ride Birch Flyer')).queryByText(/^Round: /)).toBeNull();
  screen.unmount();
});
