/**
 * The inspector's phone after a sync: supervisors' decisions on their own inspections, read from the
 * device database alone (real SQLite in memory with the real device migrations, filled by the real pull
 * engine from an answer in the API's shape). A returned inspection comes first with the supervisor's
 * comment and findings (severity words from `severityInfo`), and can be corrected and resubmitted as an
 * amendment; an approved one says by whom and when. Ride, people and findings are invented demo data.
 */
import { eq } from 'drizzle-orm';
import { Text } from 'react-native';
import { fireEvent, screen, within } from 'expo-router/testing-library';

import { outbox } from '@/db/device/schema';
import { makeQueryClient } from '@/features/api/query-client';
import type { SessionUser } from '@/features/session/schema';
import { writeRides } from '@/features/sync/cache';
import { loadDraft, submitDraft } from '@/features/device-db/drafts';
import { DeviceDbProvider } from '@/features/device-db/provider';
import { type Draft, toRecord } from '@/features/records/draft';
import type { InspectionRecord } from '@/features/records/schema';
import { buildSentList } from '@/features/inspections/sent';
import { TodayScreen } from '@/features/inspections/today-screen';
import type { RideSummary } from '@/features/rides/schema';
import { severityInfo } from '@/features/notices/finding-schema';
import type { SyncApi } from '@/features/sync/api';
import { pull } from '@/features/sync/pull';

import { makeRecord } from '@/tests/support/inspection-fixtures';
import { type MemoryDeviceDb, memoryDeviceDb } from '@/tests/support/memory-device-db';
import { renderScreens, sessionClient } from '@/tests/support/app-screens';
import { noSignal } from '@/tests/support/stand-in-api';

jest.setTimeout(30_000);

jest.mock('@/features/session/token-store', () => ({
  tokenStore: { get: async () => null, set: async () => {}, clear: async () => {} },
}));

// jest-expo's stand-in for expo-crypto does not make UUIDs; draft ids must be UUIDs, as on a phone.
jest.mock('expo-crypto', () => ({
  ...jest.requireActual('expo-crypto'),
  randomUUID: () => jest.requireActual('node:crypto').randomUUID(),
}));

