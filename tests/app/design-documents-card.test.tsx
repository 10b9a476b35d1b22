/**
 * The documents card of a design-data version (on the design pages) against a stand-in server answering
 * in the API's shapes (features/registry/schema/design-documents.ts). Checked: each document's kind,
 * revision and the version it came from; a supervisor attaches a PDF (uploaded by its SHA-256 before the
 * attachment naming it) and removes one only after confirming; an inspector only reads; the server's 400
 * is shown beside the field it names.
 *
 * Outside references: the upload's address is checked against Node's own SHA-256 (OpenSSL); the stand-in
 * manual starts with the PDF header "%PDF-" (ISO 32000-1 §7.5.2). Names are the invented demo's.
 */
import { createHash } from 'crypto';

import { fireEvent, screen, waitFor, within } from 'expo-router/testing-library';

import { DesignDocumentsCard } from '@/features/registry/design-documents-card';
import type { DesignDocument, VersionDocuments } from '@/features/registry/schema';
import type { SessionUser } from '@/features/session/schema';
import { renderScreens, sessionClient } from '@/tests/support/app-screens';
import { FetchXmlHttpRequest } from '@/tests/support/fetch-xhr';
import { standInApi, type StandInRoute } from '@/tests/support/stand-in-api';

jest.mock('@/features/session/token-store', () => ({
  tokenStore: {
    get: async () => ({ token: 'token-of-tester', expiresAt: '2099-01-01T00:00:00.000Z', user: null }),
    set: async () => {},
    clear: async () => {},
  },
}));

const mockManual = Uint8Array.from(
  Buffer.from('%PDF-1.4\n% Skylark PX-15 maintenance manual, issue 4\n%%EOF\n', 'latin1'),
);
jest.mock('expo-document-picker', () => ({
  getDocumentAsync: jest.fn(async () => ({
    canceled: false,
    assets: [{ name: 'skylark-manual-issue-4.pdf', uri: 'file:///manual.pdf', size: 60 }],
  })),
}));
jest.mock('@/features/documents/read-picked-bytes', () => ({
  readPickedBytes: jest.fn(async () => mockManual),
}));

const platformXhr = (global as { XMLHttpRequest?: unknown }).XMLHttpRequest;
beforeEach(() => {
  (global as { XMLHttpRequest?: unknown }).XMLHttpRequest = FetchXmlHttpRequest;
});
afterAll(() => {
  (global as { XMLHttpRequest?: unknown }).XMLHttpRequest = platformXhr;
});
afterEach(() => jest.restoreAllMocks());

const supervisor: SessionUser = {
  id: 'supervisor-1',
  email: 'supervisor@pivotwatch.test',
  name: 'Mira Delacourt',
  role: 'supervisor',
  companyId: null,
  companyName: null,
};

const doc = (patch: Partial<DesignDocument>): DesignDocument => ({
  id: 'doc-1',
  rideId: 'ride-1',
  version: 3,
  sha256: 'd'.repeat(64),
  kind: 'design_report',
  title: 'Design report DR-PX15-004',
  revision: 'Rev. C',
  issuedOn: null,
  firstVersion: 3,
  attachedAt: '2026-11-02T10:00:00.000Z',
  attachedByName: 'Rowan Ashby',
  detachedAt: null,
  detachedByName: null,
  ...patch,
});

const documents: VersionDocuments = {
  rideId: 'ride-1',
  rideName: 'Skylark',
  version: 3,
  documents: [
    doc({
      id: 'doc-0',
      kind: 'drawing',
      title: 'General arrangement GA-12',
      revision: null,
      firstVersion: 1,
    }),
    doc({}),
  ],
};

const PATH = '/api/rides/ride-1/design/versions/3/documents';

function render(editable: boolean, post?: StandInRoute, routes: Record<string, StandInRoute> = {}) {
  const api = standInApi({
    [PATH]: (call) => (call.method === 'POST' ? post?.(call) : { status: 200, body: documents }),
    ...routes,
  });
  renderScreens(
    sessionClient(supervisor),
    { card: () => <DesignDocumentsCard rideId="ride-1" version={3} editable={editable} /> },
    '/card',
  );
  return api;
}

test('each document says what it is and which version it came from; an inspector only reads', async () => {
  const api = render(false);
  const card = await screen.findByLabelText('Documents of version 3');
  await within(card).findByText('General arrangement GA-12');
  expect(
    within(card).getByText(/^Carried from version 1 \(attached 2 Nov 2026 by Rowan Ashby\)$/),
  ).toBeTruthy();
  expect(within(card).getByText('Design report · Rev. C')).toBeTruthy();
  expect(within(card).getByText(/^Attached to this version 2 Nov 2026 by Rowan Ashby$/)).toBeTruthy();
  expect(within(card).getByRole('button', { name: 'Open Design report DR-PX15-004' })).toBeTruthy();
  expect(within(card).queryByRole('button', { name: 'Remove' })).toBeNull();
  expect(within(card).queryByRole('button', { name: 'Attach document' })).toBeNull();
  await waitFor(() => expect(api.calls.filter((c) => c.method !== 'GET')).toEqual([]));
});

