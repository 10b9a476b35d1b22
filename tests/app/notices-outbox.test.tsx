/**
 * The admin's outbox (/admin/outbox) against a stand-in server answering in the API's shapes
 * (features/notices/schema.ts: outboxListResponseSchema, outboxMessageResponseSchema; errors as
 * features/api/errors.ts, with the server's `no_local_mailbox` code from server/routes/notices.ts). What is
 * checked: what the screen asks for, what it shows of the answer, that an HTML body is never rendered as
 * markup, the role gate, and the message when mail goes to a real SMTP server. Addresses, rides and
 * companies are the invented demo scenario.
 */
import { fireEvent, screen, waitFor, within } from 'expo-router/testing-library';

import { makeQueryClient } from '@/features/api/query-client';
import type { SessionUser } from '@/features/session/schema';
import { OutboxScreen } from '@/features/notices/outbox-screen';
import {
  type OutboxMessage,
  outboxListResponseSchema,
  outboxMessageResponseSchema,
} from '@/features/notices/schema';
import { holderOf, renderScreens, sessionClient } from '@/tests/support/app-screens';
import { type StandInReply, notFound, ok, standInApi } from '@/tests/support/stand-in-api';

jest.mock('@/features/session/token-store', () => ({
  tokenStore: { get: async () => null, set: async () => {}, clear: async () => {} },
}));

const mockDownload = jest.fn<Promise<string>, [string, number, string]>();
jest.mock('@/features/notices/outbox-download', () => ({
  downloadOutboxAttachment: (...args: [string, number, string]) => mockDownload(...args),
}));

let mockWide = true;
jest.mock('@/components/use-wide', () => ({ useWide: () => mockWide }));

jest.setTimeout(30_000);

const admin: SessionUser = {
  id: 'u-adm',
  email: 'odile.brandt@halvard.example',
  name: 'Odile Brandt',
  role: 'admin',
  companyId: null,
  companyName: null,
};
const supervisor: SessionUser = { ...admin, id: 'u-sup', name: 'Mara Quill', role: 'supervisor' };

const noticeMail: OutboxMessage = {
  id: 'm-2',
  receivedAt: '2026-06-02T11:00:05.000Z',
  from: 'Halvard Ride Inspection Services <notices@halvard.example>',
  to: ['safety@tamsworth-pier.example', 'duty.manager@tamsworth-pier.example'],
  subject: 'PW-2026-0007 · Gull Wing · inspection notice',
  messageId: '<n-1.safety@tamsworth-pier.example@pivotwatch>',
  idempotencyKey: 'notice:n-1:safety@tamsworth-pier.example',
  size: 91_840,
  attachments: [{ index: 0, filename: 'PW-2026-0007.pdf', contentType: 'application/pdf', size: 84_312 }],
};
const reminderMail: OutboxMessage = {
  id: 'm-1',
  receivedAt: '2026-06-01T07:00:00.000Z',
  from: 'Halvard Ride Inspection Services <notices@halvard.example>',
  to: ['ops@corvane-shows.example'],
  subject: 'Reminder: finding 2 on Tidebreaker is due in 7 days',
  messageId: null,
  idempotencyKey: null,
  size: 2_410,
  attachments: [],
};

const bodies: Record<string, { text: string | null; html: string | null }> = {
  'm-2': {
    text: 'Notice PW-2026-0007 about Gull Wing.\nFinding 1: replace the main pivot pin by 15 Jul 2026.',
    html: '<p>Notice <b>PW-2026-0007</b></p>',
  },
  // Only an HTML part, with a script and markup that must never reach the screen as markup.
  'm-1': {
    text: null,
    html:
      '<html><head><style>p{color:red}</style></head><body><p>Finding 2 on <b>Tidebreaker</b> is due.</p>' +
      '<script>alert("x")</script><p>Open it: <a href="https://pivotwatch.example/notices/n-3">the notice</a></p>' +
      '<p>Pins &amp; bushings &lt;checked&gt;</p></body></html>',
  },
};

let answerList: () => StandInReply;
let requests: string[] = [];

beforeEach(() => {
  requests = [];
  mockWide = true;
  mockDownload.mockReset();
  answerList = () => ({ status: 200, body: { messages: [noticeMail, reminderMail] } });
  standInApi((call) => {
    requests.push(call.path);
    if (call.path === '/api/admin/outbox') return answerList();
    const one = /^\/api\/admin\/outbox\/([^/]+)$/.exec(call.path);
    const m = one && [noticeMail, reminderMail].find((x) => x.id === one[1]);
    return m ? ok({ message: { ...m, ...bodies[m.id] } }) : undefined;
  }, notFound('No such message.'));
});

let client: ReturnType<typeof makeQueryClient> | null = null;
afterEach(() => {
  client?.clear();
  client = null;
  jest.restoreAllMocks();
});

function renderOutbox(user: SessionUser) {
  const queries = sessionClient(user);
  client = queries;
  return renderScreens(queries, { 'admin/outbox': OutboxScreen }, '/admin/outbox');
}

test('the fixtures are what the API’s schemas accept', () => {
  expect(() => outboxListResponseSchema.parse({ messages: [noticeMail, reminderMail] })).not.toThrow();
  for (const m of [noticeMail, reminderMail])
    expect(() => outboxMessageResponseSchema.parse({ message: { ...m, ...bodies[m.id] } })).not.toThrow();
});

