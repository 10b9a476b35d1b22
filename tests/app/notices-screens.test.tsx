/**
 * The notice screens (/notices and /notices/:id) against a stand-in server that answers in the API's
 * shapes (features/notices/schema.ts; errors as features/api/errors.ts). Checked: what each role sees,
 * what the screens send and in which order, and what they show after the server's answer.
 *
 * Outside references:
 *  - the evidence photo's address is its SHA-256, checked against Node's own crypto (OpenSSL), and the
 *    hash routine against the FIPS 180-2 example SHA-256("abc") = ba7816bf…f20015ad (from memory);
 *  - the JPEG start-of-image marker FF D8 FF (ITU-T T.81, from memory) starts the stand-in photo.
 * Companies, rides and people are the invented demo scenario.
 */
import { createHash } from 'crypto';

import { fromByteArray } from 'base64-js';
import { fireEvent, screen, waitFor, within } from 'expo-router/testing-library';

import { CAUTION_FULL, CAUTION_SHORT } from '@/components/caution';
import { makeQueryClient } from '@/features/api/query-client';
import type { SessionUser } from '@/features/session/schema';
import { NoticeListScreen } from '@/features/notices/notice-list-screen';
import { NoticeScreen } from '@/features/notices/notice-screen';
import {
  type FindingStateResponse,
  type NoticeDetail,
  type NoticeDocument,
  type NoticeFinding,
  correctiveActionInputSchema,
  findingStateResponseSchema,
  noticeDetailSchema,
  noticeListResponseSchema,
} from '@/features/notices/schema';
import { severityInfo } from '@/features/notices/finding-schema';
import { holderOf, renderScreens, sessionClient } from '@/tests/support/app-screens';
import { type StandInCall, type StandInReply, standInApi } from '@/tests/support/stand-in-api';

jest.mock('@/features/session/token-store', () => ({
  tokenStore: {
    get: async () => ({ token: 'token-of-tester', expiresAt: '2099-01-01T00:00:00.000Z', user: null }),
    set: async () => {},
    clear: async () => {},
  },
}));

let mockWide = false;
jest.mock('@/components/use-wide', () => ({ useWide: () => mockWide }));

/** The stand-in photo: a JPEG start-of-image marker, some bytes, the end-of-image marker. */
const PHOTO_BYTES = Uint8Array.from([
  0xff,
  0xd8,
  0xff,
  0xe0,
  ...Array.from('Pivotwatch evidence: new main pin fitted', (c) => c.charCodeAt(0)),
  0xff,
  0xd9,
]);
jest.mock('expo-image-picker', () => ({
  launchCameraAsync: jest.fn(async () => ({
    canceled: false,
    assets: [{ uri: 'file:///camera/pin.jpg', width: 800, height: 600 }],
  })),
  launchImageLibraryAsync: jest.fn(async () => ({
    canceled: false,
    assets: [{ uri: 'file:///library/pin.jpg', width: 800, height: 600 }],
  })),
}));
jest.mock('expo-image-manipulator', () => ({
  SaveFormat: { JPEG: 'jpeg' },
  manipulateAsync: jest.fn(async () => ({
    uri: 'file:///out.jpg',
    width: 800,
    height: 600,
    base64: mockBase64,
  })),
}));
let mockBase64 = '';

// ——— people ———

const operator: SessionUser = {
  id: 'u-op',
  email: 'operator@pivotwatch.test',
  name: 'Priya Castellan',
  role: 'operator',
  companyId: 'co-tpl',
  companyName: 'Tamsworth Pier Leisure',
};
const supervisor: SessionUser = {
  id: 'u-sup',
  email: 'supervisor@pivotwatch.test',
  name: 'Mira Delacourt',
  role: 'supervisor',
  companyId: null,
  companyName: null,
};
const inspector: SessionUser = {
  id: 'u-ins',
  email: 'inspector@pivotwatch.test',
  name: 'Tomas Reyne',
  role: 'inspector',
  companyId: null,
  companyName: null,
};

// ——— the notice ———

const PIN_PHOTO = 'a'.repeat(64);
const NOTICE = 'n-7';

