/**
 * The operator's start page (/my-rides): notices awaiting acknowledgement first, then the findings still
 * open with their due dates (soonest first, past due marked), then the rides. The stand-in server answers
 * in the API's shapes (features/notices/schema.ts, features/rides/schema.ts). Companies, rides and people
 * are the invented demo scenario.
 */
import { Text } from 'react-native';
import { screen, within } from 'expo-router/testing-library';

import { CAUTION_FULL } from '@/components/caution';
import { makeQueryClient } from '@/features/api/query-client';
import type { SessionUser } from '@/features/session/schema';
import { OperatorHome } from '@/features/home/operator-home';
import {
  type NoticeDetail,
  type NoticeFinding,
  noticeDetailSchema,
  noticeListResponseSchema,
} from '@/features/notices/schema';
import { rideListResponseSchema } from '@/features/rides/schema';
import { holderOf, renderScreens, sessionClient } from '@/tests/support/app-screens';
import { notFound, ok, standInApi } from '@/tests/support/stand-in-api';

jest.mock('@/features/session/token-store', () => ({
  tokenStore: {
    get: async () => ({ token: 'token-of-priya', expiresAt: '2099-01-01T00:00:00.000Z', user: null }),
    set: async () => {},
    clear: async () => {},
  },
}));
jest.mock('@/components/use-wide', () => ({ useWide: () => false }));

const operator: SessionUser = {
  id: 'u-op',
  email: 'operator@pivotwatch.test',
  name: 'Priya Castellan',
  role: 'operator',
  companyId: 'co-tpl',
  companyName: 'Tamsworth Pier Leisure',
};

function finding(id: string, number: number, over: Partial<NoticeFinding>): NoticeFinding {
  return {
    id,
    inspectionId: 'insp-1',
    rideId: 'ride-sky',
    number,
    severity: 'fix_by_date',
    description: `Finding ${id}`,
    ruleRef: null,
    requiredAction: `Put right ${id}`,
    dueOn: null,
    photoShas: [],
    state: 'open',
    createdAt: '2026-05-01T09:00:00.000Z',
    createdByName: 'Mira Delacourt',
    updatedAt: '2026-05-01T09:00:00.000Z',
    updatedByName: 'Mira Delacourt',
    closedAt: null,
    closedByName: null,
    stateNote: null,
    correctiveActions: [],
    ...over,
  };
}

function notice(id: string, reference: string, rideName: string, findings: NoticeFinding[], ack: boolean) {
  const detail: NoticeDetail = {
    id,
    reference,
    kind: 'inspection',
    inspectionId: 'insp-1',
    rideId: 'ride-sky',
    rideName,
    operatorId: 'co-tpl',
    operatorName: 'Tamsworth Pier Leisure',
    issuedAt: '2026-06-03T09:30:00.000Z',
    issuedByName: 'Mira Delacourt',
    acknowledgedAt: ack ? '2026-06-04T08:00:00.000Z' : null,
    acknowledgedByName: ack ? 'Priya Castellan' : null,
    delivery: { state: 'sent', total: 1, sent: 1, failed: 0 },
    openFindings: findings.filter((f) => f.state !== 'closed').length,
    findingsTotal: findings.length,
    document: {
      reference,
      kind: 'inspection',
      issuedAt: '2026-06-03T09:30:00.000Z',
      issuer: { name: 'Halvard Ride Inspection Services', address: null, phone: null },
      operator: { id: 'co-tpl', name: 'Tamsworth Pier Leisure', address: null },
      ride: {
        id: 'ride-sky',
        name: rideName,
        rideClass: 'Pendulum swing',
        maker: null,
        model: null,
        serial: null,
        year: null,
      },
      site: null,
      inspection: null,
      results: [],
      loadSummary: [],
      checklist: null,
      findings: [],
      operatingStatus: { status: 'in_service', reason: null },
      reinspection: { required: false, reason: null },
      note: null,
      appeal: 'Write to us within 14 days.',
      caution: CAUTION_FULL,
      signature: { name: 'Mira Delacourt', role: 'Supervisor', signedAt: '2026-06-03T09:30:00.000Z' },
      url: `https://pivotwatch.example.test/notices/${id}`,
    },
    deliveries: [],
    findings,
  };
  return detail;
}

