/**
 * The decision panel beside an inspection, against a stand-in server that answers in the API's shapes
 * (features/review/schema.ts: findingInputSchema, findingResponseSchema, decisionInputSchema,
 * decisionResponseSchema; features/notices/schema.ts: noticeListResponseSchema; errors as
 * features/api/errors.ts). What is checked is the contract: what the panel sends, what it shows at once
 * (optimistic), what it shows after the server's answer, that a refusal rolls back and is explained, and
 * after approval the notice it issued and where each finding stands. Names and rides are the invented
 * demo scenario.
 */
import { type QueryClient, QueryClientProvider, useQuery } from '@tanstack/react-query';
import { act, fireEvent, render, screen, waitFor, within } from '@testing-library/react-native';

import { apiFetch } from '@/features/api/client';
import { authKeys } from '@/features/auth/api';
import { makeQueryClient } from '@/features/api/query-client';
import {
  type NoticeListItem,
  noticeListResponseSchema,
  noticeListQuerySchema,
} from '@/features/notices/schema';
import { rideDetailResponseSchema } from '@/features/registry/schema';
import { approvalConcerns, DecisionPanel } from '@/features/review/decision-panel';
import { reviewKeys } from '@/features/review/keys';
import { decisionInputSchema, decisionResponseSchema } from '@/features/review/schema';
import { type Finding, findingInputSchema, findingPatchSchema } from '@/features/notices/finding-schema';
import { type StandInCall, type StandInReply, standInApi } from '@/tests/support/stand-in-api';
import { pickDate } from '@/tests/support/pick-date';

jest.mock('@/features/session/token-store', () => ({
  tokenStore: { get: async () => null, set: async () => {}, clear: async () => {} },
}));

const INSPECTION = 'insp-7';
const PIN_PHOTO = 'a'.repeat(64);
const BUSHING_PHOTO = 'b'.repeat(64);
const photos = [
  { sha256: PIN_PHOTO, caption: 'Main pivot pin, drive side' },
  { sha256: BUSHING_PHOTO, caption: 'Lower bushing' },
];

type Detail = {
  inspection: {
    id: string;
    reviewState: 'submitted' | 'approved' | 'returned';
    reviewNote: string | null;
    reviewedAt: string | null;
    reviewedByName: string | null;
    rideStatus: 'in_service' | 'restricted' | 'out_of_service';
    rideStatusReason: string | null;
    approvalRefusal?: string | null;
  };
};

type Call = StandInCall;
type Reply = StandInReply;

/** The stand-in server: its own state, every request recorded, and routes a test may take over. */
let server: {
  detail: Detail;
  findings: Finding[];
  /** Every notice of every ride the stand-in knows (the list filters by rideId as the server does). */
  notices: NoticeListItem[];
  calls: Call[];
  override: (call: Call) => Promise<Reply | undefined> | Reply | undefined;
};

function finding(over: Partial<Finding>): Finding {
  return {
    id: 'f-1',
    inspectionId: INSPECTION,
    rideId: 'ride-3',
    number: 1,
    severity: 'note',
    description: 'Paint flaking on the arm',
    ruleRef: null,
    requiredAction: null,
    dueOn: null,
    photoShas: [],
    state: 'open',
    createdAt: '2026-06-02T09:00:00.000Z',
    createdByName: 'Mara Quill',
    updatedAt: '2026-06-02T09:00:00.000Z',
    updatedByName: 'Mara Quill',
    closedAt: null,
    closedByName: null,
    stateNote: null,
    ...over,
  };
}

function route(call: Call): Reply {
  const { method, path } = call;
  if (method === 'GET' && path === `/api/inspections/${INSPECTION}`)
    return { status: 200, body: server.detail };
  if (method === 'GET' && path === `/api/inspections/${INSPECTION}/findings`)
    return { status: 200, body: { findings: server.findings } };
  if (method === 'GET' && path === '/api/notices') {
    // The server's own query schema reads the query string (it has no inspection filter).
    const q = noticeListQuerySchema.parse(Object.fromEntries(call.search));
    const notices = server.notices.filter((n) => !q.rideId || n.rideId === q.rideId);
    return { status: 200, body: { notices, total: notices.length, page: q.page, pageSize: q.pageSize } };
  }
  if (method === 'GET' && path === '/api/rides/ride-3') return { status: 200, body: gullWing };
  return { status: 404, body: { error: { code: 'not_found', message: `No route ${method} ${path}` } } };
}