// The sync engine is tested on its own (tests/device/sync-push.test.ts); here the panel only shows a status.
jest.mock('@/features/sync/use-sync-status', () => ({
  useSyncStatus: () => ({
    waiting: 0,
    photosWaiting: 0,
    currentPhoto: null,
    lastSuccessAt: '2026-06-03T07:00:00.000Z',
    lastError: null,
    online: false,
    running: false,
    needsAttention: [],
    photosRefused: [],
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

const gullWing: RideSummary = {
  id: 'ride-demo-1',
  name: 'Gull Wing',
  rideClass: 'pendulum_swing',
  description: null,
  maker: null,
  model: null,
  serial: null,
  year: null,
  status: 'in_service',
  statusReason: null,
  statusSince: null,
  siteId: 'site-1',
  siteName: 'Tamsworth Pier',
  operatorCompanyId: 'op-1',
  operatorName: 'Tamsworth Pier Leisure',
};

let dev: MemoryDeviceDb;
let clients: ReturnType<typeof makeQueryClient>[] = [];

beforeEach(async () => {
  dev = await memoryDeviceDb();
  await writeRides(dev, [gullWing]);
  // The list must come from the phone alone: any request to the server fails as if there were no signal.
  noSignal();
});

afterEach(async () => {
  jest.useRealTimers();
  // No cache timer may outlive its test.
  for (const c of clients) c.clear();
  clients = [];
  jest.restoreAllMocks();
  await dev.close();
});

/** Submits a record on the phone and marks it accepted by the server, as a push would. */
async function sent(overrides: Partial<InspectionRecord>): Promise<InspectionRecord> {
  const record = await submitDraft(dev, makeRecord(overrides));
  await dev.db.update(outbox).set({ state: 'accepted' }).where(eq(outbox.id, record.id)).run();
  return record;
}

/** A sync's pull, through the real engine and pull schema, answering with these decisions. */
async function pullDecisions(decisions: unknown[]) {
  const api: SyncApi = {
    push: async () => {
      throw new Error('not used');
    },
    putPhoto: async () => {},
    registerKey: async () => {},
    pull: async () => ({ cursor: 'v1:2026-06-03T07:00:00.000Z', decisions }),
  };
  return pull(api, dev);
}

function renderToday() {
  const queries = sessionClient(inspector, true);
  clients.push(queries);
  const view = renderScreens(
    queries,
    {
      today: TodayScreen,
      'inspect/[id]': () => <Text>Recording screen</Text>,
    },
    '/today',
    (slot) => <DeviceDbProvider open={async () => dev}>{slot}</DeviceDbProvider>,
  );
  // renderRouter turns on fake timers; the in-memory database waits on real ones between statements.
  jest.useRealTimers();
  return view;
}

const returnedDecision = (inspectionId: string) => ({
  inspectionId,
  rideId: gullWing.id,
  state: 'returned',
  note: 'Re-measure the main pivot pin clearance with the feeler gauge, both sides.',
  decidedAt: '2026-06-02T14:05:00.000Z',
  decidedByName: 'Mara Quill',
  findings: [
    {
      id: 'f-2',
      number: 2,
      severity: 'fix_by_date',
      description: 'Paint flaking on the gondola frame near the lower pivot.',
      requiredAction: 'Clean back and repaint; record photos.',
      dueOn: '2026-06-12',
      state: 'open',
    },
    {
      id: 'f-1',
      number: 1,
      severity: 'fix_before_operation',
      description: 'Main pivot bushing shows scoring on the lower half.',
      requiredAction: 'Replace the bushing and check the pin diameter against the wear limit.',
      dueOn: null,
      state: 'open',
    },
  ],
});

describe('on the Today screen, offline, after a sync', () => {
  test('a returned inspection comes first with the comment, who returned it and its findings in order', async () => {
    const record = await sent({});
    const report = await pullDecisions([returnedDecision(record.id)]);
    expect(report.decisions).toBe(1);

    const view = renderToday();
    expect(await screen.findByText('RETURNED TO YOU (1)')).toBeTruthy();
    const card = screen.getByLabelText('Gull Wing · Daily pre-opening: Returned for correction');
    expect(
      within(card).getByText('Re-measure the main pivot pin clearance with the feeler gauge, both sides.'),
    ).toBeTruthy();
    expect(within(card).getByText(/^Returned by Mara Quill, 2 Jun 2026/)).toBeTruthy();
    // Findings in number order, severity in the scale's own words.
    const findings = within(card).getByLabelText('Findings');
    const titles = within(findings).getAllByText(/^Finding \d/);
    expect(titles.map((t) => t.props.children)).toEqual([
      `Finding 1 · ${severityInfo.fix_before_operation.label}`,
      `Finding 2 · ${severityInfo.fix_by_date.label}`,
    ]);
    expect(within(findings).getByText('Main pivot bushing shows scoring on the lower half.')).toBeTruthy();
    expect(within(findings).getAllByText('REQUIRED ACTION')).toHaveLength(2);
    expect(
      within(findings).getByText('Replace the bushing and check the pin diameter against the wear limit.'),
    ).toBeTruthy();
    expect(within(findings).getByText('Due 12 Jun 2026 · Open')).toBeTruthy();
    expect(within(card).getByRole('button', { name: 'Correct and resubmit' })).toBeTruthy();
    // Nothing of this came from the network.
    expect(global.fetch).not.toHaveBeenCalled();
    expect(view.getPathname()).toBe('/today');
  });

  test('an approved inspection says by whom and when, with the comment; its findings open on request', async () => {
    const record = await sent({});
    await pullDecisions([
      {
        inspectionId: record.id,
        rideId: gullWing.id,
        state: 'approved',
        note: 'Good photos of the pivots, thank you.',
        decidedAt: '2026-06-02T15:30:00.000Z',
        decidedByName: 'Mara Quill',
        findings: [
          {
            number: 1,
            severity: 'note',
            description: 'Light surface rust on the fence post by the exit gate.',
            requiredAction: null,
            dueOn: null,
            state: 'open',
          },
        ],
      },
    ]);
    renderToday();
    expect(await screen.findByText('SENT (1)')).toBeTruthy();
    expect(screen.queryByText(/RETURNED TO YOU/)).toBeNull();
    const card = screen.getByLabelText('Gull Wing · Daily pre-opening: Approved');
    expect(within(card).getByText(/^Approved by Mara Quill, 2 Jun 2026/)).toBeTruthy();
    expect(within(card).getByText('Good photos of the pivots, thank you.')).toBeTruthy();
    expect(within(card).queryByText('Light surface rust on the fence post by the exit gate.')).toBeNull();
    fireEvent.press(within(card).getByRole('button', { name: 'Show 1 finding' }));
    expect(within(card).getByText(`Finding 1 · ${severityInfo.note.label}`)).toBeTruthy();
    expect(within(card).getByText('Light surface rust on the fence post by the exit gate.')).toBeTruthy();
  });

  test('a sent inspection with no decision yet says it awaits review; one not yet sent says so', async () => {
    await sent({ submittedAt: '2026-06-01T08:05:00.000Z' });
    await submitDraft(dev, makeRecord({ submittedAt: '2026-06-02T08:05:00.000Z' }));
    renderToday();
    // The one still in the outbox is listed under its own heading, never as sent.
    expect(await screen.findByText('SENT (1)')).toBeTruthy();
    expect(screen.getByText('WAITING TO SEND (1)')).toBeTruthy();
    expect(screen.getByText('Sent · awaiting review')).toBeTruthy();
    expect(screen.getByText('Waiting to send')).toBeTruthy();
  });

  test('correct and resubmit: a copy of the original is saved as a correction, then the card stops asking', async () => {
    const record = await sent({ notes: 'Clearance taken on the left side only.' });
    await pullDecisions([returnedDecision(record.id)]);
    const view = renderToday();
    fireEvent.press(await screen.findByRole('button', { name: 'Correct and resubmit' }));
    expect(await screen.findByText('Recording screen')).toBeTruthy();
    const draftId = view.getPathname().replace('/inspect/', '');
    expect(draftId).not.toBe(record.id);

    const draft = (await loadDraft<Draft>(dev, draftId))?.data;
    expect(draft?.amendsId).toBe(record.id);
    expect(draft?.checklist).toEqual(record.checklist);
    expect(draft?.readings).toEqual(record.readings);
    expect(draft?.notes).toBe('Clearance taken on the left side only.');

    // Back on Today before submitting: the returned card offers to resume the correction, not a second copy.
    view.unmount();
    const again = renderToday();
    fireEvent.press(await screen.findByRole('button', { name: 'Resume the correction' }));
    expect(await screen.findByText('Recording screen')).toBeTruthy();
    expect(again.getPathname()).toBe(`/inspect/${draftId}`);
    again.unmount();

    // Submitted, it goes as an amendment of the returned one (the server's rule for corrections).
    const correction = toRecord(draft as Draft, null, new Date('2026-06-03T09:00:00.000Z'));
    expect(correction.amendsId).toBe(record.id);
    await submitDraft(dev, correction);
    renderToday();
    const card = await screen.findByLabelText('Gull Wing · Daily pre-opening: Returned · correction sent');
    expect(screen.queryByText(/RETURNED TO YOU/)).toBeNull();
    expect(within(card).queryByRole('button', { name: 'Correct and resubmit' })).toBeNull();
    // The correction itself is listed as sent, waiting to go.
    expect(screen.getByText('Waiting to send')).toBeTruthy();
  });
});

describe('the sent list', () => {
  const rec = (id: string, submittedAt: string) => ({
    id,
    state: 'accepted' as const,
    record: makeRecord({ id, submittedAt }),
  });
  const ids = {
    a: '00000000-0000-4000-8000-00000000000a',
    b: '00000000-0000-4000-8000-00000000000b',
    c: '00000000-0000-4000-8000-00000000000c',
  };

  test('returned ones needing action first, then newest first; a decision from another device is listed', () => {
    const list = buildSentList({
      outbox: [rec(ids.a, '2026-06-01T08:00:00.000Z'), rec(ids.b, '2026-06-02T08:00:00.000Z')],
      decisions: [
        { inspectionId: ids.a, state: 'returned', note: 'Redo the checklist.', findings: [] },
        {
          inspectionId: ids.c,
          rideId: gullWing.id,
          state: 'approved',
          decidedAt: '2026-06-03T08:00:00.000Z',
        },
      ],
      rides: [gullWing],
      corrections: [],
    });
    expect(list.map((s) => [s.id, s.needsAction, s.send])).toEqual([
      [ids.a, true, 'sent'],
      [ids.c, false, 'unknown'],
      [ids.b, false, 'sent'],
    ]);
    expect(list[1].canCorrect).toBe(false);
    expect(list[1].rideName).toBe('Gull Wing');
  });

  test('a correction still being recorded keeps the returned one waiting; a severity it does not know is shown as sent', () => {
    const list = buildSentList({
      outbox: [rec(ids.a, '2026-06-01T08:00:00.000Z')],
      decisions: [
        {
          inspectionId: ids.a,
          state: 'returned',
          note: 'Redo the checklist.',
          findings: [{ number: 1, severity: 'watch_closely', description: 'Odd noise.' }],
        },
      ],
      rides: [],
      corrections: [{ id: 'draft-1', amendsId: ids.a }],
    });
    expect(list[0].needsAction).toBe(true);
    expect(list[0].correction).toEqual({ id: 'draft-1', state: 'draft' });
    expect(list[0].rideName).toBe('A ride no longer on this phone');
    expect(list[0].decision?.findings[0]).toMatchObject({ severity: null, severityLabel: 'watch_closely' });
  });
});
