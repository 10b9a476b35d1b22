/**
 * The supervisors' queue (/review): counts per urgency on tiles that filter the list, one row or card per
 * item leading to the review desk (inspections) or the ride (rides whose dates slipped), and every
 * filter, the search, the sort and the pages handed to the server in the request URL. The server's
 * answers are invented demo data in the shape of features/review/schema.ts; what is checked is what the
 * screen asks for and what it shows of the answer.
 */
import { Text } from 'react-native';
import { act, fireEvent, screen, waitFor, within } from 'expo-router/testing-library';

import { makeQueryClient } from '@/features/api/query-client';
import type { SessionUser } from '@/features/session/schema';
import { QueueScreen } from '@/features/review/queue-screen';
import { type QueueItem, type QueueResponse, queueResponseSchema } from '@/features/review/schema';
import { urgencyLook } from '@/features/review/urgency-mark';
import { contrast } from '@/tests/support/contrast';
import { holderOf, renderScreens, sessionClient } from '@/tests/support/app-screens';
import { ok, standInApi } from '@/tests/support/stand-in-api';
import { pickDate } from '@/tests/support/pick-date';

jest.mock('@/features/session/token-store', () => ({
  tokenStore: { get: async () => null, set: async () => {}, clear: async () => {} },
}));

// Rendering a page of 25 rows through the router takes a few seconds on a busy machine.
jest.setTimeout(30_000);

let mockWide = true;
jest.mock('@/components/use-wide', () => ({ useWide: () => mockWide }));

const supervisor: SessionUser = {
  id: 'u-sup',
  email: 'mara.quill@halvard.example',
  name: 'Mara Quill',
  role: 'supervisor',
  companyId: null,
  companyName: null,
};

const base: Omit<QueueItem, 'key' | 'kind' | 'urgency'> = {
  inspectionId: null,
  inspectionType: null,
  rideId: 'ride-1',
  rideName: 'Gull Wing',
  rideClass: 'pendulum_swing',
  rideStatus: 'in_service',
  siteId: 'site-1',
  siteName: 'Tamsworth Pier',
  operatorId: 'op-1',
  operatorName: 'Tamsworth Pier Leisure',
  inspectorId: null,
  inspectorName: null,
  at: '2026-06-02T09:15:00.000Z',
  analysisStatus: null,
  failedItems: 0,
  overdueSince: null,
  findingsPastDue: 0,
};

const overItem: QueueItem = {
  ...base,
  key: 'i:insp-1',
  kind: 'inspection',
  urgency: 'over',
  inspectionId: 'insp-1',
  inspectionType: 'periodic',
  inspectorId: 'u-ins',
  inspectorName: 'Tobin Reyes',
  analysisStatus: 'over',
  failedItems: 2,
};
const overdueRide: QueueItem = {
  ...base,
  key: 'r:ride-2',
  kind: 'ride',
  urgency: 'overdue',
  rideId: 'ride-2',
  rideName: 'Harbour Wheel',
  rideClass: 'wheel',
  at: '2026-05-20',
  overdueSince: '2026-05-20',
  findingsPastDue: 3,
};

const counts = {
  incident_serious: 0,
  over: 1,
  failed: 0,
  near: 4,
  overdue: 1,
  past_due: 2,
  awaiting: 7,
  incident: 0,
};

type Answer = Partial<QueueResponse>;
let queueAnswer: (url: URL) => Answer;
let requests: URL[];
let client: ReturnType<typeof makeQueryClient> | null = null;
/** When set, queue answers wait for it (to see what the screen shows while the next page loads). */
let hold: Promise<void> | null = null;

beforeEach(() => {
  mockWide = true;
  hold = null;
  requests = [];
  queueAnswer = () => ({ items: [overItem, overdueRide], total: 2 });
  standInApi({
    '/api/review/queue': async ({ url }) => {
      requests.push(url);
      const page = Number(url.searchParams.get('page') ?? 1);
      const pageSize = Number(url.searchParams.get('pageSize') ?? 25);
      const body = { items: [], total: 0, counts, page, pageSize, ...queueAnswer(url) };
      await hold;
      return ok(body);
    },
    '/api/sites': () => ok({ sites: [], total: 0, page: 1, pageSize: 200 }),
    '/api/companies': () => ok({ companies: [], total: 0, page: 1, pageSize: 200 }),
    '/api/inspectors': () =>
      ok({ inspectors: [{ id: 'u-ins', name: 'Tobin Reyes', email: 'tobin.reyes@halvard.example' }] }),
  });
});

