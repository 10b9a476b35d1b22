/**
 * The ride's parts page (/rides/:id/parts) at phone width against a stand-in server answering in the
 * API's shapes (features/parts/schema.ts, features/registry/schema/design-documents.ts). Checked: the
 * replacements newest first with their certificates and corrections, the ride's documents saying which
 * version each came from, recording a part with its PDF uploaded by its SHA-256 before the record naming
 * it, a correction naming the record it corrects, and refusals shown beside their fields.
 *
 * Outside references: the upload's address is checked against Node's own SHA-256 (OpenSSL); the stand-in
 * certificate starts with the PDF header "%PDF-" (ISO 32000-1 §7.5.2). Names are the invented demo's.
 */
import { createHash } from 'crypto';

import { fireEvent, screen, waitFor, within } from 'expo-router/testing-library';

import { PartsScreen } from '@/features/parts/parts-screen';
import type { PartReplacement, RideParts } from '@/features/parts/schema';
import type { VersionDocuments } from '@/features/registry/schema';
import type { SessionUser } from '@/features/session/schema';
import { renderScreens, sessionClient } from '@/tests/support/app-screens';
import { FetchXmlHttpRequest } from '@/tests/support/fetch-xhr';
import { pickDate } from '@/tests/support/pick-date';
import { standInApi, type StandInRoute } from '@/tests/support/stand-in-api';

jest.mock('@/features/session/token-store', () => ({
  tokenStore: {
    get: async () => ({ token: 'token-of-tester', expiresAt: '2099-01-01T00:00:00.000Z', user: null }),
    set: async () => {},
    clear: async () => {},
  },
}));
jest.mock('@/components/use-wide', () => ({ useWide: () => false }));

const mockPdf = Uint8Array.from(
  Buffer.from('%PDF-1.4\n% Certificate of conformity, hanger pin HP-60-2291\n%%EOF\n', 'latin1'),
);
jest.mock('expo-document-picker', () => ({
  getDocumentAsync: jest.fn(async () => ({
    canceled: false,
    assets: [{ name: 'coc-hp-60-2291.pdf', uri: 'file:///coc.pdf', size: 64 }],
  })),
}));
jest.mock('@/features/documents/read-picked-bytes', () => ({
  readPickedBytes: jest.fn(async () => mockPdf),
}));

const platformXhr = (global as { XMLHttpRequest?: unknown }).XMLHttpRequest;
beforeEach(() => {
  (global as { XMLHttpRequest?: unknown }).XMLHttpRequest = FetchXmlHttpRequest;
});
afterAll(() => {
  (global as { XMLHttpRequest?: unknown }).XMLHttpRequest = platformXhr;
});

const operator: SessionUser = {
  id: 'operator-1',
  email: 'operator@pivotwatch.test',
  name: 'Priya Castellan',
  role: 'operator',
  companyId: 'company-1',
  companyName: 'Tamsworth Pier Leisure',
};

const replacement = (patch: Partial<PartReplacement>): PartReplacement => ({
  id: 'part-1',
  rideId: 'ride-1',
  component: 'Gondola hanger pin',
  joint: 0,
  pivotName: 'Main pivot',
  serialNumber: 'HP-60-2219',
  maker: 'Kestrel Pinworks Ltd',
  fittedOn: '2026-11-19',
  fittedBy: 'Dale Merriweather, Tamsworth Pier Leisure',
  replacedSerial: 'HP-60-1870',
  note: null,
  correctsId: null,
  correctedById: null,
  createdAt: '2026-11-19T15:00:00.000Z',
  createdByName: 'Priya Castellan',
  documents: [],
  ...patch,
});