// The newer notice is not yet acknowledged; the older one is, and has a finding past its due date.
const newer = notice(
  'n-7',
  'PW-2026-0007',
  'Skylark',
  [
    finding('f-1', 1, { severity: 'fix_before_operation', dueOn: null }),
    finding('f-2', 2, { dueOn: '2026-06-20' }),
    finding('f-3', 3, { state: 'closed', dueOn: '2026-06-01' }),
  ],
  false,
);
const older = notice(
  'n-5',
  'PW-2026-0005',
  'Tidebreaker',
  [finding('f-9', 4, { dueOn: '2026-06-05', state: 'action_reported' })],
  true,
);
const { document: _d, deliveries: _s, findings: _f, ...newerHead } = newer;
const { document: _d2, deliveries: _s2, findings: _f2, ...olderHead } = older;
const list = { notices: [newerHead, olderHead], total: 2, page: 1, pageSize: 100 };
const rides = {
  rides: [
    {
      id: 'ride-sky',
      name: 'Skylark',
      rideClass: 'pendulum_swing',
      description: null,
      maker: null,
      model: null,
      serial: null,
      year: null,
      status: 'out_of_service',
      statusReason: 'Main pivot pin below its wear limit',
      statusSince: '2026-06-03T09:30:00.000Z',
      siteId: null,
      siteName: null,
      operatorCompanyId: 'co-tpl',
      operatorName: 'Tamsworth Pier Leisure',
    },
  ],
};

let client: ReturnType<typeof makeQueryClient> | undefined;
beforeEach(() => {
  standInApi(
    {
      '/api/notices': () => ok(list),
      '/api/notices/n-7': () => ok({ notice: newer }),
      '/api/notices/n-5': () => ok({ notice: older }),
      '/api/rides': () => ok(rides),
    },
    notFound('No route'),
  );
});
afterEach(() => {
  client?.clear();
  jest.useRealTimers();
  jest.restoreAllMocks();
});

function renderHome() {
  const queries = sessionClient(operator);
  client = queries;
  jest.useFakeTimers({ now: new Date('2026-06-10T08:00:00.000Z') });
  return renderScreens(
    queries,
    { 'my-rides': OperatorHome, 'notices/[id]': () => <Text>One notice</Text> },
    '/my-rides',
  );
}

test('the fixtures are in the API’s shapes', () => {
  expect(() => noticeListResponseSchema.parse(list)).not.toThrow();
  expect(() => noticeDetailSchema.parse(newer)).not.toThrow();
  expect(() => rideListResponseSchema.parse(rides)).not.toThrow();
});

test('notices awaiting acknowledgement come first, then open findings soonest due, then the rides and the incident links', async () => {
  renderHome();
  const awaiting = holderOf(
    await screen.findByRole('link', { name: 'Notice PW-2026-0007, Skylark: awaiting your acknowledgement' }),
  );
  expect(within(awaiting).getByText('Read and acknowledge ›')).toBeTruthy();
  // The acknowledged notice is not asked about again.
  expect(screen.queryByRole('link', { name: /PW-2026-0005, Tidebreaker: awaiting/ })).toBeNull();

  const open = await screen.findByLabelText('Open findings');
  const rows = within(open).getAllByRole('link');
  // Soonest first; the closed finding is left out; no due date goes last.
  expect(rows.map((r) => r.props.accessibilityLabel)).toEqual([
    'Tidebreaker, finding 4: due 5 Jun 2026, past due',
    'Skylark, finding 2: due 20 Jun 2026',
    'Skylark, finding 1: no due date',
  ]);
  expect(within(holderOf(rows[0])).getByText('PAST DUE')).toBeTruthy();
  expect(within(holderOf(rows[0])).getByText('On notice PW-2026-0005')).toBeTruthy();

  const titles = screen.getAllByRole('header').map((h) => h.props.children);
  expect(titles).toEqual([
    'My rides',
    'NOTICES AWAITING YOUR ACKNOWLEDGEMENT (1)',
    'OPEN FINDINGS (3)',
    'RIDES AND THEIR STATUS',
    'REPORT AN INCIDENT',
  ]);
  // Each ride has its link to the incident report form (features/rides/hrefs.ts).
  const report = await screen.findByLabelText('Report an incident on a ride');
  expect(within(report).getAllByRole('link').length).toBeGreaterThan(0);
});