const gullWing = rideDetailResponseSchema.parse({
  ride: {
    id: 'ride-3',
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
    siteId: null,
    siteName: null,
    operatorCompanyId: 'op-1',
    operatorName: 'Tamsworth Pier Leisure',
  },
  design: null,
});

function notice(over: Partial<NoticeListItem>): NoticeListItem {
  return {
    id: 'n-1',
    reference: 'PW-2026-0007',
    kind: 'inspection',
    inspectionId: INSPECTION,
    rideId: 'ride-3',
    rideName: 'Gull Wing',
    operatorId: 'op-1',
    operatorName: 'Tamsworth Pier Leisure',
    issuedAt: '2026-06-02T11:00:00.000Z',
    issuedByName: 'Mara Quill',
    acknowledgedAt: null,
    acknowledgedByName: null,
    delivery: { state: 'sent', total: 1, sent: 1, failed: 0 },
    openFindings: 1,
    findingsTotal: 1,
    ...over,
  };
}

beforeEach(() => {
  server = {
    detail: {
      inspection: {
        id: INSPECTION,
        reviewState: 'submitted',
        reviewNote: null,
        reviewedAt: null,
        reviewedByName: null,
        rideStatus: 'in_service',
        rideStatusReason: null,
      },
    },
    findings: [],
    notices: [],
    calls: [],
    override: () => undefined,
  };
  server.calls = standInApi(async (call) => (await server.override(call)) ?? route(call)).calls;
});

let clients: QueryClient[] = [];
function newClient() {
  const client = makeQueryClient();
  // Signed in as the demo supervisor: the status control offers what the status rules allow that role.
  client.setQueryData(authKeys.session(), {
    user: {
      id: 'user-sup',
      email: 'supervisor@pivotwatch.test',
      name: 'Mara Quill',
      role: 'supervisor',
      companyId: null,
      companyName: null,
    },
    offline: false,
  });
  clients.push(client);
  return client;
}

afterEach(() => {
  // Cached queries keep garbage-collection timers; clearing them lets jest exit.
  for (const c of clients) c.clear();
  clients = [];
  jest.restoreAllMocks();
});

const callsTo = (method: string, path: string) =>
  server.calls.filter((c) => c.method === method && c.path === path);

/** The inspection screen as far as the panel needs it: the detail under its key, the panel fed from it. */
function Desk() {
  const detail = useQuery({
    queryKey: reviewKeys.inspection(INSPECTION),
    queryFn: () => apiFetch<Detail>(`/api/inspections/${INSPECTION}`),
  });
  if (!detail.data) return null;
  const i = detail.data.inspection;
  return (
    <DecisionPanel
      inspectionId={INSPECTION}
      rideId="ride-3"
      rideName="Gull Wing"
      rideStatus={i.rideStatus}
      rideStatusReason={i.rideStatusReason}
      reviewState={i.reviewState}
      reviewNote={i.reviewNote}
      photos={photos}
      approvalRefusal={i.approvalRefusal}
    />
  );
}

async function renderDesk() {
  const client = newClient();
  render(
    <QueryClientProvider client={client}>
      <Desk />
    </QueryClientProvider>,
  );
  await screen.findByText(/No findings recorded/);
  return client;
}

function deferred() {
  let release: () => void = () => {};
  const done = new Promise<void>((resolve) => (release = resolve));
  return { done, release };
}

async function fillNewFinding() {
  fireEvent.press(screen.getByRole('button', { name: 'Add finding' }));
  fireEvent.press(screen.getByRole('radio', { name: 'Fix by date' }));
  fireEvent.changeText(screen.getByLabelText('What was found'), '  Pin worn past its first wear mark ');
  fireEvent.changeText(screen.getByLabelText("Rule or maker's instruction breached"), 'Maker bulletin 12');
  fireEvent.changeText(screen.getByLabelText('Required action'), 'Replace the pin and both bushings');
  pickDate('Due date', '2026-07-15');
  fireEvent.press(
    screen.getByRole('checkbox', { name: /^Refers to: Photo \d+ — Main pivot pin, drive side/ }),
  );
}

