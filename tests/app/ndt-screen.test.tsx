/**
 * The ride's NDT screen (/rides/:id/ndt) against a stand-in server answering in the API's shapes
 * (features/pivot-life/ndt-schema.ts). Checked: the due states and records as shown, who may add a
 * record, the report's upload addressed by its SHA-256 before the record that names it, and refusals.
 *
 * Outside references: the report's address is checked against Node's own SHA-256 (OpenSSL); the stand-in
 * report starts with the PDF header "%PDF-" (ISO 32000-1 §7.5.2, from memory). The ride and people are
 * the invented demo scenario.
 */
import { createHash } from 'crypto';

import { fireEvent, screen, waitFor, within } from 'expo-router/testing-library';

import { CAUTION_SHORT } from '@/components/caution';
import { formatBytes } from '@/lib/bytes';
import { NdtScreen } from '@/features/pivot-life/ndt-screen';
import type { NdtRecord, RideNdt } from '@/features/pivot-life/ndt-schema';
import type { SessionUser } from '@/features/session/schema';
import { renderScreens, sessionClient } from '@/tests/support/app-screens';
import { standInApi } from '@/tests/support/stand-in-api';
import { pickDate } from '@/tests/support/pick-date';
import { FetchXmlHttpRequest } from '@/tests/support/fetch-xhr';

jest.mock('@/features/session/token-store', () => ({
  tokenStore: {
    get: async () => ({ token: 'token-of-tester', expiresAt: '2099-01-01T00:00:00.000Z', user: null }),
    set: async () => {},
    clear: async () => {},
  },
}));
jest.mock('@/components/use-wide', () => ({ useWide: () => false }));

const PDF = Uint8Array.from(Buffer.from('%PDF-1.4\n% MT report, Lantern Wheel main axle\n%%EOF\n', 'latin1'));
let mockPicked: { name: string; uri: string; size: number } = {
  name: 'mt-report.pdf',
  uri: 'file:///mt.pdf',
  size: PDF.length,
};
let mockBytes: Uint8Array = PDF;
jest.mock('expo-document-picker', () => ({
  getDocumentAsync: jest.fn(async () => ({ canceled: false, assets: [mockPicked] })),
}));
jest.mock('@/features/documents/read-picked-bytes', () => ({
  readPickedBytes: jest.fn(async () => mockBytes),
}));

/**
 * The report goes up with XMLHttpRequest (features/api/put-bytes.ts), for its progress: here over the
 * stand-in API's fetch. `gate`, when set, holds the upload after it has reported half its bytes sent, as
 * a slow signal would.
 */
let gate: Promise<void> | null = null;
class HalfwayXhr extends FetchXmlHttpRequest {
  send(body?: ArrayBuffer | string | null) {
    const total = body instanceof ArrayBuffer ? body.byteLength : 0;
    this.upload.onprogress?.({ lengthComputable: true, loaded: Math.floor(total / 2), total });
    void (gate ?? Promise.resolve()).then(() => super.send(body));
  }
}
const platformXhr = (global as { XMLHttpRequest?: unknown }).XMLHttpRequest;
beforeEach(() => {
  gate = null;
  (global as { XMLHttpRequest?: unknown }).XMLHttpRequest = HalfwayXhr;
});
afterAll(() => {
  (global as { XMLHttpRequest?: unknown }).XMLHttpRequest = platformXhr;
});

const person = (role: SessionUser['role'], name: string): SessionUser => ({
  id: `${role}-1`,
  email: `${role}@pivotwatch.test`,
  name,
  role,
  companyId: role === 'operator' ? 'company-1' : null,
  companyName: role === 'operator' ? 'Tamsworth Pier Leisure' : null,
});
const inspector = person('inspector', 'Tomas Reyne');
const operator = person('operator', 'Priya Castellan');

const record = (patch: Partial<NdtRecord>): NdtRecord => ({
  id: 'rec-1',
  rideId: 'ride-1',
  joint: 0,
  testedOn: '2026-03-15',
  method: 'MT',
  technician: 'Ines Harrowgate',
  level: 2,
  result: 'no_indications',
  note: null,
  reportSha256: null,
  createdBy: 'inspector-1',
  createdByName: 'Tomas Reyne',
  createdAt: '2026-03-15T12:00:00.000Z',
  ...patch,
});