test('a supervisor attaches a PDF: uploaded by its SHA-256 first, then attached by that hash', async () => {
  const hash = createHash('sha256').update(mockManual).digest('hex');
  const api = render(
    true,
    (call) => ({ status: 201, body: { document: doc({ id: 'doc-2', ...(call.body as object) }) } }),
    { [`/api/documents/${hash}`]: () => ({ status: 201, body: { stored: true, sha256: hash } }) },
  );
  const form = await screen.findByLabelText('Attach a document');
  fireEvent.press(within(form).getByRole('button', { name: 'Choose PDF' }));
  expect(await within(form).findByTestId('design-document-picked')).toBeTruthy();
  // The title starts from the file's name.
  expect(within(form).getByLabelText('Title').props.value).toBe('skylark-manual-issue-4');
  fireEvent.press(within(form).getByLabelText('Maker’s manual'));
  fireEvent.changeText(within(form).getByLabelText('Title'), 'Skylark PX-15 maintenance manual');
  fireEvent.changeText(within(form).getByLabelText('Revision or issue (optional)'), 'Issue 4');
  fireEvent.press(within(form).getByRole('button', { name: 'Attach document' }));
  await within(form).findByText('✓ Attached “Skylark PX-15 maintenance manual” to version 3.');
  const put = api.callsTo('PUT', `/api/documents/${hash}`);
  expect(put).toHaveLength(1);
  expect(put[0].body).toEqual(mockManual);
  const post = api.callsTo('POST', PATH);
  expect(post[0].body).toEqual({
    sha256: hash,
    kind: 'makers_manual',
    title: 'Skylark PX-15 maintenance manual',
    revision: 'Issue 4',
    issuedOn: null,
  });
  expect(api.calls.indexOf(put[0])).toBeLessThan(api.calls.indexOf(post[0]));
});

test('no file or kind is named before anything is sent; the server’s 400 lands beside its field', async () => {
  const hash = createHash('sha256').update(mockManual).digest('hex');
  const refused = 'No document with this SHA-256 is stored; upload the PDF first.';
  const api = render(
    true,
    () => ({
      status: 400,
      body: {
        error: {
          code: 'validation_failed',
          message: refused,
          issues: [{ path: 'sha256', message: refused }],
        },
      },
    }),
    { [`/api/documents/${hash}`]: () => ({ status: 200, body: { stored: false, sha256: hash } }) },
  );
  const form = await screen.findByLabelText('Attach a document');
  fireEvent.press(within(form).getByRole('button', { name: 'Attach document' }));
  expect(await within(form).findByText('Choose the PDF to attach')).toBeTruthy();
  expect(within(form).getByText(/^One of design_report/)).toBeTruthy();
  expect(api.calls.filter((c) => c.method !== 'GET')).toEqual([]);

  fireEvent.press(within(form).getByRole('button', { name: 'Choose PDF' }));
  await within(form).findByTestId('design-document-picked');
  fireEvent.press(within(form).getByLabelText('Drawing'));
  fireEvent.press(within(form).getByRole('button', { name: 'Attach document' }));
  // The server's `sha256` is the form's file: its message shows there (and in the form's alert).
  await waitFor(() =>
    expect(
      within(form).getAllByText('No document with this SHA-256 is stored; upload the PDF first.'),
    ).toHaveLength(2),
  );
});

test('removing asks first, then detaches that one document from this version', async () => {
  const api = render(true, undefined, {
    [`${PATH}/doc-0`]: () => ({
      status: 200,
      body: {
        document: doc({
          id: 'doc-0',
          detachedAt: '2026-12-03T10:00:00.000Z',
          detachedByName: 'Mira Delacourt',
        }),
      },
    }),
  });
  const row = await screen.findByTestId('design-document-doc-0');
  fireEvent.press(within(row).getByRole('button', { name: 'Remove' }));
  expect(within(row).getByText(/Earlier versions keep it, the file stays stored/)).toBeTruthy();
  expect(api.callsTo('DELETE', `${PATH}/doc-0`)).toEqual([]);
  fireEvent.press(within(row).getByRole('button', { name: 'Remove from this version' }));
  await waitFor(() => expect(api.callsTo('DELETE', `${PATH}/doc-0`)).toHaveLength(1));
});