describe('findings', () => {
  test('a new finding shows at once, marked as saving, and stays after the server’s 201', async () => {
    await renderDesk();
    const gate = deferred();
    server.override = async (call) => {
      if (call.method !== 'POST') return undefined;
      await gate.done;
      const created = finding({
        id: 'f-9',
        number: 1,
        severity: 'fix_by_date',
        description: 'Pin worn past its first wear mark',
        ruleRef: 'Maker bulletin 12',
        requiredAction: 'Replace the pin and both bushings',
        dueOn: '2026-07-15',
        photoShas: [PIN_PHOTO],
        updatedAt: '2026-06-02T10:00:00.000Z',
      });
      server.findings = [created];
      return { status: 201, body: { finding: created } };
    };
    await fillNewFinding();
    fireEvent.press(screen.getByRole('button', { name: 'Add finding' }));

    // Before the server answers: the row is there, saying it is being saved.
    const row = await screen.findByLabelText('Finding 1');
    expect(within(row).getByText('Pin worn past its first wear mark')).toBeTruthy();
    expect(within(row).getByText('Saving…')).toBeTruthy();
    expect(within(row).getByLabelText('Severity: Fix by date')).toBeTruthy();

    // The body is what the API's own schema makes of the form (trimmed, photos by SHA-256).
    const posts = callsTo('POST', `/api/inspections/${INSPECTION}/findings`);
    expect(posts).toHaveLength(1);
    expect(posts[0].body).toEqual(
      findingInputSchema.parse({
        severity: 'fix_by_date',
        description: 'Pin worn past its first wear mark',
        ruleRef: 'Maker bulletin 12',
        requiredAction: 'Replace the pin and both bushings',
        dueOn: '2026-07-15',
        photoShas: [PIN_PHOTO],
      }),
    );

    await act(async () => gate.release());
    await waitFor(() => expect(screen.queryByText('Saving…') === null).toBe(true));
    const saved = screen.getByLabelText('Finding 1');
    expect(within(saved).getByText('Pin worn past its first wear mark')).toBeTruthy();
    expect(within(saved).getByText(/Main pivot pin, drive side/)).toBeTruthy();
    expect(within(saved).getByRole('button', { name: 'Edit finding 1' })).toBeTruthy();
    // The form closed, and the list and the inspection's detail were fetched again.
    expect(screen.queryByLabelText('What was found')).toBeNull();
    await waitFor(() => expect(callsTo('GET', `/api/inspections/${INSPECTION}/findings`)).toHaveLength(2));
    expect(callsTo('GET', `/api/inspections/${INSPECTION}`).length).toBeGreaterThanOrEqual(2);
  });

  test('a 400 takes the new finding back out and shows the problem on its field', async () => {
    await renderDesk();
    const gate = deferred();
    server.override = async (call) => {
      if (call.method !== 'POST') return undefined;
      await gate.done;
      return {
        status: 400,
        body: {
          error: {
            code: 'validation_failed',
            message: 'Some fields are missing or invalid.',
            issues: [{ path: 'dueOn', message: 'The due date is before the inspection' }],
          },
        },
      };
    };
    await fillNewFinding();
    fireEvent.press(screen.getByRole('button', { name: 'Add finding' }));
    expect(await screen.findByLabelText('Finding 1')).toBeTruthy();

    await act(async () => gate.release());
    expect(await screen.findByText('The due date is before the inspection')).toBeTruthy();
    expect(screen.queryByLabelText('Finding 1')).toBeNull();
    expect(screen.getByText('Nothing was saved. Look at the fields marked below.')).toBeTruthy();
    // What was typed is still in the form.
    expect(screen.getByLabelText('What was found').props.value).toBe('  Pin worn past its first wear mark ');
  });

  test('the form refuses what the schema refuses and sends nothing', async () => {
    await renderDesk();
    fireEvent.press(screen.getByRole('button', { name: 'Add finding' }));
    fireEvent.press(screen.getByRole('radio', { name: 'Fix by date' }));
    fireEvent.press(screen.getByRole('button', { name: 'Add finding' }));
    // Messages of findingInputSchema / findingProblems.
    expect(await screen.findByText('Say what was found')).toBeTruthy();
    expect(screen.getByText('Say what must be done')).toBeTruthy();
    expect(screen.getByText('A fix-by-date finding needs a due date')).toBeTruthy();
    expect(callsTo('POST', `/api/inspections/${INSPECTION}/findings`)).toHaveLength(0);
  });

  test('an edit sends the version it started from; a 409 says so and fetches the list again', async () => {
    server.findings = [finding({ id: 'f-1', updatedAt: '2026-06-02T09:00:00.000Z' })];
    const client = newClient();
    render(
      <QueryClientProvider client={client}>
        <Desk />
      </QueryClientProvider>,
    );
    fireEvent.press(await screen.findByRole('button', { name: 'Edit finding 1' }));
    server.override = (call) => {
      if (call.method !== 'PATCH') return undefined;
      server.findings = [finding({ description: 'Changed by Tobin', updatedAt: '2026-06-02T09:30:00.000Z' })];
      return {
        status: 409,
        body: { error: { code: 'conflict', message: 'The finding was changed by someone else.' } },
      };
    };
    fireEvent.changeText(screen.getByLabelText('What was found'), 'Paint flaking on the lower arm');
    fireEvent.press(screen.getByRole('button', { name: 'Save finding' }));

    expect(await screen.findByText(/Someone else changed this finding/)).toBeTruthy();
    const patch = callsTo('PATCH', '/api/findings/f-1')[0].body;
    expect(findingPatchSchema.safeParse(patch).success).toBe(true);
    expect(patch).toMatchObject({
      description: 'Paint flaking on the lower arm',
      expectedUpdatedAt: '2026-06-02T09:00:00.000Z',
    });
    await waitFor(() => expect(callsTo('GET', `/api/inspections/${INSPECTION}/findings`)).toHaveLength(2));
    fireEvent.press(screen.getByRole('button', { name: 'Cancel' }));
    expect(await screen.findByText('Changed by Tobin')).toBeTruthy();
  });
});