const documentAsIssued: NoticeDocument = {
  reference: 'PW-2026-0007',
  kind: 'inspection',
  issuedAt: '2026-06-03T09:30:00.000Z',
  issuer: {
    name: 'Halvard Ride Inspection Services',
    address: '4 Quay Row, Halvard',
    phone: '01632 960100',
  },
  operator: { id: 'co-tpl', name: 'Tamsworth Pier Leisure', address: 'The Pier, Tamsworth' },
  ride: {
    id: 'ride-sky',
    name: 'Skylark',
    rideClass: 'Pendulum swing',
    maker: 'Orrin Works',
    model: 'PS-12',
    serial: 'PS12-0042',
    year: 2009,
  },
  site: { name: 'Tamsworth Pier', address: 'Pier Approach, Tamsworth' },
  inspection: {
    id: 'insp-1',
    type: 'periodic',
    typeLabel: 'Periodic inspection',
    date: '2026-06-02',
    inspectorName: 'Tomas Reyne',
    inspectorCredential: 'Reg. 4471',
    designVersion: 3,
    engineVersion: '1.4.0',
  },
  results: [
    {
      label: 'Main pivot pin diameter',
      value: '57.80 mm',
      limit: 'at least 58.00 mm',
      ratio: 1.12,
      status: 'over',
    },
    { label: 'Peak force, main pivot', value: '18.4 kN', limit: '20.0 kN', ratio: 0.92, status: 'near' },
  ],
  loadSummary: [{ pivot: 'Main pivot', peakForce: '18.4 kN', limit: '20.0 kN' }],
  checklist: { total: 24, failed: 2 },
  findings: [
    {
      id: 'f-1',
      number: 1,
      severity: 'fix_before_operation',
      description: 'Main pivot pin worn below its wear limit.',
      ruleRef: 'Maker’s manual 7.3',
      requiredAction: 'Replace the main pivot pin and bushing.',
      dueOn: null,
      state: 'open',
      photos: [{ sha256: PIN_PHOTO, caption: 'Main pin, worn face' }],
    },
    {
      id: 'f-2',
      number: 2,
      severity: 'fix_by_date',
      description: 'Paint flaking on the gondola frame.',
      ruleRef: null,
      requiredAction: 'Clean back and repaint.',
      dueOn: '2026-06-20',
      state: 'open',
      photos: [],
    },
  ],
  operatingStatus: { status: 'out_of_service', reason: 'Main pivot pin below its wear limit' },
  reinspection: { required: true, reason: 'The ride returns to service only after a re-inspection.' },
  note: 'Send photos of the new pin once fitted.',
  appeal:
    'If you disagree with this notice, write to Halvard Ride Inspection Services within 14 days of its date.',
  caution: CAUTION_FULL,
  signature: { name: 'Mira Delacourt', role: 'Supervisor', signedAt: '2026-06-03T09:30:00.000Z' },
  url: `https://pivotwatch.example.test/notices/${NOTICE}`,
};

function findingNow(over: Partial<NoticeFinding> & { id: string }): NoticeFinding {
  const issued = documentAsIssued.findings.find((f) => f.id === over.id);
  if (!issued) throw new Error(`No finding ${over.id}`);
  return {
    inspectionId: 'insp-1',
    rideId: 'ride-sky',
    number: issued.number,
    severity: issued.severity,
    description: issued.description,
    ruleRef: issued.ruleRef,
    requiredAction: issued.requiredAction,
    dueOn: issued.dueOn,
    photoShas: issued.photos.map((p) => p.sha256),
    state: 'open',
    createdAt: '2026-06-02T15:00:00.000Z',
    createdByName: 'Mira Delacourt',
    updatedAt: '2026-06-03T09:30:00.000Z',
    updatedByName: 'Mira Delacourt',
    closedAt: null,
    closedByName: null,
    stateNote: null,
    correctiveActions: [],
    ...over,
  };
}

function noticeNow(over: Partial<NoticeDetail> = {}): NoticeDetail {
  return {
    id: NOTICE,
    reference: documentAsIssued.reference,
    kind: 'inspection',
    inspectionId: 'insp-1',
    rideId: 'ride-sky',
    rideName: 'Skylark',
    operatorId: 'co-tpl',
    operatorName: 'Tamsworth Pier Leisure',
    issuedAt: documentAsIssued.issuedAt,
    issuedByName: 'Mira Delacourt',
    acknowledgedAt: null,
    acknowledgedByName: null,
    delivery: { state: 'sent', total: 1, sent: 1, failed: 0 },
    openFindings: 2,
    findingsTotal: 2,
    document: documentAsIssued,
    deliveries: [
      {
        id: 'd-1',
        recipient: 'notices@tamsworth-pier.example',
        status: 'sent',
        attempts: 2,
        nextAttemptAt: null,
        lastError: null,
        sentAt: '2026-06-03T09:31:10.000Z',
      },
    ],
    findings: [findingNow({ id: 'f-1' }), findingNow({ id: 'f-2' })],
    ...over,
  };
}

