/**
 * The operator's incident report form (/rides/:id/incidents/new) against a stand-in server answering in
 * the API's shapes (features/incidents/schema.ts; errors as lib/api-errors.ts): what is refused before
 * anything is sent, what is sent when the answers are complete (checked by the shared schema the server
 * validates with), and that a refusal or a lost connection keeps everything typed.
 *
 * The prefilled time is checked against Intl's own formatter for the site's IANA zone, not the app's date
 * helpers. The ride, company and person are the invented demo scenario.
 */
import { fireEvent, screen, waitFor } from 'expo-router/testing-library';

import { makeQueryClient } from '@/features/api/query-client';
import { IncidentReportScreen } from '@/features/incidents/report-screen';
import { incidentInputSchema, type RideIncidentsResponse } from '@/features/incidents/schema';
import type { SessionUser } from '@/features/session/schema';
import { renderScreens, sessionClient } from '@/tests/support/app-screens';
import { noSignal, standInApi, type StandInApi } from '@/tests/support/stand-in-api';

jest.mock('@/features/session/token-store', () => ({
  tokenStore: {
    get: async () => ({ token: 'token-of-tester', expiresAt: '2099-01-01T00:00:00.000Z', user: null }),
    set: async () => {},
    clear: async () => {},
  },
}));

const operator: SessionUser = {
  id: 'user-op',
  email: 'operator@pivotwatch.test',
  name: 'Priya Castellan',
  role: 'operator',
  companyId: 'company-tamsworth',
  companyName: 'Tamsworth Pier Leisure',
};

const ride: RideIncidentsResponse = {
  rideId: 'ride-comet',
  rideName: 'Twin Comet',
  rideStatus: 'in_service',
  timeZone: 'Pacific/Auckland',
  incidents: [],
};

const listPath = '/api/rides/ride-comet/incidents';
let api: StandInApi;
let postReply: () => { status: number; body?: unknown };
let clients: ReturnType<typeof makeQueryClient>[] = [];

beforeEach(() => {
  postReply = () => ({ status: 500, body: { error: { code: 'internal', message: 'Not expected' } } });
  api = standInApi({
    [listPath]: (call) => (call.method === 'GET' ? { status: 200, body: ride } : postReply()),
  });
});
afterEach(() => {
  for (const c of clients) c.clear();
  clients = [];
  jest.restoreAllMocks();
});

function renderForm() {
  const client = sessionClient(operator);
  clients.push(client);
  return renderScreens(
    client,
    { 'rides/[id]/incidents/new': IncidentReportScreen, 'incidents/[id]': () => null },
    '/rides/ride-comet/incidents/new',
  );
}

/** The wall time on the zone's clock by Intl's own rules. */
function intlNow(zone: string, at: Date): { day: string; time: string } {
  const p = Object.fromEntries(
    new Intl.DateTimeFormat('en-GB', {
      timeZone: zone,
      year: 'numeric',
      month: '2-digit',
      day: '2-digit',
      hour: '2-digit',
      minute: '2-digit',
      hourCycle: 'h23',
    })
      .formatToParts(at)
      .map((x) => [x.type, x.value]),
  );
  return { day: `${p.year}-${p.month}-${p.day}`, time: `${p.hour}:${p.minute}` };
}

async function fillComplete() {
  fireEvent.press(await screen.findByRole('radio', { name: 'Near miss' }));
  fireEvent.changeText(screen.getByLabelText('What happened'), 'Seat 4 lap bar unlatched at the top');
  fireEvent.changeText(screen.getByLabelText('Riders affected'), '1');
  fireEvent.press(screen.getByRole('radio', { name: 'No one was hurt' }));
}

const posts = () => api.calls.filter((c) => c.method === 'POST');

test('an empty send names each missing answer and sends nothing', async () => {
  renderForm();
  fireEvent.press(await screen.findByRole('button', { name: 'Send report' }));
  expect(await screen.findByText('Some answers need attention; nothing was sent.')).toBeTruthy();
  expect(screen.getByText(/Choose what happened/)).toBeTruthy();
  expect(screen.getByText('Say what happened')).toBeTruthy();
  expect(screen.getByText('A whole number of riders (0 if none)')).toBeTruthy();
  expect(screen.getByText('Say whether anyone was hurt')).toBeTruthy();
  expect(posts()).toEqual([]);
});

test('the time starts at now on the site’s clock; a bad time is named under it', async () => {
  const before = intlNow('Pacific/Auckland', new Date());
  renderForm();
  const time = await screen.findByLabelText('When it happened: time');
  const after = intlNow('Pacific/Auckland', new Date());
  // Within the same minute as Intl's reading of the zone (either side of a minute boundary).
  expect([before.time, after.time]).toContain(time.props.value);
  await fillComplete();
  fireEvent.changeText(time, '25:70');
  fireEvent.press(screen.getByRole('button', { name: 'Send report' }));
  expect(await screen.findByText('Not a real date and time')).toBeTruthy();
  expect(posts()).toEqual([]);
});

test('a complete report is sent in the API’s shape, with the stop when ticked', async () => {
  postReply = () => ({ status: 500, body: { error: { code: 'internal', message: 'Stand-in stops here' } } });
  renderForm();
  await fillComplete();
  fireEvent.press(screen.getByRole('checkbox', { name: 'Stop the ride and ask for an inspection' }));
  fireEvent.press(screen.getByRole('button', { name: 'Send report and stop the ride' }));
  await waitFor(() => expect(posts()).toHaveLength(1));
  const sent = incidentInputSchema.parse(posts()[0].body);
  expect(sent).toMatchObject({
    kind: 'near_miss',
    what: 'Seat 4 lap bar unlatched at the top',
    ridersAffected: 1,
    anyoneHurt: false,
    stopRide: true,
    photoShas: [],
  });
  expect(sent.stoppedAt).toBeUndefined();
});

test('the server’s field refusal lands under the field; nothing typed is lost', async () => {
  postReply = () => ({
    status: 400,
    body: {
      error: {
        code: 'validation_failed',
        message: 'Cannot be in the future',
        issues: [{ path: 'occurredAt', message: 'Cannot be in the future: it is 09:00 now' }],
      },
    },
  });
  renderForm();
  await fillComplete();
  fireEvent.press(screen.getByRole('button', { name: 'Send report' }));
  expect(await screen.findByText('Cannot be in the future: it is 09:00 now')).toBeTruthy();
  expect(screen.getByLabelText('What happened').props.value).toBe('Seat 4 lap bar unlatched at the top');
});

test('offline: says the report was not sent and keeps what was typed', async () => {
  renderForm();
  await fillComplete();
  noSignal();
  fireEvent.press(screen.getByRole('button', { name: 'Send report' }));
  expect(await screen.findByText(/^The report was not sent\./)).toBeTruthy();
  expect(screen.getByText(/Everything you typed and the photos stay here/)).toBeTruthy();
  expect(screen.getByLabelText('What happened').props.value).toBe('Seat 4 lap bar unlatched at the top');
  expect(screen.getByLabelText('Riders affected').props.value).toBe('1');
});