test('an admin sees every message in the order the server gives (newest first), with attachments', async () => {
  renderOutbox(admin);
  const list = await screen.findByLabelText('Messages');
  const rows = within(list).getAllByRole('button');
  expect(rows.map((r) => r.props.accessibilityLabel)).toEqual([
    'Message: PW-2026-0007 · Gull Wing · inspection notice',
    'Message: Reminder: finding 2 on Tidebreaker is due in 7 days',
  ]);
  // Each row is a list item: its subject the button, the facts beside it.
  const items = rows.map(holderOf);
  const first = within(items[0]);
  expect(first.getByText(/Halvard Ride Inspection Services <notices@halvard\.example>/)).toBeTruthy();
  expect(
    first.getByText(/safety@tamsworth-pier\.example, duty\.manager@tamsworth-pier\.example/),
  ).toBeTruthy();
  // 84 312 B = 84.3 kB with the SI kilo (1000), as formatBytes promises.
  expect(first.getByText('PW-2026-0007.pdf (84.3 kB)')).toBeTruthy();
  expect(within(items[1]).queryByText(/\.pdf/)).toBeNull();
  expect(screen.getByText('2 e-mails received by the built-in mailbox, newest first.')).toBeTruthy();
});

test('a message shows its text, its facts and a Download button per attachment', async () => {
  mockDownload.mockResolvedValue('Downloaded PW-2026-0007.pdf');
  renderOutbox(admin);
  fireEvent.press(
    await screen.findByRole('button', { name: 'Message: PW-2026-0007 · Gull Wing · inspection notice' }),
  );
  const view = await screen.findByLabelText('Message');
  expect(within(view).getByLabelText('Message text').props.children).toBe(bodies['m-2'].text);
  expect(within(view).getByText('notice:n-1:safety@tamsworth-pier.example')).toBeTruthy();
  expect(requests).toContain('/api/admin/outbox/m-2');

  const attachment = within(view).getByLabelText('Attachment: PW-2026-0007.pdf');
  expect(within(attachment).getByText('application/pdf · 84.3 kB')).toBeTruthy();
  fireEvent.press(within(attachment).getByRole('button', { name: 'Download PW-2026-0007.pdf' }));
  expect(await within(attachment).findByText('Downloaded PW-2026-0007.pdf')).toBeTruthy();
  expect(mockDownload).toHaveBeenCalledWith('m-2', 0, 'PW-2026-0007.pdf');
});

test('a refused download says why', async () => {
  const { ApiRequestError } = jest.requireActual('@/lib/api-errors');
  mockDownload.mockRejectedValue(new ApiRequestError(404, 'not_found', 'No such attachment in the outbox.'));
  renderOutbox(admin);
  fireEvent.press(await screen.findByRole('button', { name: /^Message: PW-2026-0007/ }));
  fireEvent.press(await screen.findByRole('button', { name: 'Download PW-2026-0007.pdf' }));
  expect(await screen.findByText('No such attachment in the outbox.')).toBeTruthy();
});

test('an HTML-only message is shown as plain text: no script, no tags, entities decoded once', async () => {
  renderOutbox(admin);
  fireEvent.press(await screen.findByRole('button', { name: /^Message: Reminder/ }));
  const text = await screen.findByLabelText('Message text');
  const shown = String(text.props.children);
  expect(shown).toContain('Finding 2 on Tidebreaker is due.');
  expect(shown).toContain('the notice (https://pivotwatch.example/notices/n-3)');
  expect(shown).toContain('Pins & bushings <checked>');
  expect(shown).not.toMatch(/alert|color:red|<p>|<b>|<script/);
  expect(
    screen.getByText('Shown as plain text: the HTML is never displayed as a web page here.'),
  ).toBeTruthy();
  expect(screen.getByText('None.')).toBeTruthy();
});

test('on a phone the list gives way to the message, and back', async () => {
  mockWide = false;
  renderOutbox(admin);
  fireEvent.press(await screen.findByRole('button', { name: /^Message: PW-2026-0007/ }));
  expect(await screen.findByLabelText('Message')).toBeTruthy();
  expect(screen.queryByLabelText('Messages')).toBeNull();
  fireEvent.press(screen.getByRole('button', { name: 'All messages' }));
  expect(await screen.findByLabelText('Messages')).toBeTruthy();
});

test('a supervisor gets the role gate and the outbox is never asked for', async () => {
  renderOutbox(supervisor);
  expect(await screen.findByText('Not part of your role')).toBeTruthy();
  expect(requests).not.toContain('/api/admin/outbox');
});

test('with a real SMTP server there is no local mailbox, and the screen says so', async () => {
  answerList = () => ({
    status: 404,
    body: {
      error: {
        code: 'no_local_mailbox',
        message:
          'E-mail goes out through the SMTP server set in SMTP_URL, so there is no local outbox to show; look in that server’s own logs.',
      },
    },
  });
  renderOutbox(admin);
  const box = await screen.findByLabelText('No local mailbox');
  expect(within(box).getByText(/E-mail goes out through the SMTP server set in SMTP_URL/)).toBeTruthy();
  expect(screen.queryByRole('button', { name: 'Refresh' })).toBeNull();
  expect(screen.queryByLabelText('Messages')).toBeNull();
});

test('an empty mailbox says how mail gets there', async () => {
  answerList = () => ({ status: 200, body: { messages: [] } });
  renderOutbox(admin);
  expect(await screen.findByText('No e-mail yet')).toBeTruthy();
  await waitFor(() =>
    expect(screen.getByText('0 e-mails received by the built-in mailbox, newest first.')).toBeTruthy(),
  );
});