const headOf = ({ document: _d, deliveries: _s, findings: _f, ...head }: NoticeDetail) => head;

const ride = (status: 'in_service' | 'out_of_service', reason: string | null) => ({
  ride: {
    id: 'ride-sky',
    name: 'Skylark',
    rideClass: 'pendulum_swing',
    description: null,
    maker: 'Orrin Works',
    model: 'PS-12',
    serial: 'PS12-0042',
    year: 2009,
    status,
    statusReason: reason,
    statusSince: '2026-06-03T09:30:00.000Z',
    siteId: 'site-1',
    siteName: 'Tamsworth Pier',
    operatorCompanyId: 'co-tpl',
    operatorName: 'Tamsworth Pier Leisure',
  },
  design: null,
});

// ——— the stand-in server ———

type Call = StandInCall;
type Reply = StandInReply;

let server: {
  notice: NoticeDetail;
  photos: Map<string, Uint8Array>;
  rideStatus: 'in_service' | 'out_of_service';
  calls: Call[];
};

const clock = () => new Date().toISOString();

function findingState(finding: NoticeFinding, statusNotice: FindingStateResponse['statusNotice']): Reply {
  server.notice = {
    ...server.notice,
    findings: server.notice.findings.map((f) => (f.id === finding.id ? finding : f)),
  };
  return {
    status: 200,
    body: {
      finding,
      ride: {
        id: 'ride-sky',
        status: server.rideStatus,
        statusReason: server.rideStatus === 'in_service' ? null : 'Pin',
      },
      statusNotice,
    },
  };
}

function route(call: Call): Reply {
  const { method, path } = call;
  const found = /^\/api\/findings\/([^/]+)\/(actions|close|reopen)$/.exec(path);
  const finding = found ? server.notice.findings.find((f) => f.id === found[1]) : undefined;
  if (method === 'GET' && path === '/api/notices')
    return {
      status: 200,
      body: {
        notices: [headOf(server.notice)],
        total: 1,
        page: 1,
        pageSize: Number(call.search.get('pageSize')),
      },
    };
  if (method === 'GET' && path === `/api/notices/${NOTICE}`)
    return { status: 200, body: { notice: server.notice } };
  if (method === 'POST' && path === `/api/notices/${NOTICE}/acknowledge`) {
    server.notice = { ...server.notice, acknowledgedAt: clock(), acknowledgedByName: 'Priya Castellan' };
    return { status: 200, body: { notice: server.notice } };
  }
  if (method === 'POST' && path === `/api/notices/${NOTICE}/resend`)
    return { status: 200, body: { queued: 0 } };
  if (method === 'PUT' && path.startsWith('/api/photos/')) {
    server.photos.set(path.slice('/api/photos/'.length), call.body as Uint8Array);
    return { status: 201, body: { stored: true, sha256: path.slice('/api/photos/'.length) } };
  }
  if (method === 'GET' && path === '/api/rides/ride-sky')
    return { status: 200, body: ride(server.rideStatus, server.rideStatus === 'in_service' ? null : 'Pin') };
  if (method === 'GET' && path === '/api/companies')
    return { status: 200, body: { companies: [], total: 0, page: 1, pageSize: 200 } };
  if (method === 'GET' && path === '/api/rides')
    return { status: 200, body: { rides: [], total: 0, page: 1, pageSize: 200 } };
  if (found && finding && method === 'POST') {
    const [, , what] = found;
    if (what === 'actions') {
      const input = correctiveActionInputSchema.parse(call.body);
      const missing = input.photoShas.findIndex((sha) => !server.photos.has(sha));
      if (missing >= 0)
        return {
          status: 400,
          body: {
            error: {
              code: 'validation_failed',
              message: 'Some photos have not reached the server yet.',
              issues: [{ path: `photoShas.${missing}`, message: 'This photo has not been uploaded yet.' }],
            },
          },
        };
      const reply = findingState(
        {
          ...finding,
          state: 'action_reported',
          correctiveActions: [
            ...finding.correctiveActions,
            {
              id: 'ca-1',
              findingId: finding.id,
              note: input.note,
              photoShas: input.photoShas,
              reportedAt: clock(),
              reportedByName: 'Priya Castellan',
            },
          ],
        },
        null,
      );
      return { ...reply, status: 201 };
    }
    if (what === 'close') {
      // Closing never changes the ride's status (the status rules): no status notice.
      const input = call.body as { note: string; evidenceRef: string | null; photoShas: string[] };
      return findingState(
        {
          ...finding,
          state: 'closed',
          closedAt: clock(),
          closedByName: 'Mira Delacourt',
          stateNote: input.note,
          closeEvidence: {
            photoShas: input.photoShas,
            reference: input.evidenceRef,
            correctiveActions: finding.correctiveActions.length,
          },
        },
        null,
      );
    }
    const note = (call.body as { note: string }).note;
    return findingState(
      {
        ...finding,
        state: 'open',
        closedAt: null,
        closedByName: null,
        stateNote: note,
        updatedByName: 'Mira Delacourt',
      },
      null,
    );
  }
  return { status: 404, body: { error: { code: 'not_found', message: 'No such notice.' } } };
}