const ndt: RideNdt = {
  rideId: 'ride-1',
  rideName: 'Lantern Wheel',
  asOf: '2026-12-03',
  designVersion: 2,
  pivots: [
    {
      joint: 0,
      name: 'Main axle',
      plans: [
        { method: 'MT', intervalDays: 365, note: 'Hub welds' },
        { method: 'UT', intervalDays: 730, note: null },
        { method: 'VT', intervalDays: 90, note: null },
      ],
      due: [
        {
          method: 'MT',
          intervalDays: 365,
          lastOn: '2026-03-15',
          lastResult: 'no_indications',
          dueOn: '2027-03-15',
          state: 'upcoming',
        },
        {
          method: 'UT',
          intervalDays: 730,
          lastOn: '2024-11-01',
          lastResult: 'no_indications',
          dueOn: '2026-11-01',
          state: 'overdue',
        },
        {
          method: 'VT',
          intervalDays: 90,
          lastOn: null,
          lastResult: null,
          dueOn: '2025-01-10',
          state: 'never_tested',
        },
      ],
      records: [
        record({
          id: 'rec-2',
          testedOn: '2026-03-15',
          result: 'acceptable_indications',
          reportSha256: 'a'.repeat(64),
        }),
        record({ id: 'rec-1', testedOn: '2024-11-01', method: 'UT', level: 3, technician: 'Caius Mellenby' }),
      ],
    },
  ],
  otherRecords: [],
};

afterEach(() => jest.restoreAllMocks());

function render(user: SessionUser, routes: Parameters<typeof standInApi>[0] = {}) {
  const api = standInApi({
    '/api/rides/ride-1/ndt': () => ({ status: 200, body: ndt }),
    ...(routes as object),
  });
  renderScreens(sessionClient(user), { 'rides/[id]/ndt': NdtScreen }, '/rides/ride-1/ndt');
  return api;
}

test('each plan’s state in words and shape, the records newest first, and the caution', async () => {
  render(inspector);
  const pivot = await screen.findByLabelText('NDT at Main axle');
  expect(screen.getByText(CAUTION_SHORT, { exact: false })).toBeTruthy();
  expect(within(pivot).getByLabelText('Upcoming')).toBeTruthy();
  expect(within(pivot).getByLabelText('Overdue')).toBeTruthy();
  expect(within(pivot).getByLabelText('Never tested · overdue')).toBeTruthy();
  // 2026-11-01 is 32 days before 2026-12-03.
  expect(within(pivot).getByText(/due since 1 Nov 2026 \(32 days ago\)/)).toBeTruthy();
  const list = within(pivot).getByLabelText('NDT records, newest first');
  const rows = within(list).getAllByTestId(/^ndt-record-/);
  expect(rows.map((r) => r.props.testID)).toEqual(['ndt-record-rec-2', 'ndt-record-rec-1']);
  expect(within(rows[0]).getByText(/Indications within acceptance/)).toBeTruthy();
  expect(within(rows[0]).getByRole('button', { name: 'Report PDF' })).toBeTruthy();
  expect(within(rows[1]).getByText(/EN ISO 9712 level 3/)).toBeTruthy();
});

test('the operator reads but cannot add', async () => {
  render(operator);
  await screen.findByLabelText('NDT at Main axle');
  expect(screen.queryByLabelText('Add NDT record')).toBeNull();
});

test('an inspector adds a record: the PDF goes up by its SHA-256 first, then the record naming it', async () => {
  const hash = createHash('sha256').update(PDF).digest('hex');
  mockBytes = PDF;
  mockPicked = { name: 'mt-report.pdf', uri: 'file:///mt.pdf', size: PDF.length };
  const api = render(inspector, {
    [`/api/ndt-reports/${hash}`]: () => ({ status: 201, body: { stored: true, sha256: hash } }),
    '/api/rides/ride-1/ndt-records': (call) => ({
      status: 201,
      body: { record: record({ id: 'rec-3', ...(call.body as object) }), notInPlan: false, message: null },
    }),
  });
  const form = await screen.findByLabelText('Add NDT record');
  pickDate('Tested on', '2026-11-30', within(form));
  fireEvent.press(within(form).getByLabelText('MT · planned'));
  fireEvent.changeText(within(form).getByLabelText('Technician'), 'Ines Harrowgate');
  fireEvent.press(within(form).getByLabelText('No indications'));
  fireEvent.press(within(form).getByRole('button', { name: 'Choose PDF' }));
  expect(await within(form).findByTestId('ndt-report-picked')).toBeTruthy();
  fireEvent.press(within(form).getByRole('button', { name: 'Add NDT record' }));

  await within(form).findByText(/Recorded MT on 30 Nov 2026 with its report/);
  const put = api.callsTo('PUT', `/api/ndt-reports/${hash}`);
  expect(put).toHaveLength(1);
  expect(put[0].headers['Content-Type']).toBe('application/pdf');
  expect(put[0].body).toEqual(PDF);
  const post = api.callsTo('POST', '/api/rides/ride-1/ndt-records');
  expect(post[0].body).toEqual({
    joint: 0,
    testedOn: '2026-11-30',
    method: 'MT',
    technician: 'Ines Harrowgate',
    level: 2,
    result: 'no_indications',
    reportSha256: hash,
  });
  expect(api.calls.indexOf(put[0])).toBeLessThan(api.calls.indexOf(post[0]));
});

