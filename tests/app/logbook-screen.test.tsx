/**
 * The ride logbook screen (/rides/:id/logbook) against a stand-in server answering in the API's shape
 * (features/logbook/schema.ts). Checked: entries as listed with their time on the site's clock, kind,
 * who, link and documents; the filter chips and paging asking the server; an operator's chips; a ride
 * that is not the caller's. Outside reference for the clock: the IANA time zone database's Europe/London
 * rule (British Summer Time, UTC+1, from the last Sunday of March; from memory). The ride and people are
 * the invented demo scenario.
 */
import { fireEvent, screen, waitFor, within } from 'expo-router/testing-library';

import { LogbookScreen } from '@/features/logbook/logbook-screen';
import type { LogbookEvent, LogbookPage } from '@/features/logbook/schema';
import type { SessionUser } from '@/features/session/schema';
import { renderScreens, sessionClient } from '@/tests/support/app-screens';
import { standInApi, type StandInCall } from '@/tests/support/stand-in-api';

jest.mock('@/features/session/token-store', () => ({
  tokenStore: {
    get: async () => ({ token: 'token-of-tester', expiresAt: '2099-01-01T00:00:00.000Z', user: null }),
    set: async () => {},
    clear: async () => {},
  },
}));
jest.mock('@/components/use-wide', () => ({ useWide: () => true }));

const person = (role: SessionUser['role'], name: string): SessionUser => ({
  id: `${role}-1`,
  email: `${role}@pivotwatch.test`,
  name,
  role,
  companyId: role === 'operator' ? 'company-1' : null,
  companyName: role === 'operator' ? 'Tamsworth Pier Leisure' : null,
});
const supervisor = person('supervisor', 'Mira Delacourt');
const operator = person('operator', 'Priya Castellan');

const event = (patch: Partial<LogbookEvent>): LogbookEvent => ({
  id: 'notice:n1',
  rideId: 'ride-1',
  at: '2026-05-04T09:05:00.000Z',
  day: '2026-05-04',
  kind: 'notice',
  title: 'Inspection notice PW-2026-0007 issued to Tamsworth Pier Leisure',
  detail: ['Operating status: In service', '1 finding listed'],
  who: 'Mira Delacourt',
  link: { label: 'Open the notice', href: '/notices/n1' },
  documents: [{ label: 'PW-2026-0007 (PDF)', apiPath: '/api/notices/n1/pdf', fileName: 'PW-2026-0007.pdf' }],
  ...patch,
});

const pageOf = (events: LogbookEvent[], page = 1, total = events.length): LogbookPage => ({
  ride: {
    id: 'ride-1',
    name: 'Skylark',
    siteName: 'Tamsworth Pier',
    operatorName: 'Tamsworth Pier Leisure',
    timeZone: 'Europe/London',
  },
  events,
  total,
  page,
  pageSize: 25,
});

afterEach(() => jest.restoreAllMocks());

function render(user: SessionUser, answer: (call: StandInCall) => LogbookPage | null) {
  const api = standInApi({
    '/api/rides/ride-1/logbook': (call) => {
      const body = answer(call);
      return body
        ? { status: 200, body }
        : { status: 404, body: { error: { code: 'not_found', message: 'No such ride.' } } };
    },
  });
  renderScreens(sessionClient(user), { 'rides/[id]/logbook': LogbookScreen }, '/rides/ride-1/logbook');
  return api;
}

test('an entry shows when on the site’s clock, its kind, what, who, where it lives and its files', async () => {
  render(supervisor, () =>
    pageOf([
      event({}),
      event({
        id: 'decision:i1',
        kind: 'decision',
        at: '2026-05-04T09:00:00.000Z',
        title: 'Periodic inspection approved',
        detail: ['Note: Fine apart from the step edge'],
        link: { label: 'Open the inspection', href: '/review/i1' },
        documents: [],
      }),
    ]),
  );
  const list = await screen.findByLabelText('Logbook entries');
  const notice = within(list).getByLabelText(/^Notice: Inspection notice PW-2026-0007/);
  // 09:05 UTC on 4 May is 10:05 in London (BST, UTC+1).
  expect(within(notice).getByText('4 May 2026, 10:05')).toBeTruthy();
  expect(within(notice).getByText('Operating status: In service')).toBeTruthy();
  expect(within(notice).getByText('Mira Delacourt')).toBeTruthy();
  expect(within(notice).getByRole('link', { name: /Open the notice/ })).toBeTruthy();
  expect(within(notice).getByRole('button', { name: /PW-2026-0007 \(PDF\)/ })).toBeTruthy();
  const decision = within(list).getByLabelText(/^Review decision: Periodic inspection approved/);
  expect(within(decision).getByText('4 May 2026, 10:00')).toBeTruthy();
  expect(screen.getByText('Times on the site’s clock (Europe/London).')).toBeTruthy();
  expect(screen.getByText('Skylark · Tamsworth Pier · Tamsworth Pier Leisure')).toBeTruthy();
  expect(screen.getByRole('button', { name: /^Logbook PDF · A4/ })).toBeTruthy();
  expect(screen.getByRole('button', { name: /^CSV file/ })).toBeTruthy();
});

test('a chip asks the server for that kind only; the pager asks for the next page', async () => {
  const api = render(supervisor, (call) => {
    const page = Number(call.search.get('page') ?? '1');
    return pageOf([event({ id: `notice:p${page}`, title: `Entry on page ${page}` })], page, 30);
  });
  await screen.findByText('Entry on page 1');
  fireEvent.press(screen.getByRole('checkbox', { name: 'Show: Notices' }));
  await waitFor(() =>
    expect(api.calls.some((c) => c.search.get('kinds') === 'notice' && !c.search.has('page'))).toBe(true),
  );
  expect(screen.getByText(/^Notices · all dates — 30 entries, all pages$/)).toBeTruthy();
  fireEvent.press(screen.getByRole('button', { name: 'Next' }));
  await screen.findByText('Entry on page 2');
  const last = api.calls[api.calls.length - 1];
  expect(last.search.get('page')).toBe('2');
  expect(last.search.get('kinds')).toBe('notice');
});

test('an operator is offered only the kinds an operator’s logbook holds', async () => {
  render(operator, () => pageOf([event({})]));
  await screen.findByLabelText('Logbook entries');
  for (const chip of ['Findings', 'Corrective actions', 'Notices', 'NDT', 'Status'])
    expect(screen.getByRole('checkbox', { name: `Show: ${chip}` })).toBeTruthy();
  for (const chip of ['Inspections', 'Decisions', 'Design data'])
    expect(screen.queryByRole('checkbox', { name: `Show: ${chip}` })).toBeNull();
});

test('nothing recorded, and a ride that is not the caller’s', async () => {
  render(supervisor, () => pageOf([]));
  expect(await screen.findByText('Nothing has been recorded on this ride yet.')).toBeTruthy();
  jest.restoreAllMocks();
  render(operator, () => null);
  expect(await screen.findByText(/not found/i)).toBeTruthy();
});