beforeEach(() => {
  mockWide = false;
  mockBase64 = fromByteArray(PHOTO_BYTES);
  server = { notice: noticeNow(), photos: new Map(), rideStatus: 'out_of_service', calls: [] };
  server.calls = standInApi(route).calls;
});

let clients: ReturnType<typeof makeQueryClient>[] = [];
afterEach(() => {
  for (const c of clients) c.clear();
  clients = [];
  jest.useRealTimers();
  jest.restoreAllMocks();
});

function renderNotices(user: SessionUser, initialUrl: string) {
  const client = sessionClient(user);
  clients.push(client);
  // The operator reads the notice a week after it was issued; finding 2 is due on 20 June.
  jest.useFakeTimers({ now: new Date('2026-06-10T08:00:00.000Z') });
  return renderScreens(
    client,
    { 'notices/index': NoticeListScreen, 'notices/[id]': NoticeScreen },
    initialUrl,
  );
}

const callsTo = (method: string, path: string) =>
  server.calls.filter((c) => c.method === method && c.path === path);

// ——— tests ———

test('the fixtures are in the API’s shapes (the tests talk the server’s language)', () => {
  expect(() => noticeDetailSchema.parse(noticeNow())).not.toThrow();
  expect(() =>
    noticeListResponseSchema.parse({ notices: [headOf(noticeNow())], total: 1, page: 1, pageSize: 25 }),
  ).not.toThrow();
  expect(() =>
    findingStateResponseSchema.parse({
      finding: findingNow({ id: 'f-1' }),
      ride: { id: 'ride-sky', status: 'in_service', statusReason: null },
      statusNotice: null,
    }),
  ).not.toThrow();
});