afterEach(() => {
  // No refresh or cache timer may outlive its test.
  client?.clear();
  client = null;
  jest.restoreAllMocks();
  jest.useRealTimers();
});

const lastRequest = () => requests[requests.length - 1];

function renderQueue(initialUrl = '/review') {
  const queries = sessionClient(supervisor);
  client = queries;
  return renderScreens(
    queries,
    {
      'review/index': QueueScreen,
      'review/[id]': () => <Text>Review desk of one inspection</Text>,
      'rides/[id]': () => <Text>Page of one ride</Text>,
    },
    initialUrl,
  );
}

describe('the queue, desktop', () => {
  test('the response schema accepts the fixture (the test talks the API’s shape)', () => {
    expect(() =>
      queueResponseSchema.parse({ items: [overItem, overdueRide], total: 2, page: 1, pageSize: 25, counts }),
    ).not.toThrow();
  });

  test('asks for the first page, 25 items, most urgent first, and shows the counts on tiles', async () => {
    renderQueue();
    expect(await screen.findByRole('button', { name: '1 Over limit' })).toBeTruthy();
    expect(screen.getByRole('button', { name: '4 Near limit' })).toBeTruthy();
    expect(screen.getByRole('button', { name: '2 Findings past due' })).toBeTruthy();
    expect(screen.getByRole('button', { name: '7 Awaiting sign-off' })).toBeTruthy();
    // "Everything" is the sum of the six counts (1 + 0 + 4 + 1 + 2 + 7) and is the tile shown by default.
    expect(screen.getByRole('button', { name: '15 Everything, shown' })).toBeTruthy();
    const first = requests[0];
    expect(first.searchParams.get('pageSize')).toBe('25');
    expect(first.searchParams.get('page')).toBe('1');
    expect(first.searchParams.get('sort')).toBe('urgency');
    expect(first.searchParams.get('urgency')).toBeNull();
  });

  test('one row per item with what it is about; an inspection opens its review', async () => {
    const view = renderQueue();
    const link = await screen.findByRole('link', {
      name: 'Over limit: Gull Wing, Periodic inspection by Tobin Reyes',
    });
    // The link is the ride's name; its row (a table row of cells) holds the rest.
    const row = holderOf(link);
    expect(within(link).getByText('Gull Wing')).toBeTruthy();
    expect(within(row).getByText('Tamsworth Pier Leisure')).toBeTruthy();
    // Failed items: the test window is narrower than 1280 px, where the count joins the words under "What".
    expect(within(row).getByText('Periodic inspection by Tobin Reyes · 2 failed')).toBeTruthy();
    expect(screen.getAllByRole('link')).toHaveLength(2);
    fireEvent.press(link);
    expect(await screen.findByText('Review desk of one inspection')).toBeTruthy();
    expect(view.getPathname()).toBe('/review/insp-1');
  });

  test('a ride in the queue for its dates says what is late and opens the ride', async () => {
    const view = renderQueue();
    const row = await screen.findByRole('link', {
      name: /^Overdue: Harbour Wheel, Inspection overdue since 20 May 2026 · 3 findings past due$/,
    });
    fireEvent.press(row);
    expect(await screen.findByText('Page of one ride')).toBeTruthy();
    expect(view.getPathname()).toBe('/rides/ride-2');
  });

  test('pressing an urgency tile asks the server for that urgency only; pressing it again clears it', async () => {
    const view = renderQueue('/review?page=2');
    fireEvent.press(await screen.findByRole('button', { name: '1 Over limit' }));
    await waitFor(() => expect(lastRequest().searchParams.get('urgency')).toBe('over'));
    // A new filter starts again at page 1.
    expect(lastRequest().searchParams.get('page')).toBe('1');
    expect(view.getSearchParams()).toEqual({ urgency: 'over' });
    expect(await screen.findByRole('button', { name: '1 Over limit, shown' })).toBeTruthy();

    fireEvent.press(screen.getByRole('button', { name: '1 Over limit, shown' }));
    await waitFor(() => expect(lastRequest().searchParams.get('urgency')).toBeNull());
    expect(screen.getByRole('button', { name: '15 Everything, shown' })).toBeTruthy();
  });

  test('ride class, ride status and inspector filters reach the request as the API reads them', async () => {
    const view = renderQueue();
    fireEvent.press(await screen.findByRole('checkbox', { name: 'Ride class: Wheel' }));
    fireEvent.press(screen.getByRole('checkbox', { name: 'Ride class: Rotating arm' }));
    await waitFor(() => expect(lastRequest().searchParams.get('rideClass')).toBe('wheel,rotating_arm'));
    fireEvent.press(screen.getByRole('checkbox', { name: 'Ride status: Restricted' }));
    await waitFor(() => expect(lastRequest().searchParams.get('rideStatus')).toBe('restricted'));
    fireEvent.press(screen.getByRole('combobox', { name: 'Inspector: All inspectors' }));
    fireEvent.press(await screen.findByRole('option', { name: /Tobin Reyes/ }));
    await waitFor(() => expect(lastRequest().searchParams.get('inspectorId')).toBe('u-ins'));
    // All kept in the URL, so a reload or a shared link shows the same list.
    expect(view.getSearchParams()).toEqual({
      rideClass: 'wheel,rotating_arm',
      rideStatus: 'restricted',
      inspectorId: 'u-ins',
    });
  });

  test('dates come from the picker; a "To" before "From" says why and is not sent', async () => {
    const view = renderQueue();
    await screen.findByRole('button', { name: 'From: no date' });
    pickDate('From', '2026-05-01');
    await waitFor(() => expect(lastRequest().searchParams.get('from')).toBe('2026-05-01'));

    // "To" before "From": said under the field, and neither the URL nor the request takes it.
    pickDate('To', '2026-04-01');
    expect(await screen.findByText('Must be on or after 1 May 2026')).toBeTruthy();
    expect(view.getSearchParams()).toEqual({ from: '2026-05-01' });
    expect(requests.some((r) => r.searchParams.get('to') === '2026-04-01')).toBe(false);
    pickDate('To', '2026-05-31');
    await waitFor(() => expect(lastRequest().searchParams.get('to')).toBe('2026-05-31'));
    expect(screen.queryByText('Must be on or after 1 May 2026')).toBeNull();
  });

  test('the search waits for typing to pause, then asks once, from page 1', async () => {
    renderQueue('/review?page=3');
    await screen.findByRole('button', { name: '1 Over limit' });
    jest.useFakeTimers();
    fireEvent.changeText(screen.getByLabelText('Search the queue'), 'gull');
    expect(requests.some((r) => r.searchParams.get('q'))).toBe(false);
    await act(async () => {
      jest.advanceTimersByTime(400);
    });
    jest.useRealTimers();
    await waitFor(() => expect(lastRequest().searchParams.get('q')).toBe('gull'));
    expect(lastRequest().searchParams.get('page')).toBe('1');
  });

  test('sort choices go to the server', async () => {
    renderQueue();
    fireEvent.press(await screen.findByRole('combobox', { name: 'Sort: Most urgent first' }));
    fireEvent.press(screen.getByRole('option', { name: 'Oldest first' }));
    await waitFor(() => expect(lastRequest().searchParams.get('sort')).toBe('oldest'));
  });

  test('pages: "n–m of total", next asks for page 2, and previous is off on page 1', async () => {
    const many = Array.from({ length: 60 }, (_, n) => ({
      ...overItem,
      key: `i:insp-${n}`,
      inspectionId: `insp-${n}`,
      rideName: `Ride ${n}`,
    }));
    queueAnswer = (url) => {
      const page = Number(url.searchParams.get('page'));
      return { items: many.slice((page - 1) * 25, page * 25), total: 60 };
    };
    const view = renderQueue();
    expect(await screen.findByText('1–25 of 60 items')).toBeTruthy();
    expect(screen.getAllByRole('link')).toHaveLength(25);
    expect(screen.getByRole('button', { name: 'Previous' })).toBeDisabled();
    let release = () => {};
    hold = new Promise((resolve) => (release = resolve));
    fireEvent.press(screen.getByRole('button', { name: 'Next' }));
    // While page 2 loads, page 1 stays in view (no blank list, no spinner in its place).
    await waitFor(() => expect(lastRequest().searchParams.get('page')).toBe('2'));
    expect(screen.getByText('1–25 of 60 items')).toBeTruthy();
    expect(screen.getByRole('link', { name: /^Over limit: Ride 0,/ })).toBeTruthy();
    hold = null;
    release();
    expect(await screen.findByText('26–50 of 60 items')).toBeTruthy();
    expect(screen.getByRole('link', { name: /^Over limit: Ride 25,/ })).toBeTruthy();
    expect(lastRequest().searchParams.get('page')).toBe('2');
    expect(view.getSearchParams()).toEqual({ page: '2' });
    fireEvent.press(screen.getByRole('button', { name: 'Next' }));
    expect(await screen.findByText('51–60 of 60 items')).toBeTruthy();
    expect(screen.getByRole('button', { name: 'Next' })).toBeDisabled();
  });

  test('an empty queue says it is clear', async () => {
    queueAnswer = () => ({
      items: [],
      total: 0,
      counts: {
        incident_serious: 0,
        over: 0,
        failed: 0,
        near: 0,
        incident: 0,
        overdue: 0,
        past_due: 0,
        awaiting: 0,
      },
    });
    renderQueue();
    expect(await screen.findByText('The queue is clear.')).toBeTruthy();
  });

  test('an empty answer to a filtered list offers the whole queue back', async () => {
    queueAnswer = (url) => (url.searchParams.get('urgency') ? { items: [], total: 0 } : {});
    renderQueue('/review?urgency=failed&rideClass=wheel');
    expect(await screen.findByText('Nothing in the queue matches.')).toBeTruthy();
    fireEvent.press(screen.getByRole('button', { name: 'Show the whole queue' }));
    await waitFor(() => expect(lastRequest().searchParams.get('urgency')).toBeNull());
    expect(lastRequest().searchParams.get('rideClass')).toBeNull();
  });
});

