/**
 * Makers' bulletins in the app against a stand-in server answering in the API's shapes
 * (features/bulletins/schema.ts): the new-bulletin form sends the maker’s PDF to the documents store by
 * its SHA-256 first and then the bulletin naming it, with the models typed in one box and the deadline as
 * chosen; a form that breaks the register's rules sends nothing. The ride page's card shows each
 * bulletin's state in words and shape, and a supervisor's record of one done; an operator only reads.
 *
 * Outside references: the PDF's address is checked against Node's own SHA-256 (OpenSSL); the stand-in PDF
 * starts with the header "%PDF-" (ISO 32000-1 §7.5.2). Names are the invented demo scenario.
 */
import { createHash } from 'crypto';

import { fireEvent, screen, waitFor, within } from 'expo-router/testing-library';

import { BulletinEditScreen } from '@/features/bulletins/bulletin-edit-screen';
import { RideBulletinsCard } from '@/features/bulletins/ride-bulletins-card';
import {
  type Bulletin,
  type RideBulletin,
  bulletinSchema,
  rideBulletinSchema,
} from '@/features/bulletins/schema';
import type { SessionUser } from '@/features/session/schema';
import { renderScreens, sessionClient } from '@/tests/support/app-screens';
import { FetchXmlHttpRequest } from '@/tests/support/fetch-xhr';
import { pickDate } from '@/tests/support/pick-date';
import { standInApi } from '@/tests/support/stand-in-api';

jest.mock('@/features/session/token-store', () => ({
  tokenStore: {
    get: async () => ({ token: 'token-of-tester', expiresAt: '2099-01-01T00:00:00.000Z', user: null }),
    set: async () => {},
    clear: async () => {},
  },
}));
jest.mock('@/components/use-wide', () => ({ useWide: () => false }));

const mockPdf = Uint8Array.from(
  Buffer.from('%PDF-1.4\n% Orrin Ride Works bulletin ORW-SB-26-12\n%%EOF\n', 'latin1'),
);
jest.mock('expo-document-picker', () => ({
  getDocumentAsync: jest.fn(async () => ({
    canceled: false,
    assets: [{ name: 'orw-sb-26-12.pdf', uri: 'file:///orw.pdf', size: 60 }],
  })),
}));
jest.mock('@/features/documents/read-picked-bytes', () => ({
  readPickedBytes: jest.fn(async () => mockPdf),
}));

const platformXhr = (global as { XMLHttpRequest?: unknown }).XMLHttpRequest;
beforeAll(() => {
  (global as { XMLHttpRequest?: unknown }).XMLHttpRequest = FetchXmlHttpRequest;
});
afterAll(() => {
  (global as { XMLHttpRequest?: unknown }).XMLHttpRequest = platformXhr;
});
afterEach(() => jest.restoreAllMocks());

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

const bulletin: Bulletin = bulletinSchema.parse({
  id: 'b-1',
  maker: 'Orrin Ride Works',
  models: ['PX-15'],
  reference: 'ORW-SB-26-12',
  title: 'Lap-bar latch pawls',
  issuedOn: '2026-04-20',
  severity: 'stop_ride',
  requiredAction: 'Check each lap-bar latch pawl against wear gauge G-4',
  deadlineOn: null,
  beforeNextOperation: true,
  documentSha256: null,
  notes: null,
  createdAt: '2026-04-21T08:00:00.000Z',
  updatedAt: '2026-04-21T08:00:00.000Z',
  rideCount: 1,
  doneCount: 0,
});

test('a new bulletin: its PDF goes up by its SHA-256 first, then the bulletin naming it', async () => {
  const hash = createHash('sha256').update(mockPdf).digest('hex');
  const api = standInApi({
    [`/api/documents/${hash}`]: () => ({ status: 201, body: { stored: true, sha256: hash } }),
    '/api/bulletins': () => ({ status: 201, body: { bulletin } }),
    '/api/bulletins/b-1': () => ({ status: 200, body: { bulletin, rides: [] } }),
  });
  renderScreens(
    sessionClient(supervisor),
    { 'register/bulletins/new': BulletinEditScreen, 'register/bulletins/[id]/index': () => null },
    '/register/bulletins/new',
  );
  await screen.findByRole('header', { name: 'New bulletin' });
  fireEvent.changeText(screen.getByLabelText('Maker'), 'Orrin Ride Works');
  fireEvent.changeText(screen.getByLabelText('Models'), 'PX-15, PX-6');
  fireEvent.changeText(screen.getByLabelText('Maker’s reference'), 'ORW-SB-26-12');
  pickDate('Issued on', '2026-04-20');
  fireEvent.changeText(screen.getByLabelText('Title'), 'Lap-bar latch pawls');
  fireEvent.press(screen.getByLabelText('Ride must not run until done'));
  fireEvent.changeText(
    screen.getByLabelText('Required action'),
    'Check each lap-bar latch pawl against wear gauge G-4',
  );

  // "By a date" without one: refused on the form, nothing sent.
  fireEvent.press(screen.getByRole('button', { name: 'Add bulletin' }));
  expect(await screen.findByText('Choose the date')).toBeTruthy();
  expect(api.calls.filter((c) => c.method !== 'GET')).toEqual([]);

  fireEvent.press(screen.getByLabelText('Before the ride next runs'));
  fireEvent.press(screen.getByRole('button', { name: 'Choose PDF' }));
  expect(await screen.findByText(/orw-sb-26-12\.pdf .* sent when you save/)).toBeTruthy();
  fireEvent.press(screen.getByRole('button', { name: 'Add bulletin' }));

  await waitFor(() => expect(api.callsTo('POST', '/api/bulletins')).toHaveLength(1));
  const put = api.callsTo('PUT', `/api/documents/${hash}`);
  expect(put).toHaveLength(1);
  expect(put[0].body).toEqual(mockPdf);
  const post = api.callsTo('POST', '/api/bulletins')[0];
  expect(post.body).toEqual({
    maker: 'Orrin Ride Works',
    models: ['PX-15', 'PX-6'],
    reference: 'ORW-SB-26-12',
    title: 'Lap-bar latch pawls',
    issuedOn: '2026-04-20',
    severity: 'stop_ride',
    requiredAction: 'Check each lap-bar latch pawl against wear gauge G-4',
    deadlineOn: null,
    beforeNextOperation: true,
    documentSha256: hash,
    notes: '',
  });
  expect(api.calls.indexOf(put[0])).toBeLessThan(api.calls.indexOf(post));
});