describe('an operator', () => {
  test('sees the company’s notices: reference, ride, kind, date, acknowledgement and open findings', async () => {
    const view = renderNotices(operator, '/notices?operatorId=co-other');
    const card = holderOf(await screen.findByRole('link', { name: 'Notice PW-2026-0007, Skylark' }));
    expect(within(card).getByText('Inspection notice')).toBeTruthy();
    expect(within(card).getByText('3 Jun 2026')).toBeTruthy();
    expect(within(card).getByText('Awaiting your acknowledgement')).toBeTruthy();
    expect(within(card).getByText('2 of 2 open')).toBeTruthy();
    // No e-mail column or staff filters for operators; a filter in the URL is not passed on.
    expect(screen.queryByText('Sent')).toBeNull();
    expect(screen.queryByRole('combobox', { name: /^Operator:/ })).toBeNull();
    const list = callsTo('GET', '/api/notices')[0];
    expect(list.search.get('operatorId')).toBeNull();
    expect(list.search.get('pageSize')).toBe('25');
    fireEvent.press(card);
    expect(await screen.findByText('Acknowledgement')).toBeTruthy();
    expect(view.getPathname()).toBe(`/notices/${NOTICE}`);
  });

  test('reads the notice as issued: ride, site, inspection, status, findings with due dates, results, caution', async () => {
    renderNotices(operator, `/notices/${NOTICE}`);
    const doc = await screen.findByLabelText('Notice PW-2026-0007 as issued');
    expect(screen.getByText('AS ISSUED ON 3 JUN 2026')).toBeTruthy();
    expect(within(doc).getByText('Halvard Ride Inspection Services')).toBeTruthy();
    expect(within(doc).getByText('Tamsworth Pier Leisure')).toBeTruthy();
    expect(within(doc).getByText('Skylark')).toBeTruthy();
    expect(within(doc).getByText('PS12-0042')).toBeTruthy();
    expect(within(doc).getByText('Tamsworth Pier, Pier Approach, Tamsworth')).toBeTruthy();
    expect(within(doc).getByText('Periodic inspection')).toBeTruthy();
    expect(within(doc).getByText('Tomas Reyne (Reg. 4471)')).toBeTruthy();
    expect(within(doc).getByText('2 of 24 items failed')).toBeTruthy();
    expect(within(doc).getByLabelText('Out of service')).toBeTruthy();
    expect(within(doc).getByText('Main pivot pin below its wear limit')).toBeTruthy();
    expect(
      within(doc).getByText(/Required — The ride returns to service only after a re-inspection/),
    ).toBeTruthy();

    const issued = within(doc).getByLabelText('Findings as issued');
    const first = within(issued).getByLabelText('Finding 1 as issued');
    expect(within(first).getByLabelText(`Severity: ${severityInfo.fix_before_operation.label}`)).toBeTruthy();
    expect(within(first).getByText(/Replace the main pivot pin and bushing\.$/)).toBeTruthy();
    expect(within(first).getByText(/No due date$/)).toBeTruthy();
    expect(within(first).getByRole('button', { name: 'Open photo: Main pin, worn face' })).toBeTruthy();
    const second = within(issued).getByLabelText('Finding 2 as issued');
    expect(within(second).getByLabelText(`Severity: ${severityInfo.fix_by_date.label}`)).toBeTruthy();
    expect(within(second).getByText(/^DUE 20 Jun 2026$/)).toBeTruthy();

    // Results with their envelope marks; the load summary (folded on a phone, the toggle counting what is
    // over and near its limit); the note, the appeal and the full caution.
    expect(within(doc).queryByText('Main pivot pin diameter')).toBeNull();
    fireEvent.press(
      within(doc).getByRole('button', {
        name: 'Show the full results (2 values, 1 over limit, 1 near limit)',
      }),
    );
    expect(within(doc).getByText('Main pivot pin diameter')).toBeTruthy();
    expect(within(doc).getByLabelText('Over limit')).toBeTruthy();
    expect(within(doc).getByLabelText('Near limit')).toBeTruthy();
    expect(within(doc).getByText('112 %')).toBeTruthy();
    expect(within(doc).getByText('Main pivot')).toBeTruthy();
    expect(within(doc).getByText('Send photos of the new pin once fitted.')).toBeTruthy();
    expect(within(doc).getByText(documentAsIssued.appeal)).toBeTruthy();
    expect(within(doc).getByText(CAUTION_FULL)).toBeTruthy();

    // The findings as they stand now, each with its due date.
    const now = screen.getByLabelText('Findings now');
    expect(within(within(now).getByLabelText('Finding 2')).getByText(/^DUE 20 Jun 2026$/)).toBeTruthy();
    expect(within(within(now).getByLabelText('Finding 1')).getByText(/^DUE No due date$/)).toBeTruthy();
  });

  test('on a phone: status, what to do by when and Acknowledge come before the document and its results', async () => {
    const view = renderNotices(operator, `/notices/${NOTICE}`);
    const summary = await screen.findByLabelText('What this notice asks');
    expect(
      within(within(summary).getByLabelText('Operating status')).getByLabelText('Out of service'),
    ).toBeTruthy();
    expect(within(summary).getByText('Main pivot pin below its wear limit')).toBeTruthy();
    expect(
      within(summary).getByText(/^Re-inspection required — The ride returns to service only after/),
    ).toBeTruthy();
    // What to do: each finding's required action and when it is due; one that forbids operation without a
    // date is due before the ride carries riders again (the severity's rule, lib/vocabulary.ts).
    const toDo = within(summary).getByLabelText('What to do and by when');
    const first = within(toDo).getByLabelText('To do: finding 1');
    expect(within(first).getByText('Replace the main pivot pin and bushing.')).toBeTruthy();
    expect(within(first).getByText('Before the ride carries riders again')).toBeTruthy();
    expect(within(within(toDo).getByLabelText('To do: finding 2')).getByText('By 20 Jun 2026')).toBeTruthy();
    // The short safety caution stands in the summary; the document keeps the full one.
    expect(within(summary).getByText(CAUTION_SHORT)).toBeTruthy();

    // Order on the page (the tree's order is the phone's top-to-bottom order, one column).
    const order = [
      summary,
      screen.getByRole('button', { name: 'Acknowledge receipt' }),
      screen.getByLabelText('Findings now'),
      screen.getByLabelText('Notice PW-2026-0007 as issued'),
      screen.getByRole('button', { name: /^Show the full results/ }),
    ];
    const all = view.UNSAFE_root.findAll(() => true);
    const at = order.map((n) => all.indexOf(n));
    expect(at.every((i) => i >= 0)).toBe(true);
    expect([...at].sort((a, b) => a - b)).toEqual(at);
    // Folded: none of the results' rows are drawn until asked for.
    expect(screen.queryByText('Main pivot pin diameter')).toBeNull();
    expect(screen.getByRole('button', { name: /^Show the full results/, expanded: false })).toBeTruthy();
  });

  test('on a desktop the results are open, and the summary still leads', async () => {
    mockWide = true;
    const view = renderNotices(operator, `/notices/${NOTICE}`);
    const summary = await screen.findByLabelText('What this notice asks');
    expect(screen.getByText('Main pivot pin diameter')).toBeTruthy();
    expect(screen.getByRole('button', { name: 'Hide the full results' })).toBeTruthy();
    const all = view.UNSAFE_root.findAll(() => true);
    expect(all.indexOf(summary)).toBeLessThan(
      all.indexOf(screen.getByLabelText('Notice PW-2026-0007 as issued')),
    );
    expect(all.indexOf(screen.getByRole('button', { name: 'Acknowledge receipt' }))).toBeLessThan(
      all.indexOf(screen.getByLabelText('Notice PW-2026-0007 as issued')),
    );
  });

  test('never sees the inspection body’s controls', async () => {
    renderNotices(operator, `/notices/${NOTICE}`);
    expect(await screen.findByRole('button', { name: 'Acknowledge receipt' })).toBeTruthy();
    expect(screen.queryByText('Verify and close')).toBeNull();
    expect(screen.queryByText('Reopen')).toBeNull();
    expect(screen.queryByText('Send again')).toBeNull();
    expect(screen.queryByText('E-mail deliveries')).toBeNull();
  });

  test('acknowledges receipt: the POST is sent and the notice then says who and when', async () => {
    renderNotices(operator, `/notices/${NOTICE}`);
    fireEvent.press(await screen.findByRole('button', { name: 'Acknowledge receipt' }));
    expect(await screen.findByText(/^Acknowledged by Priya Castellan, 10 Jun 2026/)).toBeTruthy();
    await waitFor(() => expect(callsTo('POST', `/api/notices/${NOTICE}/acknowledge`)).toHaveLength(1));
    expect(screen.queryByRole('button', { name: 'Acknowledge receipt' })).toBeNull();
  });

  test('reports a corrective action: the photo goes up under its SHA-256, then the action names it', async () => {
    // The hash routine the form uses, against the FIPS 180-2 example (from memory).
    const { sha256 } = jest.requireActual('@noble/hashes/sha256');
    const { bytesToHex } = jest.requireActual('@noble/hashes/utils');
    expect(bytesToHex(sha256(new TextEncoder().encode('abc')))).toBe(
      'ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad',
    );
    const expectedSha = createHash('sha256').update(PHOTO_BYTES).digest('hex');

    renderNotices(operator, `/notices/${NOTICE}`);
    fireEvent.press(await screen.findByRole('button', { name: 'Report corrective action on finding 1' }));
    fireEvent.changeText(
      screen.getByLabelText('What was done'),
      'New main pin and bushing fitted by our fitter.',
    );
    fireEvent.press(screen.getByRole('button', { name: 'Choose from library' }));
    expect(await screen.findByText('✓ Uploaded')).toBeTruthy();
    fireEvent.press(screen.getByRole('button', { name: 'Send corrective action' }));

    const loop = screen.getByLabelText('Finding 1');
    expect(await within(loop).findByText('New main pin and bushing fitted by our fitter.')).toBeTruthy();
    await waitFor(() => expect(callsTo('POST', '/api/findings/f-1/actions')).toHaveLength(1));
    const put = callsTo('PUT', `/api/photos/${expectedSha}`);
    expect(put).toHaveLength(1);
    expect(put[0].headers['Content-Type']).toBe('image/jpeg');
    expect(put[0].headers.Authorization).toBe('Bearer token-of-tester');
    expect(Array.from(put[0].body as Uint8Array)).toEqual(Array.from(PHOTO_BYTES));
    // The upload came first; the action names the photo by the same hash.
    const order = server.calls.map((c) => `${c.method} ${c.path}`);
    expect(order.indexOf(`PUT /api/photos/${expectedSha}`)).toBeLessThan(
      order.indexOf('POST /api/findings/f-1/actions'),
    );
    expect(callsTo('POST', '/api/findings/f-1/actions')[0].body).toEqual({
      note: 'New main pin and bushing fitted by our fitter.',
      photoShas: [expectedSha],
    });
    expect(await within(loop).findByLabelText('State: Action reported')).toBeTruthy();
    expect(within(loop).getByRole('button', { name: 'Open photo: Evidence photo 1' })).toBeTruthy();
  });

  test('a corrective action needs a note; nothing is sent without one', async () => {
    renderNotices(operator, `/notices/${NOTICE}`);
    fireEvent.press(await screen.findByRole('button', { name: 'Report corrective action on finding 2' }));
    fireEvent.press(screen.getByRole('button', { name: 'Send corrective action' }));
    expect(await screen.findByText('Say what was done')).toBeTruthy();
    expect(server.calls.filter((c) => c.method !== 'GET')).toHaveLength(0);
  });

  test('another company’s notice (404) says so plainly', async () => {
    renderNotices(operator, '/notices/n-elsewhere');
    expect(await screen.findByText('This notice is not here for you.')).toBeTruthy();
    expect(screen.getByRole('link', { name: 'Go to the list of notices' })).toBeTruthy();
  });
});

