/**
 * The outbox state machine on its own: every transition, the back-off, and how request errors are
 * classified. No outside reference applies; the expected values follow from the rules documented in
 * features/sync/outbox-machine.ts (5 s doubling back-off capped at 15 min).
 */
import { ApiRequestError, OfflineError } from '@/lib/api-errors';
import {
  BACKOFF_MAX_MS,
  type OutboxEntry,
  OutboxTransitionError,
  backoffMs,
  classifyFailure,
  isDue,
  transition,
} from '@/features/sync/outbox-machine';

// The API client reads the session from expo-secure-store, which has no native side under node (ts-jest hoists this).
jest.mock('@/features/session/token-store', () => ({ tokenStore: { get: async () => null } }));

const now = new Date('2026-06-01T08:00:00.000Z');
const queued: OutboxEntry = {
  state: 'queued',
  attempts: 0,
  batchId: null,
  lastError: null,
  issues: [],
  nextAttemptAt: null,
};
const B1 = '11111111-1111-4111-8111-111111111111';
const B2 = '22222222-2222-4222-8222-222222222222';

test('queued → sending → accepted, and a duplicate answer is accepted too', () => {
  const sending = transition(queued, { type: 'send', batchId: B1 }, now);
  expect(sending).toMatchObject({ state: 'sending', batchId: B1 });
  expect(transition(sending, { type: 'accepted' }, now).state).toBe('accepted');
  expect(transition(sending, { type: 'duplicate' }, now).state).toBe('accepted');
});

test('a network failure puts the record back in the queue with its batch id and a back-off', () => {
  const sending = transition(queued, { type: 'send', batchId: B1 }, now);
  const failed = transition(
    sending,
    { type: 'failed', failure: { kind: 'network', message: 'No connection to the server.' } },
    now,
  );
  expect(failed).toEqual({
    state: 'queued',
    attempts: 1,
    batchId: B1,
    lastError: 'No connection to the server.',
    issues: [],
    nextAttemptAt: '2026-06-01T08:00:05.000Z',
  });
  // The re-send must carry the same batch id; another one is a programming error.
  expect(transition(failed, { type: 'send', batchId: B1 }, now).batchId).toBe(B1);
  expect(() => transition(failed, { type: 'send', batchId: B2 }, now)).toThrow(/batch/);
});

test('an expired session does not count as an attempt and waits for no back-off', () => {
  const sending = transition({ ...queued, attempts: 2 }, { type: 'send', batchId: B1 }, now);
  const failed = transition(sending, { type: 'failed', failure: { kind: 'auth', message: 'Sign in' } }, now);
  expect(failed).toMatchObject({ state: 'queued', attempts: 2, nextAttemptAt: null, batchId: B1 });
});

test('a rejected record keeps the reasons and is only re-queued on request, in a new batch', () => {
  const sending = transition(queued, { type: 'send', batchId: B1 }, now);
  const issues = [{ path: 'readings.0.valueSI', message: 'Must be a finite number' }];
  const rejected = transition(sending, { type: 'rejected', issues }, now);
  expect(rejected).toMatchObject({ state: 'rejected', issues, batchId: B1 });
  expect(rejected.lastError).toBe('readings.0.valueSI: Must be a finite number');
  expect(isDue(rejected, now, true)).toBe(false);
  const again = transition(rejected, { type: 'requeue' }, now);
  expect(again).toMatchObject({ state: 'queued', batchId: null, issues: [], attempts: 0 });
});

test('a record the server left out of its answer goes to a new batch', () => {
  const sending = transition(queued, { type: 'send', batchId: B1 }, now);
  expect(transition(sending, { type: 'unanswered' }, now)).toMatchObject({
    state: 'queued',
    batchId: null,
    attempts: 1,
  });
});

test('transitions that make no sense are refused', () => {
  expect(() => transition(queued, { type: 'accepted' }, now)).toThrow(OutboxTransitionError);
  const accepted: OutboxEntry = { ...queued, state: 'accepted' };
  expect(() => transition(accepted, { type: 'send', batchId: B1 }, now)).toThrow(OutboxTransitionError);
  expect(() => transition(queued, { type: 'requeue' }, now)).toThrow(OutboxTransitionError);
});

test('back-off: 5 s doubling, capped at 15 min', () => {
  expect([0, 1, 2, 3, 4].map(backoffMs)).toEqual([0, 5000, 10000, 20000, 40000]);
  expect(backoffMs(8)).toBe(640_000);
  expect(backoffMs(9)).toBe(BACKOFF_MAX_MS);
  expect(backoffMs(50)).toBe(BACKOFF_MAX_MS);
});

test('due: past its back-off, or always when forced', () => {
  const waiting: OutboxEntry = { ...queued, nextAttemptAt: '2026-06-01T08:00:05.000Z' };
  expect(isDue(waiting, now)).toBe(false);
  expect(isDue(waiting, new Date('2026-06-01T08:00:05.000Z'))).toBe(true);
  expect(isDue(waiting, now, true)).toBe(true);
  expect(isDue({ ...queued, state: 'accepted' }, now, true)).toBe(false);
});

test('request errors are classified; unknown ones are retried, never dropped', () => {
  expect(classifyFailure(new OfflineError(new TypeError('Failed to fetch'))).kind).toBe('network');
  expect(classifyFailure(new ApiRequestError(502, 'http_error', 'Bad gateway'))).toMatchObject({
    kind: 'server',
    status: 502,
  });
  expect(classifyFailure(new ApiRequestError(200, 'bad_response', 'not JSON')).kind).toBe('server');
  expect(classifyFailure(new ApiRequestError(429, 'rate_limited', 'slow down')).kind).toBe('server');
  expect(classifyFailure(new ApiRequestError(401, 'unauthenticated', 'Sign in')).kind).toBe('auth');
  expect(classifyFailure(new ApiRequestError(413, 'too_large', 'Too large'))).toMatchObject({
    kind: 'refused',
    message: 'Too large',
  });
  expect(classifyFailure(new Error('something odd')).kind).toBe('server');
});