test('a refused delete puts the finding back and says why', async () => {
  server.findings = [finding({})];
  await renderDeskWithFindings();
  const gate = deferred();
  server.override = async (call) => {
    if (call.method !== 'DELETE') return undefined;
    await gate.done;
    return {
      status: 403,
      body: { error: { code: 'forbidden', message: 'Only supervisors delete findings.' } },
    };
  };
  fireEvent.press(screen.getByRole('button', { name: 'Delete finding 1' }));
  fireEvent.press(screen.getByRole('button', { name: 'Confirm deleting finding 1' }));
  // Gone at once… (a boolean, not the element: printing a found element on each failed poll takes seconds)
  await waitFor(() => expect(screen.queryByLabelText('Finding 1') === null).toBe(true));
  expect(callsTo('DELETE', '/api/findings/f-1')).toHaveLength(1);
  // …and back, with the server's reason, when it refuses.
  await act(async () => gate.release());
  expect(
    await screen.findByText('Finding 1 was not deleted. Only supervisors delete findings.'),
  ).toBeTruthy();
  expect(screen.getByLabelText('Finding 1')).toBeTruthy();
});

describe('the decision', () => {
  test('returning without a comment is refused here and nothing is sent', async () => {
    await renderDesk();
    fireEvent.press(screen.getByRole('button', { name: 'Return to inspector' }));
    // The message of decisionInputSchema for a return without a note.
    expect(await screen.findByText('Tell the inspector what to correct')).toBeTruthy();
    expect(callsTo('POST', `/api/inspections/${INSPECTION}/decision`)).toHaveLength(0);
  });

  test('returning with a comment sends it; the panel shows the comment for the inspector', async () => {
    await renderDesk();
    server.override = (call) => {
      if (call.path !== `/api/inspections/${INSPECTION}/decision`) return undefined;
      const d = decisionInputSchema.parse(call.body);
      const decided = {
        reviewState: 'returned' as const,
        reviewNote: d.note,
        reviewedAt: '2026-06-02T11:00:00.000Z',
        reviewedByName: 'Mara Quill',
      };
      server.detail = { inspection: { ...server.detail.inspection, ...decided } };
      return { status: 200, body: { inspectionId: INSPECTION, ...decided } };
    };
    fireEvent.changeText(
      screen.getByLabelText('Comment'),
      'Measure the drive-side pin again with a micrometer.',
    );
    fireEvent.press(screen.getByRole('button', { name: 'Return to inspector' }));
    expect(await screen.findByText(/Returned to the inspector by Mara Quill/)).toBeTruthy();
    expect(screen.getByText(/Measure the drive-side pin again with a micrometer\./)).toBeTruthy();
    expect(callsTo('POST', `/api/inspections/${INSPECTION}/decision`)[0].body).toEqual({
      decision: 'return',
      note: 'Measure the drive-side pin again with a micrometer.',
    });
  });

  test('approve sends { decision: "approve" } and then shows the decision read-only', async () => {
    server.findings = [finding({})];
    await renderDeskWithFindings();
    server.override = (call) => {
      if (call.path !== `/api/inspections/${INSPECTION}/decision`) return undefined;
      const decided = {
        reviewState: 'approved' as const,
        reviewNote: null,
        reviewedAt: '2026-06-02T11:00:00.000Z',
        reviewedByName: 'Mara Quill',
      };
      server.detail = { inspection: { ...server.detail.inspection, ...decided } };
      return { status: 200, body: { inspectionId: INSPECTION, ...decided } };
    };
    fireEvent.press(screen.getByRole('button', { name: 'Approve inspection' }));
    expect(await screen.findByText(/Approved by Mara Quill/)).toBeTruthy();
    expect(callsTo('POST', `/api/inspections/${INSPECTION}/decision`).map((c) => c.body)).toEqual([
      { decision: 'approve' },
    ]);
    // Read-only: no decision buttons, no adding, editing or deleting findings.
    expect(screen.queryByRole('button', { name: 'Approve inspection' })).toBeNull();
    expect(screen.queryByRole('button', { name: 'Add finding' })).toBeNull();
    expect(screen.queryByRole('button', { name: 'Edit finding 1' })).toBeNull();
    expect(screen.queryByRole('button', { name: 'Delete finding 1' })).toBeNull();
    // The answer named no notice and the ride has none: the panel says so once the list is in.
    expect(await screen.findByText('No notice has been issued for this inspection.')).toBeTruthy();
  });

  test('a 409 on approve shows the server’s message and fetches the inspection again', async () => {
    await renderDesk();
    const detailGets = () => callsTo('GET', `/api/inspections/${INSPECTION}`).length;
    const before = detailGets();
    server.override = (call) => {
      if (call.path !== `/api/inspections/${INSPECTION}/decision`) return undefined;
      // Someone decided first.
      server.detail = {
        inspection: {
          ...server.detail.inspection,
          reviewState: 'returned',
          reviewNote: 'Photos of the lower bushing are missing.',
          reviewedAt: '2026-06-02T10:55:00.000Z',
          reviewedByName: 'Ilse Varga',
        },
      };
      return {
        status: 409,
        body: { error: { code: 'already_decided', message: 'This inspection has already been returned.' } },
      };
    };
    fireEvent.press(screen.getByRole('button', { name: 'Approve inspection' }));
    expect(await screen.findByText(/This inspection has already been returned\./)).toBeTruthy();
    await waitFor(() => expect(detailGets()).toBeGreaterThan(before));
    expect(await screen.findByText(/Returned to the inspector by Ilse Varga/)).toBeTruthy();
    expect(screen.getByText(/Photos of the lower bushing are missing\./)).toBeTruthy();
  });

  test('approving with a stop-now finding while the ride runs stops it in the same decision: one request', async () => {
    server.findings = [finding({ severity: 'stop_now', requiredAction: 'Lock out and call the engineer' })];
    await renderDeskWithFindings();
    server.override = (call) =>
      call.path === `/api/inspections/${INSPECTION}/decision`
        ? {
            status: 200,
            body: {
              inspectionId: INSPECTION,
              reviewState: 'approved',
              reviewNote: null,
              reviewedAt: '2026-06-02T11:00:00.000Z',
              reviewedByName: 'Mara Quill',
              ride: { status: 'out_of_service', statusReason: 'Main pin cracked', changed: true },
            },
          }
        : undefined;
    fireEvent.press(screen.getByRole('button', { name: 'Approve inspection' }));
    expect(await screen.findByText(/Stop the ride with this approval/)).toBeTruthy();
    // A finding that forbids operation cannot be approved on a running ride: no "approve anyway".
    expect(screen.queryByRole('button', { name: 'Approve anyway' })).toBeNull();
    expect(callsTo('POST', `/api/inspections/${INSPECTION}/decision`)).toHaveLength(0);
    fireEvent.press(screen.getByRole('button', { name: 'Set out of service with this decision' }));
    fireEvent.press(screen.getByRole('button', { name: 'Approve inspection' }));
    expect(await screen.findByText('Say why; the operator reads it with the status.')).toBeTruthy();
    expect(callsTo('POST', `/api/inspections/${INSPECTION}/decision`)).toHaveLength(0);
    fireEvent.changeText(screen.getByLabelText('Reason for the status'), 'Main pin cracked');
    fireEvent.press(screen.getByRole('button', { name: 'Approve inspection' }));
    await waitFor(() => expect(callsTo('POST', `/api/inspections/${INSPECTION}/decision`)).toHaveLength(1));
    expect(callsTo('POST', `/api/inspections/${INSPECTION}/decision`)[0].body).toEqual({
      decision: 'approve',
      rideStatus: { status: 'out_of_service', reason: 'Main pin cracked' },
    });
    // No separate status request: the stop is part of the decision.
    expect(callsTo('POST', '/api/rides/ride-3/status')).toHaveLength(0);
  });

  test('values over or near their limits count in the approve warning, not only findings', () => {
    const envelope = [
      { id: 'a', label: 'Pin diameter, main pivot', status: 'over' as const },
      { id: 'b', label: 'Bushing clearance, main pivot', status: 'near' as const },
      { id: 'c', label: 'Peak force, main pivot', status: 'within' as const },
    ];
    const c = approvalConcerns([], envelope);
    expect(c.blocking).toEqual([]);
    expect(c.over.map((e) => e.id)).toEqual(['a']);
    expect(c.near.map((e) => e.id)).toEqual(['b']);
  });
});

