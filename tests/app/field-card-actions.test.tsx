/**
 * Every card on the inspector's way has an action: a ride's page offers Start inspection (or Resume when
 * one is in progress on the phone), and a returned inspection sent from another device, which cannot be
 * copied here, offers a new inspection of its ride. Read from the real device database (in memory) filled
 * through the real pull engine. Ride and people are invented demo data.
 */
import { Text } from 'react-native';
import { fireEvent, screen } from 'expo-router/testing-library';

import { makeQueryClient } from '@/features/api/query-client';
import { listDrafts, saveDraft } from '@/features/device-db/drafts';
import { DeviceDbProvider } from '@/features/device-db/provider';
import { InspectRideCard } from '@/features/inspections/inspect-ride-card';
import type { SentInspection } from '@/features/inspections/sent';
import { SentInspections } from '@/features/inspections/sent-inspections';
import { newDraft } from '@/features/records/draft';
import type { RideSummary } from '@/features/rides/schema';
import { makeRideSummary } from '@/tests/support/inspection-fixtures';
import type { SessionUser } from '@/features/session/schema';
import type { SyncApi } from '@/features/sync/api';
import { pull } from '@/features/sync/pull';
import { renderScreens, sessionClient } from '@/tests/support/app-screens';
import { type MemoryDeviceDb, memoryDeviceDb } from '@/tests/support/memory-device-db';
import { noSignal } from '@/tests/support/stand-in-api';

jest.setTimeout(30_000);

jest.mock('@/features/session/token-store', () => ({
  tokenStore: { get: async () => null, set: async () => {}, clear: async () => {} },
}));
jest.mock('expo-crypto', () => ({
  ...jest.requireActual('expo-crypto'),
  randomUUID: () => jest.requireActual('node:crypto').randomUUID(),
}));

const inspector: SessionUser = {
  id: 'u-ins',
  email: 'mira.lund@halvard.example',
  name: 'Mira Lund',
  role: 'inspector',
  companyId: null,
  companyName: null,
};
const ride: RideSummary = makeRideSummary({
  id: 'ride-kestrel',
  name: 'Kestrel Loop',
  rideClass: 'pendulum_swing',
});

let dev: MemoryDeviceDb;
let clients: ReturnType<typeof makeQueryClient>[] = [];

beforeEach(async () => {
  dev = await memoryDeviceDb();
  const api: SyncApi = {
    push: async () => {
      throw new Error('not used');
    },
    putPhoto: async () => {},
    registerKey: async () => {},
    pull: async () => ({ cursor: 'v1:2026-06-03T07:00:00.000Z', rides: [ride] }),
  };
  await pull(api, dev);
  noSignal();
});

afterEach(async () => {
  jest.useRealTimers();
  for (const c of clients) c.clear();
  clients = [];
  await dev.close();
});

function renderAt(screenUnderTest: () => React.ReactElement) {
  const queries = sessionClient(inspector, true);
  clients.push(queries);
  const view = renderScreens(
    queries,
    {
      here: screenUnderTest,
      'inspect/[id]': function Route() {
        const { useLocalSearchParams } = jest.requireActual('expo-router');
        const { id } = useLocalSearchParams();
        return <Text>Recording {String(id)}</Text>;
      },
    },
    '/here',
    (slot) => <DeviceDbProvider open={async () => dev}>{slot}</DeviceDbProvider>,
  );
  // The router's test renderer turns fake timers on; the device database needs real ones.
  jest.useRealTimers();
  return view;
}

describe("the ride's page", () => {
  test('starts an inspection of the ride, saved on the phone, and opens it', async () => {
    renderAt(() => <InspectRideCard rideId={ride.id} />);
    fireEvent.press(await screen.findByRole('button', { name: 'Start inspection' }));
    // Nothing assigned: the inspector chooses the type.
    fireEvent.press(await screen.findByRole('radio', { name: 'Periodic' }));
    const opened = await screen.findByText(/^Recording /);
    const drafts = await listDrafts(dev, ride.id);
    expect(drafts).toHaveLength(1);
    expect(opened.props.children.join('')).toBe(`Recording ${drafts[0].id}`);
  });

  test('resumes the inspection already in progress instead', async () => {
    const draft = newDraft({
      id: jest.requireActual('node:crypto').randomUUID(),
      ride,
      designVersionId: null,
      template: null,
      type: 'periodic',
      now: new Date(),
    });
    await saveDraft(dev, { id: draft.id, rideId: ride.id, data: draft });
    renderAt(() => <InspectRideCard rideId={ride.id} />);
    expect(screen.queryByRole('button', { name: 'Start inspection' })).toBeNull();
    fireEvent.press(await screen.findByRole('button', { name: 'Resume inspection' }));
    expect((await screen.findByText(/^Recording /)).props.children.join('')).toBe(`Recording ${draft.id}`);
    expect(await listDrafts(dev, ride.id)).toHaveLength(1);
  });
});

describe('a returned inspection sent from another device', () => {
  const returned: SentInspection = {
    id: 'insp-elsewhere',
    rideId: ride.id,
    rideName: ride.name,
    type: 'periodic',
    submittedAt: null,
    send: 'unknown',
    amends: null,
    decision: {
      state: 'returned',
      stateText: 'returned',
      note: 'Measure the swing amplitude again, both sides.',
      decidedAt: '2026-06-03T09:00:00.000Z',
      decidedByName: 'Ines Varga',
      findings: [],
    },
    correction: null,
    needsAction: true,
    canCorrect: false,
  };

  test('offers a new inspection of its ride, which opens', async () => {
    renderAt(() => <SentInspections list={[returned]} />);
    fireEvent.press(await screen.findByRole('button', { name: 'Start a new inspection of this ride' }));
    await screen.findByText(/^Recording /);
    const drafts = await listDrafts(dev, ride.id);
    expect(drafts).toHaveLength(1);
  });
});