const parts: RideParts = {
  rideId: 'ride-1',
  rideName: 'Skylark',
  today: '2026-12-03',
  designVersion: 2,
  pivots: [
    { joint: 0, name: 'Main pivot' },
    { joint: 1, name: 'Gondola hub' },
  ],
  replacements: [
    replacement({
      id: 'part-2',
      serialNumber: 'HP-60-2291',
      correctsId: 'part-1',
      createdAt: '2026-11-20T09:00:00.000Z',
      documents: [{ sha256: 'c'.repeat(64), title: 'Certificate of conformity' }],
    }),
    replacement({ id: 'part-1', correctedById: 'part-2' }),
    replacement({
      id: 'part-0',
      component: 'Drive wheel bushing',
      joint: null,
      pivotName: null,
      serialNumber: 'DB-115-0078',
      maker: 'Orrin Ride Works',
      fittedOn: '2026-08-05',
      replacedSerial: null,
    }),
  ],
};

const documents: VersionDocuments = {
  rideId: 'ride-1',
  rideName: 'Skylark',
  version: 2,
  documents: [
    {
      id: 'doc-1',
      rideId: 'ride-1',
      version: 2,
      sha256: 'd'.repeat(64),
      kind: 'makers_manual',
      title: 'Skylark PX-15 operation and maintenance manual',
      revision: 'Issue 4',
      issuedOn: '2024-03-18',
      firstVersion: 1,
      attachedAt: '2026-02-01T10:00:00.000Z',
      attachedByName: 'Mira Delacourt',
      detachedAt: null,
      detachedByName: null,
    },
  ],
};

afterEach(() => jest.restoreAllMocks());

/** The stand-in server: GET of the page's data, `post` answering a new record, `routes` anything else. */
function render(post?: StandInRoute, routes: Record<string, StandInRoute> = {}) {
  const api = standInApi({
    '/api/rides/ride-1/parts': (call) =>
      call.method === 'POST' ? post?.(call) : { status: 200, body: parts },
    '/api/rides/ride-1/documents': () => ({ status: 200, body: documents }),
    ...routes,
  });
  renderScreens(sessionClient(operator), { 'rides/[id]/parts': PartsScreen }, '/rides/ride-1/parts');
  return api;
}

test('replacements newest first with certificates and corrections; the ride’s documents say where they came from', async () => {
  render();
  const list = await screen.findByLabelText('Part replacements, newest first');
  const rows = within(list).getAllByTestId(/^part-replacement-/);
  expect(rows.map((r) => r.props.testID)).toEqual([
    'part-replacement-part-2',
    'part-replacement-part-1',
    'part-replacement-part-0',
  ]);
  expect(within(rows[0]).getByText(/Corrects the record of 19 Nov 2026 \(serial HP-60-2219\)/)).toBeTruthy();
  expect(within(rows[0]).getByRole('button', { name: 'Certificate of conformity (PDF)' })).toBeTruthy();
  expect(within(rows[1]).getByText(/Corrected by a later record/)).toBeTruthy();
  expect(within(rows[2]).getByText('Drive wheel bushing')).toBeTruthy();
  expect(within(rows[2]).getByText(/Fitted 5 Aug 2026 by Dale Merriweather/)).toBeTruthy();

  const docs = await screen.findByLabelText('Ride documents');
  expect(await within(docs).findByText(/design data version 2, the version in force/)).toBeTruthy();
  expect(within(docs).getByText('Maker’s manual · Issue 4 · issued 18 Mar 2024')).toBeTruthy();
  expect(
    within(docs).getByText(/Carried from version 1 \(attached 1 Feb 2026 by Mira Delacourt\)/),
  ).toBeTruthy();
  // Operators read; only the design pages attach or remove.
  expect(within(docs).queryByRole('button', { name: 'Remove' })).toBeNull();
});