describe('the ride status', () => {
  test('a stopped ride: the supervisor is offered the override, with its reason, and nothing else back to service', async () => {
    server.detail.inspection.rideStatus = 'out_of_service';
    server.detail.inspection.rideStatusReason = 'Main pin cracked';
    await renderDesk();
    expect(screen.getByText(/Returns to service when its follow-up inspection is approved/)).toBeTruthy();
    // The decision may not ease the stop: only "keep" is offered there.
    expect(screen.queryByRole('radio', { name: 'Set restricted' })).toBeNull();
    fireEvent.press(screen.getByRole('radio', { name: 'In service (override)' }));
    expect(screen.getByLabelText('Reason for the override')).toBeTruthy();
    expect(screen.getByRole('button', { name: 'Override and notify' })).toBeTruthy();
    fireEvent.changeText(
      screen.getByLabelText('Reason for the override'),
      'Maker’s engineer signed the pin off on site (report CE-31).',
    );
    server.override = (call) =>
      call.method === 'POST' && call.path === '/api/rides/ride-3/status'
        ? {
            status: 200,
            body: {
              ride: { id: 'ride-3', status: 'in_service', statusReason: null },
              notice: { id: 'n-10', reference: 'PW-2026-0010' },
            },
          }
        : undefined;
    fireEvent.press(screen.getByRole('button', { name: 'Override and notify' }));
    await waitFor(() => expect(callsTo('POST', '/api/rides/ride-3/status')).toHaveLength(1));
    expect(callsTo('POST', '/api/rides/ride-3/status')[0].body).toEqual({
      status: 'in_service',
      reason: 'Maker’s engineer signed the pin off on site (report CE-31).',
    });
  });

  test('a stop on its own needs a reason and goes through the status rules’ endpoint', async () => {
    await renderDesk();
    server.override = (call) =>
      call.method === 'POST' && call.path === '/api/rides/ride-3/status'
        ? {
            status: 200,
            body: {
              ride: { id: 'ride-3', status: 'out_of_service', statusReason: 'Main pin worn' },
              notice: { id: 'n-9', reference: 'PW-2026-0009' },
            },
          }
        : undefined;
    // A running ride: a supervisor may stop or restrict it; there is nothing to override.
    expect(screen.queryByRole('radio', { name: /override/ })).toBeNull();
    // The ride status card's choice (the decision form offers its own "Set out of service").
    const choices = screen.getAllByRole('radio', { name: 'Out of service' });
    fireEvent.press(choices[choices.length - 1]);
    fireEvent.press(screen.getByRole('button', { name: 'Save ride status' }));
    expect(await screen.findByText('Say why; the operator reads it.')).toBeTruthy();
    expect(callsTo('POST', '/api/rides/ride-3/status')).toHaveLength(0);
    fireEvent.changeText(screen.getByLabelText('Reason'), ' Main pin worn ');
    fireEvent.press(screen.getByRole('button', { name: 'Save ride status' }));
    expect(
      await screen.findByText('Saved: Gull Wing is now out of service; the operator is sent a notice.'),
    ).toBeTruthy();
    expect(callsTo('POST', '/api/rides/ride-3/status')[0].body).toEqual({
      status: 'out_of_service',
      reason: 'Main pin worn',
    });
  });
});

