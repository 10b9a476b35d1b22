/**
 * The life of one outbox record, as pure functions (no I/O, no clock of its own), so every path can be
 * tested without a server:
 *
 *   queued ──send(batchId)──▶ sending ──accepted | duplicate──▶ accepted
 *      ▲                        │ └────rejected(issues)────────▶ rejected ──requeue──▶ queued
 *      └──failed | unanswered───┘
 *
 * A failed send keeps the batch id, so the re-send carries the same idempotency key and the server can
 * recognise a batch it already stored before the connection was cut. Nothing here ever drops a record:
 * the only way out of the outbox is `accepted`, and accepted rows are kept.
 */
import type { OutboxState } from '@/db/device/schema';
import { ApiRequestError, OfflineError } from '@/lib/api-errors';
import type { OutboxIssue } from '@/features/device-db';

export type OutboxEntry = {
  state: OutboxState;
  attempts: number;
  batchId: string | null;
  lastError: string | null;
  issues: OutboxIssue[];
  nextAttemptAt: string | null;
};

/**
 * Why a request did not get a per-record answer. `network`: no connection or cut mid-request;
 * `server`: 5xx, 408, 429 or an answer that is not ours (a proxy's page); `auth`: the session expired;
 * `refused`: any other 4xx for the whole request. Only `auth` does not count as an attempt.
 */
export type SendFailure = {
  kind: 'network' | 'server' | 'auth' | 'refused';
  message: string;
  status?: number;
};

export type OutboxEvent =
  | { type: 'send'; batchId: string }
  | { type: 'accepted' }
  | { type: 'duplicate' }
  | { type: 'rejected'; issues: OutboxIssue[] }
  | { type: 'failed'; failure: SendFailure }
  /** The server answered the batch but said nothing about this record. */
  | { type: 'unanswered' }
  | { type: 'requeue' };

export class OutboxTransitionError extends Error {
  constructor(state: OutboxState, event: OutboxEvent['type']) {
    super(`An outbox record that is ${state} cannot take '${event}'.`);
    this.name = 'OutboxTransitionError';
  }
}

const BACKOFF_BASE_MS = 5_000;
export const BACKOFF_MAX_MS = 15 * 60_000;

/** Wait before the next automatic try after `attempts` failed ones: 5 s, 10 s, 20 s, … up to 15 min. */
export function backoffMs(attempts: number): number {
  if (attempts <= 0) return 0;
  return Math.min(BACKOFF_BASE_MS * 2 ** (attempts - 1), BACKOFF_MAX_MS);
}

export function transition(entry: OutboxEntry, event: OutboxEvent, now: Date): OutboxEntry {
  const fail = (): never => {
    throw new OutboxTransitionError(entry.state, event.type);
  };
  switch (event.type) {
    case 'send': {
      if (entry.state !== 'queued' && entry.state !== 'sending') return fail();
      // A batch id, once written, stays until the server answers: re-sends must reuse it.
      if (entry.batchId !== null && entry.batchId !== event.batchId)
        throw new Error(`Record already belongs to batch ${entry.batchId}; re-send it with that id.`);
      return { ...entry, state: 'sending', batchId: event.batchId };
    }
    case 'accepted':
    case 'duplicate':
      if (entry.state !== 'sending') return fail();
      return { ...entry, state: 'accepted', lastError: null, issues: [], nextAttemptAt: null };
    case 'rejected':
      if (entry.state !== 'sending') return fail();
      return {
        ...entry,
        state: 'rejected',
        issues: event.issues,
        lastError: event.issues.length
          ? event.issues.map((i) => (i.path ? `${i.path}: ${i.message}` : i.message)).join('; ')
          : 'The server refused this record.',
        nextAttemptAt: null,
      };
    case 'failed': {
      if (entry.state !== 'sending') return fail();
      if (event.failure.kind === 'auth')
        return { ...entry, state: 'queued', lastError: event.failure.message, nextAttemptAt: null };
      const attempts = entry.attempts + 1;
      return {
        ...entry,
        state: 'queued',
        attempts,
        lastError: event.failure.message,
        nextAttemptAt: new Date(now.getTime() + backoffMs(attempts)).toISOString(),
      };
    }
    case 'unanswered': {
      if (entry.state !== 'sending') return fail();
      const attempts = entry.attempts + 1;
      // The batch's stored answer on the server lacks this record, so it needs a batch of its own.
      return {
        ...entry,
        state: 'queued',
        attempts,
        batchId: null,
        lastError: 'The server did not answer for this record; it will be sent again.',
        nextAttemptAt: new Date(now.getTime() + backoffMs(attempts)).toISOString(),
      };
    }
    case 'requeue':
      if (entry.state !== 'rejected') return fail();
      return {
        ...entry,
        state: 'queued',
        attempts: 0,
        batchId: null,
        issues: [],
        lastError: null,
        nextAttemptAt: null,
      };
  }
}

/** Waiting to be sent now: queued (or left `sending` by an interrupted run) and past its back-off. */
export function isDue(
  entry: Pick<OutboxEntry, 'state' | 'nextAttemptAt'>,
  now: Date,
  force = false,
): boolean {
  if (entry.state !== 'queued' && entry.state !== 'sending') return false;
  return force || entry.nextAttemptAt === null || entry.nextAttemptAt <= now.toISOString();
}

/** Turns whatever a request threw into a failure kind; unknown errors are retried, never dropped. */
export function classifyFailure(err: unknown): SendFailure {
  if (err instanceof OfflineError) return { kind: 'network', message: 'No connection to the server.' };
  if (err instanceof ApiRequestError) {
    const { status } = err;
    if (status === 401 || status === 403)
      return { kind: 'auth', status, message: 'Sign in again to send your inspections.' };
    if (status >= 500 || status === 408 || status === 429 || err.code === 'bad_response')
      return {
        kind: 'server',
        status,
        message: `The server could not take it now (${status}); trying again later.`,
      };
    return { kind: 'refused', status, message: err.message };
  }
  if (err instanceof Error && (err.name === 'AbortError' || err.name === 'TimeoutError'))
    return { kind: 'network', message: 'The connection timed out.' };
  const detail = err instanceof Error ? err.message : String(err);
  return { kind: 'server', message: `Sending failed (${detail}); trying again later.` };
}