describe('who sees it', () => {
  test('an inspector is told the page is not part of their role, and the queue is not asked for', async () => {
    const queries = sessionClient({ ...supervisor, id: 'u-ins', role: 'inspector' });
    client = queries;
    renderScreens(queries, { 'review/index': QueueScreen }, '/review');
    expect(await screen.findByText('Not part of your role')).toBeTruthy();
    expect(requests).toHaveLength(0);
  });
});

describe('the queue, phone', () => {
  test('the same items as cards, each a link with its urgency in words', async () => {
    mockWide = false;
    renderQueue();
    const card = holderOf(
      await screen.findByRole('link', { name: 'Over limit: Gull Wing, Periodic inspection by Tobin Reyes' }),
    );
    expect(within(card).getByText('Review inspection')).toBeTruthy();
    expect(within(card).getByText('2 failed')).toBeTruthy();
    expect(screen.getByRole('link', { name: /^Overdue: Harbour Wheel/ })).toBeTruthy();
    // The filters sit behind one button on a phone; the tiles stay in view.
    expect(screen.getByRole('button', { name: 'Filters' })).toBeTruthy();
    expect(screen.getByRole('button', { name: '1 Over limit' })).toBeTruthy();
  });
});

describe('urgency marks', () => {
  test('the WCAG formula gives black on white 21:1', () => {
    expect(contrast('#000000', '#FFFFFF')).toBeCloseTo(21, 5);
  });

  test.each(Object.entries(urgencyLook))('%s: its label colour on its tint meets 4.5:1', (_u, look) => {
    expect(contrast(look.fg, look.bg)).toBeGreaterThanOrEqual(4.5);
  });

  test('no two urgencies share a shape, so colour is never the only signal', () => {
    const shapes = Object.values(urgencyLook).map((l) => l.shape);
    expect(new Set(shapes).size).toBe(shapes.length);
  });
});
