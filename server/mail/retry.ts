/**
 * When to try a failed e-mail again. Exponential backoff (×4 from 30 s) with ±20 % jitter, so deliveries
 * that failed together (an SMTP outage) do not all come back in the same second, capped at 6 h; after
 * eight attempts (about 15 h) the delivery is failed and shown to the supervisor. We are a client handing
 * mail to a submission server, which does its own queueing, so the first retries are minutes, not the
 * half-hour RFC 5321 §4.5.4.1 suggests between relays.
 */
import { classifyMailError } from '@/server/mail/mailer';

export type RetryPolicy = {
  baseMs: number;
  factor: number;
  capMs: number;
  /** Fraction of the delay added or taken away at random, 0–1. */
  jitter: number;
  /** Attempts in all, the first one included. */
  maxAttempts: number;
};

export const retryPolicy: RetryPolicy = {
  baseMs: 30_000,
  factor: 4,
  capMs: 6 * 3600_000,
  jitter: 0.2,
  maxAttempts: 8,
};

/**
 * The wait after the `attempt`-th failed attempt (1-based): base·factor^(attempt−1), capped, then jittered
 * within ±jitter and never above the cap. `random` returns [0, 1); tests pass a fixed one.
 */
export function backoffDelayMs(attempt: number, random: () => number = Math.random, policy = retryPolicy) {
  if (!Number.isInteger(attempt) || attempt < 1) throw new Error('attempt counts from 1');
  const nominal = Math.min(policy.capMs, policy.baseMs * policy.factor ** (attempt - 1));
  const spread = 1 - policy.jitter + 2 * policy.jitter * random();
  return Math.round(Math.min(policy.capMs, nominal * spread));
}

/** When to try again after the `attempt`-th failed attempt. */
export function nextAttemptAt(
  attempt: number,
  now: Date,
  random: () => number = Math.random,
  policy = retryPolicy,
): Date {
  return new Date(now.getTime() + backoffDelayMs(attempt, random, policy));
}

/** Whether a delivery that failed with `error` on its `attempt`-th attempt (1-based) gets another. */
export function shouldRetry(error: unknown, attempt: number, policy = retryPolicy): boolean {
  return classifyMailError(error) === 'transient' && attempt < policy.maxAttempts;
}