describe('the inspection body', () => {
  test('staff see the acknowledgement state, the deliveries and (supervisors) Send again', async () => {
    renderNotices(supervisor, `/notices/${NOTICE}`);
    expect(await screen.findByText('Not yet acknowledged by the operator.')).toBeTruthy();
    expect(screen.queryByRole('button', { name: 'Acknowledge receipt' })).toBeNull();
    const deliveries = screen.getByLabelText('Deliveries');
    expect(within(deliveries).getByText('notices@tamsworth-pier.example')).toBeTruthy();
    expect(within(deliveries).getByText(/^2 attempts · sent 3 Jun 2026/)).toBeTruthy();
    fireEvent.press(screen.getByRole('button', { name: 'Send again' }));
    expect(
      await screen.findByText('Nothing to send: every notice address has already received it.'),
    ).toBeTruthy();
    expect(callsTo('POST', `/api/notices/${NOTICE}/resend`)).toHaveLength(1);
  });

  test('an inspector may verify findings but not send the e-mail again', async () => {
    renderNotices(inspector, `/notices/${NOTICE}`);
    expect(await screen.findByRole('button', { name: 'Verify and close finding 1' })).toBeTruthy();
    expect(screen.queryByRole('button', { name: 'Send again' })).toBeNull();
    expect(screen.queryByRole('button', { name: /^Report corrective action/ })).toBeNull();
  });

  test('verify and close: the note is required, the operator’s report counts as evidence, the ride stays stopped', async () => {
    server.rideStatus = 'out_of_service';
    server.notice = noticeNow({
      findings: [
        findingNow({
          id: 'f-1',
          state: 'action_reported',
          correctiveActions: [
            {
              id: 'ca-0',
              findingId: 'f-1',
              note: 'Pin and bushing replaced.',
              photoShas: [],
              reportedAt: '2026-06-08T10:00:00.000Z',
              reportedByName: 'Priya Castellan',
            },
          ],
        }),
        findingNow({ id: 'f-2' }),
      ],
    });
    renderNotices(supervisor, `/notices/${NOTICE}`);
    const loop = await screen.findByLabelText('Finding 1');
    expect(within(loop).getByText('Pin and bushing replaced.')).toBeTruthy();
    fireEvent.press(within(loop).getByRole('button', { name: 'Verify and close finding 1' }));
    fireEvent.press(screen.getByRole('button', { name: 'Close finding' }));
    expect(await within(loop).findByText('Say what you checked and found')).toBeTruthy();
    expect(callsTo('POST', '/api/findings/f-1/close')).toHaveLength(0);
    fireEvent.changeText(
      within(loop).getByLabelText('Verification note'),
      'New pin seen fitted and measured',
    );
    fireEvent.press(screen.getByRole('button', { name: 'Close finding' }));
    expect(await within(loop).findByText('RIDE STATUS NOW')).toBeTruthy();
    expect(within(loop).getByLabelText('Out of service')).toBeTruthy();
    expect(within(loop).queryByText(/Status notice/)).toBeNull();
    expect(await within(loop).findByLabelText('State: Closed')).toBeTruthy();
    expect(callsTo('POST', '/api/findings/f-1/close')[0].body).toEqual({
      note: 'New pin seen fitted and measured',
      evidenceRef: null,
      photoShas: [],
    });
    expect(await within(loop).findByText(/the operator’s corrective-action report \(1\)/)).toBeTruthy();
    // Closed: no more close, but it can be reopened.
    expect(within(loop).queryByRole('button', { name: 'Verify and close finding 1' })).toBeNull();
    expect(within(loop).getByRole('button', { name: 'Reopen finding 1' })).toBeTruthy();
  });

  test('verify and close without the operator’s report needs evidence: a reference or a photo taken at the check', async () => {
    const expectedSha = createHash('sha256').update(PHOTO_BYTES).digest('hex');
    server.notice = noticeNow({ findings: [findingNow({ id: 'f-1' }), findingNow({ id: 'f-2' })] });
    renderNotices(supervisor, `/notices/${NOTICE}`);
    const loop = await screen.findByLabelText('Finding 1');
    fireEvent.press(within(loop).getByRole('button', { name: 'Verify and close finding 1' }));
    fireEvent.changeText(within(loop).getByLabelText('Verification note'), 'Weld seen ground and re-tested');
    fireEvent.press(screen.getByRole('button', { name: 'Close finding' }));
    expect(
      await within(loop).findByText(
        'Add a photo or a document reference, or wait for the operator’s corrective-action report.',
      ),
    ).toBeTruthy();
    expect(callsTo('POST', '/api/findings/f-1/close')).toHaveLength(0);
    fireEvent.press(within(loop).getByRole('button', { name: 'Choose from library' }));
    expect(await within(loop).findByText('Photo 1: ✓ uploaded')).toBeTruthy();
    fireEvent.press(screen.getByRole('button', { name: 'Close finding' }));
    await waitFor(() => expect(callsTo('POST', '/api/findings/f-1/close')).toHaveLength(1));
    expect(callsTo('PUT', `/api/photos/${expectedSha}`)).toHaveLength(1);
    expect(callsTo('POST', '/api/findings/f-1/close')[0].body).toEqual({
      note: 'Weld seen ground and re-tested',
      evidenceRef: null,
      photoShas: [expectedSha],
    });
    expect(await within(loop).findByText(/EVIDENCE 1 photo$/)).toBeTruthy();
  });

  test('reopen needs a comment; with one, the finding is open again and says what is still wrong', async () => {
    server.notice = noticeNow({
      findings: [findingNow({ id: 'f-1', state: 'action_reported' }), findingNow({ id: 'f-2' })],
    });
    renderNotices(supervisor, `/notices/${NOTICE}`);
    const loop = await screen.findByLabelText('Finding 1');
    fireEvent.press(within(loop).getByRole('button', { name: 'Reopen finding 1' }));
    fireEvent.press(within(loop).getByRole('button', { name: 'Reopen finding' }));
    expect(await within(loop).findByText('Say why the finding is reopened')).toBeTruthy();
    expect(callsTo('POST', '/api/findings/f-1/reopen')).toHaveLength(0);

    fireEvent.changeText(
      within(loop).getByLabelText('What is still wrong'),
      'Photos show the old bushing still fitted.',
    );
    fireEvent.press(within(loop).getByRole('button', { name: 'Reopen finding' }));
    expect(await within(loop).findByText(/Photos show the old bushing still fitted\.$/)).toBeTruthy();
    expect(await within(loop).findByLabelText('State: Open')).toBeTruthy();
    expect(callsTo('POST', '/api/findings/f-1/reopen')[0].body).toEqual({
      note: 'Photos show the old bushing still fitted.',
    });
  });

  test('the desktop list shows the operator and the e-mail state, newest first as the server sends them', async () => {
    mockWide = true;
    renderNotices(supervisor, '/notices');
    const row = holderOf(await screen.findByRole('link', { name: 'Notice PW-2026-0007, Skylark' }));
    expect(within(row).getByText('Tamsworth Pier Leisure')).toBeTruthy();
    expect(within(row).getByText('Not acknowledged yet')).toBeTruthy();
    expect(within(row).getByText('Sent')).toBeTruthy();
    expect(screen.getByRole('combobox', { name: 'Operator: All operators' })).toBeTruthy();
    expect(screen.getByRole('combobox', { name: 'Ride: All rides' })).toBeTruthy();
  });
});