test('the operator records a part: the PDF goes up by its SHA-256 first, then the record naming it', async () => {
  const hash = createHash('sha256').update(mockPdf).digest('hex');
  const api = render(
    (call) => ({
      status: 201,
      body: { replacement: replacement({ id: 'part-3', ...(call.body as object) }) },
    }),
    { [`/api/documents/${hash}`]: () => ({ status: 201, body: { stored: true, sha256: hash } }) },
  );
  fireEvent.press(await screen.findByRole('button', { name: 'Record a part fitted' }));
  const form = await screen.findByLabelText('Record a part fitted');
  fireEvent.changeText(within(form).getByLabelText('Component'), 'Gondola hanger pin');
  fireEvent.press(within(form).getByLabelText('Gondola hub'));
  fireEvent.changeText(within(form).getByLabelText('Serial number'), 'HP-60-2302');
  fireEvent.changeText(within(form).getByLabelText('Maker'), 'Kestrel Pinworks Ltd');
  pickDate('Date fitted', '2026-12-02', within(form));
  fireEvent.changeText(within(form).getByLabelText('Fitted by'), 'Dale Merriweather');
  fireEvent.press(within(form).getByRole('button', { name: 'Add PDF' }));
  expect(await within(form).findByTestId('part-pdf-picked')).toBeTruthy();
  fireEvent.press(within(form).getByRole('button', { name: 'Record part' }));

  await within(form).findByText(
    /Recorded Gondola hanger pin, serial HP-60-2302, fitted 2 Dec 2026 with 1 PDF/,
  );
  const put = api.callsTo('PUT', `/api/documents/${hash}`);
  expect(put).toHaveLength(1);
  expect(put[0].body).toEqual(mockPdf);
  const post = api.callsTo('POST', '/api/rides/ride-1/parts');
  expect(post[0].body).toEqual({
    component: 'Gondola hanger pin',
    joint: 1,
    serialNumber: 'HP-60-2302',
    maker: 'Kestrel Pinworks Ltd',
    fittedOn: '2026-12-02',
    fittedBy: 'Dale Merriweather',
    documents: [{ sha256: hash, title: 'Certificate of conformity' }],
  });
  expect(api.calls.indexOf(put[0])).toBeLessThan(api.calls.indexOf(post[0]));
});

test('missing fields are named and nothing is sent', async () => {
  const api = render();
  fireEvent.press(await screen.findByRole('button', { name: 'Record a part fitted' }));
  const form = await screen.findByLabelText('Record a part fitted');
  fireEvent.press(within(form).getByRole('button', { name: 'Record part' }));
  expect(await within(form).findByText('Which component was fitted')).toBeTruthy();
  expect(within(form).getByText('The new part’s serial number')).toBeTruthy();
  expect(within(form).getByText('Who made the part')).toBeTruthy();
  expect(within(form).getByText('Who fitted it (a person or company)')).toBeTruthy();
  await waitFor(() => expect(api.calls.filter((c) => c.method !== 'GET')).toEqual([]));
});

test('a correction names the record it corrects; the server’s 400 is shown beside its field', async () => {
  const api = render(() => ({
    status: 400,
    body: {
      error: {
        code: 'validation_failed',
        message: 'The date fitted cannot be after today at the ride’s site (2026-12-03).',
        issues: [
          {
            path: 'fittedOn',
            message: 'The date fitted cannot be after today at the ride’s site (2026-12-03).',
          },
        ],
      },
    },
  }));
  const list = await screen.findByLabelText('Part replacements, newest first');
  const original = within(list).getByTestId('part-replacement-part-0');
  fireEvent.press(within(original).getByRole('button', { name: 'Correct this record' }));
  const form = await screen.findByLabelText('Record a part fitted');
  expect(within(form).getByText(/corrects the one of 5 Aug 2026 \(serial DB-115-0078\)/)).toBeTruthy();
  // The form starts from the record corrected.
  expect(within(form).getByLabelText('Component').props.value).toBe('Drive wheel bushing');
  fireEvent.changeText(within(form).getByLabelText('Serial number'), 'DB-115-0087');
  fireEvent.press(within(form).getByRole('button', { name: 'Record the correction' }));
  await waitFor(() =>
    expect(within(form).getAllByText(/cannot be after today at the ride’s site/).length).toBeGreaterThan(0),
  );
  const post = api.callsTo('POST', '/api/rides/ride-1/parts');
  expect(post[0].body).toMatchObject({ correctsId: 'part-0', serialNumber: 'DB-115-0087', joint: null });
});