const onRide = (patch: Partial<RideBulletin>): RideBulletin =>
  rideBulletinSchema.parse({
    bulletin,
    rideId: 'ride-1',
    rideName: 'Skylark',
    siteName: 'Tamsworth Pier',
    state: 'overdue',
    done: null,
    lastNotDone: null,
    ...patch,
  });

function renderCard(user: SessionUser, rows: RideBulletin[], routes: Parameters<typeof standInApi>[0] = {}) {
  const api = standInApi({
    '/api/rides/ride-1/bulletins': () => ({ status: 200, body: { bulletins: rows } }),
    ...(routes as object),
  });
  renderScreens(
    sessionClient(user),
    {
      'rides/[id]/index': () => (
        <RideBulletinsCard rideId="ride-1" role={user.role} timeZone="Europe/London" />
      ),
    },
    '/rides/ride-1',
  );
  return api;
}

test('the ride’s card: each state in words, the inspection that found one not done, a supervisor records one done', async () => {
  const api = renderCard(
    supervisor,
    [
      onRide({
        lastNotDone: {
          outcome: 'not_done',
          on: '2026-05-04',
          byName: 'Tomas Reyne',
          note: 'Gauge not on site',
          inspectionId: 'i-1',
          recordedAt: '2026-05-04T09:00:00.000Z',
        },
      }),
    ],
    {
      '/api/rides/ride-1/bulletins/b-1/done': (call) => ({
        status: 201,
        body: {
          bulletin: onRide({
            state: 'done',
            done: {
              outcome: 'done',
              ...(call.body as { on: string; note: string }),
              byName: 'Mira Delacourt',
              inspectionId: null,
              recordedAt: '2026-05-06T09:00:00.000Z',
            },
          }),
        },
      }),
    },
  );
  const row = await screen.findByTestId('ride-bulletin-ORW-SB-26-12');
  expect(within(row).getByText('Overdue')).toBeTruthy();
  expect(within(row).getByText('Ride must not run until done · Before the ride next runs')).toBeTruthy();
  expect(
    within(row).getByText('Found not done 4 May 2026 by Tomas Reyne at an inspection: Gauge not on site'),
  ).toBeTruthy();

  fireEvent.press(within(row).getByRole('button', { name: 'Record as done' }));
  // No note: refused on the card, nothing sent.
  fireEvent.press(within(row).getAllByRole('button', { name: 'Record as done' })[0]);
  expect(await within(row).findByText('Required')).toBeTruthy();
  expect(api.callsTo('POST', '/api/rides/ride-1/bulletins/b-1/done')).toEqual([]);

  pickDate('Done on', '2026-05-06', within(row));
  fireEvent.changeText(within(row).getByLabelText('What you saw'), 'Pawls gauged on all 24 seats');
  fireEvent.press(within(row).getAllByRole('button', { name: 'Record as done' })[0]);
  await waitFor(() => expect(api.callsTo('POST', '/api/rides/ride-1/bulletins/b-1/done')).toHaveLength(1));
  expect(api.callsTo('POST', '/api/rides/ride-1/bulletins/b-1/done')[0].body).toEqual({
    on: '2026-05-06',
    note: 'Pawls gauged on all 24 seats',
  });
});

test('an operator reads their ride’s bulletins, done ones with who and when, and records nothing', async () => {
  renderCard(operator, [
    onRide({
      state: 'done',
      done: {
        outcome: 'done',
        on: '2026-05-04',
        byName: 'Tomas Reyne',
        note: null,
        inspectionId: 'i-2',
        recordedAt: '2026-05-04T09:00:00.000Z',
      },
    }),
  ]);
  const row = await screen.findByTestId('ride-bulletin-ORW-SB-26-12');
  expect(within(row).getByText('Done')).toBeTruthy();
  expect(within(row).getByText('Done 4 May 2026 by Tomas Reyne at an inspection')).toBeTruthy();
  expect(within(row).queryByRole('button', { name: 'Record as done' })).toBeNull();
});