async function renderDeskWithFindings() {
  const client = newClient();
  render(
    <QueryClientProvider client={client}>
      <Desk />
    </QueryClientProvider>,
  );
  await screen.findByLabelText('Finding 1');
  return client;
}

describe('after approval: the notice and the corrective-action loop', () => {
  const approvedAt = '2026-06-02T11:00:00.000Z';
  const approve = (issued: { id: string; reference: string } | null, listed: NoticeListItem[]) => {
    server.override = (call) => {
      if (call.path !== `/api/inspections/${INSPECTION}/decision`) return undefined;
      const decided = {
        reviewState: 'approved' as const,
        reviewNote: null,
        reviewedAt: approvedAt,
        reviewedByName: 'Mara Quill',
      };
      server.detail = { inspection: { ...server.detail.inspection, ...decided } };
      server.notices = listed;
      // The answer is what the API's schema accepts, notice included.
      return {
        status: 200,
        body: decisionResponseSchema.parse({ inspectionId: INSPECTION, notice: issued, ...decided }),
      };
    };
  };
  const startApproved = () => {
    server.detail = {
      inspection: {
        ...server.detail.inspection,
        reviewState: 'approved',
        reviewedAt: approvedAt,
        reviewedByName: 'Mara Quill',
      },
    };
  };
  const decisionIndex = () =>
    server.calls.findIndex(
      (c) => c.method === 'POST' && c.path === `/api/inspections/${INSPECTION}/decision`,
    );

  test('approving with findings names the notice issued to the ride’s operator and links to it', async () => {
    server.findings = [
      finding({ severity: 'fix_by_date', requiredAction: 'Replace the pin', dueOn: '2026-07-15' }),
    ];
    await renderDeskWithFindings();
    approve({ id: 'n-1', reference: 'PW-2026-0007' }, [notice({})]);
    fireEvent.press(screen.getByRole('button', { name: 'Approve inspection' }));

    expect(await screen.findByText('Notice PW-2026-0007 issued to Tamsworth Pier Leisure')).toBeTruthy();
    expect(screen.getByRole('link', { name: 'Notice PW-2026-0007' }).props.href).toBe('/notices/n-1');
    // Where its e-mail stands and whether the operator has acknowledged it, from the list item.
    expect(screen.getByLabelText('E-mail: Sent')).toBeTruthy();
    expect(screen.getByText(/Not acknowledged yet/)).toBeTruthy();
    // The ride's notices were asked for again after the decision (the list has no inspection filter).
    await waitFor(() =>
      expect(
        server.calls.some(
          (c, i) => c.path === '/api/notices' && c.search.get('rideId') === 'ride-3' && i > decisionIndex(),
        ),
      ).toBe(true),
    );
    // The approved finding now says where it stands.
    expect(within(screen.getByLabelText('Finding 1')).getByLabelText('State: Open')).toBeTruthy();
  });

  test('before the list catches up the line comes from the decision’s answer', async () => {
    server.findings = [finding({})];
    await renderDeskWithFindings();
    approve({ id: 'n-4', reference: 'PW-2026-0011' }, []);
    fireEvent.press(screen.getByRole('button', { name: 'Approve inspection' }));
    const line = await screen.findByRole('link', {
      name: 'Notice PW-2026-0011 issued to Tamsworth Pier Leisure',
    });
    expect(line.props.href).toBe('/notices/n-4');
  });

  test('approving without findings says that no notice was issued', async () => {
    await renderDesk();
    approve(null, []);
    fireEvent.press(screen.getByRole('button', { name: 'Approve inspection' }));
    expect(
      await screen.findByText(/No notice was issued: the inspection was approved without findings/),
    ).toBeTruthy();
    expect(screen.queryByRole('link', { name: /^Notice / })).toBeNull();
  });

  test('an approved inspection lists its own notices only, with where each e-mail stands', async () => {
    startApproved();
    server.findings = [finding({})];
    server.notices = [
      notice({
        delivery: { state: 'partly_sent', total: 2, sent: 1, failed: 1 },
        acknowledgedAt: '2026-06-03T08:30:00.000Z',
        acknowledgedByName: 'Pell Harrow',
        openFindings: 0,
      }),
      // Another inspection of the same ride, a status notice of the ride, and another ride's notice.
      notice({ id: 'n-2', reference: 'PW-2026-0003', inspectionId: 'insp-2' }),
      notice({ id: 'n-3', reference: 'PW-2026-0009', kind: 'status_change', inspectionId: null }),
      notice({ id: 'n-8', reference: 'PW-2026-0010', rideId: 'ride-8', rideName: 'Harbour Wheel' }),
    ];
    await renderDeskWithFindings();
    expect(await screen.findByText('Notice PW-2026-0007 issued to Tamsworth Pier Leisure')).toBeTruthy();
    // The delivery state in words (noticeDeliveryStateInfo) with its own mark.
    const mark = screen.getByLabelText('E-mail: Partly sent');
    expect(within(mark).getByText('Partly sent')).toBeTruthy();
    expect(screen.getByText(/Acknowledged .* by Pell Harrow/)).toBeTruthy();
    expect(screen.getByText('Its finding is closed')).toBeTruthy();
    for (const other of ['PW-2026-0003', 'PW-2026-0009', 'PW-2026-0010'])
      expect(screen.queryByText(new RegExp(other))).toBeNull();
    const asked = server.calls.filter((c) => c.path === '/api/notices');
    expect(asked.length).toBeGreaterThanOrEqual(1);
    expect(asked.every((c) => c.search.get('rideId') === 'ride-3')).toBe(true);
    // The stand-in's answer is a valid page of the API.
    expect(() =>
      noticeListResponseSchema.parse({ notices: server.notices, total: 4, page: 1, pageSize: 100 }),
    ).not.toThrow();
  });

  test('each finding says where it stands; a reported action leads to the notice to verify it', async () => {
    startApproved();
    server.findings = [
      finding({
        id: 'f-1',
        number: 1,
        severity: 'fix_by_date',
        requiredAction: 'Replace the pin',
        dueOn: '2026-07-15',
      }),
      finding({
        id: 'f-2',
        number: 2,
        severity: 'fix_before_operation',
        requiredAction: 'Renew the lower bushing',
        state: 'action_reported',
      }),
      finding({
        id: 'f-3',
        number: 3,
        state: 'closed',
        closedAt: '2026-06-05T14:00:00.000Z',
        closedByName: 'Ilse Varga',
        stateNote: 'New pin fitted; clearance measured again',
      }),
    ];
    server.notices = [notice({ openFindings: 2, findingsTotal: 3 })];
    await renderDeskWithFindings();
    const row = (n: number) => screen.getByLabelText(`Finding ${n}`);

    // Words and a mark for each state, never colour alone.
    expect(within(row(1)).getByLabelText('State: Open')).toBeTruthy();
    expect(within(row(1)).getByText('Open')).toBeTruthy();
    expect(within(row(2)).getByLabelText('State: Action reported')).toBeTruthy();
    expect(within(row(2)).getByText('Action reported')).toBeTruthy();
    expect(within(row(3)).getByLabelText('State: Closed')).toBeTruthy();
    expect(within(row(3)).getByText(/by Ilse Varga/)).toBeTruthy();
    expect(within(row(3)).getByText(/New pin fitted; clearance measured again/)).toBeTruthy();

    // Only the finding waiting for verification leads to the notice, where it is closed or reopened.
    const review = await within(row(2)).findByRole('link', { name: 'Review corrective action on finding 2' });
    expect(review.props.href).toBe('/notices/n-1');
    expect(within(row(2)).getByText('Review corrective action')).toBeTruthy();
    expect(within(row(1)).queryByText('Review corrective action')).toBeNull();
    expect(within(row(3)).queryByText('Review corrective action')).toBeNull();
    expect(screen.getByText('2 of 3 findings not closed')).toBeTruthy();
  });

  test('while the inspection waits for a decision its open findings carry no state mark', async () => {
    server.findings = [finding({})];
    await renderDeskWithFindings();
    expect(within(screen.getByLabelText('Finding 1')).queryByLabelText('State: Open')).toBeNull();
    expect(server.calls.some((c) => c.path === '/api/notices')).toBe(false);
  });
});

describe('one’s own inspection', () => {
  test('the server’s reason replaces Approve; returning it stays possible', async () => {
    const reason =
      'You recorded this inspection, so another supervisor must approve it (an administrator can allow ' +
      'approving one’s own inspections). You may still return it.';
    server.detail.inspection.approvalRefusal = reason;
    await renderDesk();
    expect(screen.getByText(reason)).toBeTruthy();
    expect(screen.queryByRole('button', { name: 'Approve inspection' })).toBeNull();
    expect(screen.getByRole('button', { name: 'Return to inspector' })).toBeTruthy();
  });

  test('without a reason (another’s inspection, or an older server) Approve is offered', async () => {
    await renderDesk();
    expect(screen.getByRole('button', { name: 'Approve inspection' })).toBeTruthy();
    expect(screen.queryByTestId('approval-refusal')).toBeNull();
  });
});