test('while the report goes up a bar says how far, in bytes (WAI-ARIA 1.2 progressbar: valuenow of valuemax)', async () => {
  const hash = createHash('sha256').update(PDF).digest('hex');
  mockBytes = PDF;
  mockPicked = { name: 'mt-report.pdf', uri: 'file:///mt.pdf', size: PDF.length };
  let release = () => {};
  gate = new Promise<void>((r) => (release = r));
  render(inspector, {
    [`/api/ndt-reports/${hash}`]: () => ({ status: 201, body: { stored: true, sha256: hash } }),
    '/api/rides/ride-1/ndt-records': (call) => ({
      status: 201,
      body: { record: record({ id: 'rec-4', ...(call.body as object) }), notInPlan: false, message: null },
    }),
  });
  const form = await screen.findByLabelText('Add NDT record');
  fireEvent.press(within(form).getByLabelText('MT · planned'));
  fireEvent.changeText(within(form).getByLabelText('Technician'), 'Ines Harrowgate');
  fireEvent.press(within(form).getByLabelText('No indications'));
  fireEvent.press(within(form).getByRole('button', { name: 'Choose PDF' }));
  await within(form).findByTestId('ndt-report-picked');
  fireEvent.press(within(form).getByRole('button', { name: 'Add NDT record' }));

  const bar = await within(form).findByRole('progressbar', { name: 'Adding the NDT record' });
  const half = Math.floor(PDF.length / 2);
  expect(bar.props['aria-valuenow']).toBe(half);
  expect(bar.props['aria-valuemax']).toBe(PDF.length);
  expect(
    within(form).getByText(
      `Sending the report: ${formatBytes(half)} of ${formatBytes(PDF.length)} (step 1 of 2)`,
    ),
  ).toBeTruthy();
  release();
  await within(form).findByText(/Recorded MT on .* with its report/);
  expect(within(form).queryByRole('progressbar', { name: 'Adding the NDT record' })).toBeNull();
});

test('a file that is not a PDF is refused before any upload; missing fields are named', async () => {
  mockBytes = Uint8Array.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
  mockPicked = { name: 'photo.png', uri: 'file:///photo.png', size: 8 };
  const api = render(inspector);
  const form = await screen.findByLabelText('Add NDT record');
  fireEvent.press(within(form).getByRole('button', { name: 'Choose PDF' }));
  expect(await within(form).findByText('photo.png is not a PDF.')).toBeTruthy();
  fireEvent.press(within(form).getByLabelText('ET'));
  expect(
    within(form).getByText(/Eddy current testing is not in this pivot’s plan \(MT, UT, VT\)/),
  ).toBeTruthy();
  fireEvent.press(within(form).getByRole('button', { name: 'Add NDT record' }));
  expect(await within(form).findByText('Who tested')).toBeTruthy();
  await waitFor(() => expect(api.calls.filter((c) => c.method !== 'GET')).toEqual([]));
});

test('the server’s 400 is shown beside the field it names', async () => {
  mockBytes = PDF;
  render(inspector, {
    '/api/rides/ride-1/ndt-records': () => ({
      status: 400,
      body: {
        error: {
          code: 'validation_failed',
          message: 'The test date cannot be after today.',
          issues: [{ path: 'testedOn', message: 'The test date cannot be after today.' }],
        },
      },
    }),
  });
  const form = await screen.findByLabelText('Add NDT record');
  pickDate('Tested on', '2026-12-04', within(form));
  fireEvent.press(within(form).getByLabelText('UT · planned'));
  fireEvent.changeText(within(form).getByLabelText('Technician'), 'Caius Mellenby');
  fireEvent.press(within(form).getByLabelText('Indications beyond acceptance'));
  expect(within(form).getByText(/A defect: record it as a finding/)).toBeTruthy();
  fireEvent.press(within(form).getByRole('button', { name: 'Add NDT record' }));
  await waitFor(() =>
    expect(within(form).getAllByText('The test date cannot be after today.').length).toBeGreaterThan(0),
  );
});
