import type { Request, RequestHandler } from 'express';
import { rateLimit } from 'express-rate-limit';

import { recordUserAudit } from '@/server/auth/user-audit';
import type { SignInFailure } from '@/server/auth/service';
import type { Config } from '@/server/config';
import type { Db } from '@/server/db';
import { sendError } from '@/server/http/errors';
import type { Logger } from '@/server/logger';

export type SignInLimit = { windowMs: number; max: number };

/** Failed sign-ins allowed per window, per client address and (separately) per account e-mail. */
export const defaultSignInLimit: SignInLimit = { windowMs: 15 * 60 * 1000, max: 10 };

const minutesOf = (limit: SignInLimit) => Math.max(1, Math.ceil(limit.windowMs / 60000));

/**
 * Per client address (`req.ip`: the proxy's view of it only when TRUST_PROXY names the proxies), counting
 * only failed attempts, so a crew signing in on one site's Wi-Fi isn't locked out by each other's successes.
 */
export function addressSignInLimiter(
  limit: SignInLimit,
  deps: { logger: Logger; trustProxy: Config['trustProxy'] },
): RequestHandler {
  let warned = false;
  return rateLimit({
    windowMs: limit.windowMs,
    limit: limit.max,
    skipSuccessfulRequests: true,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    // Said once in our own log, in plain words, instead of the library's stack trace on the console.
    validate: { xForwardedForHeader: false },
    skip: (req) => {
      if (!warned && deps.trustProxy === false && req.get('x-forwarded-for') !== undefined) {
        warned = true;
        deps.logger.warn(
          'sign-in requests carry X-Forwarded-For but TRUST_PROXY is not set: the sign-in limit counts ' +
            "the proxy's address, not each client's. Set TRUST_PROXY to the number of proxies or their addresses.",
        );
      }
      return false;
    },
    handler: (_req, res) => {
      sendError(
        res,
        429,
        'too_many_attempts',
        `Too many failed sign-in attempts. Wait up to ${minutesOf(limit)} minutes, then try again.`,
      );
    },
  });
}

/**
 * Per account e-mail (lower-cased), counting wrong passwords from any address: guessing one person's password
 * from many addresses is held back as well. Only refused credentials (401) count, and the answer is the same
 * for an address with no account behind it, so the limit reveals nothing about who has one. Place after the
 * body is validated (the e-mail is trimmed and lower-cased there).
 */
export function accountSignInLimiter(limit: SignInLimit): RequestHandler {
  return rateLimit({
    windowMs: limit.windowMs,
    limit: limit.max,
    keyGenerator: (req) => `account:${accountEmail(req)}`,
    skip: (req) => accountEmail(req) === null,
    skipSuccessfulRequests: true,
    requestWasSuccessful: (_req, res) => res.statusCode !== 401,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    // The key is the e-mail, not the address: the library's IPv6 check for custom keys does not apply.
    validate: { keyGeneratorIpFallback: false },
    handler: (_req, res) => {
      sendError(
        res,
        429,
        'too_many_attempts',
        `Too many failed sign-in attempts for this e-mail address. Wait up to ${minutesOf(limit)} minutes, ` +
          'then try again, or ask an administrator to send you a password reset.',
      );
    },
  });
}

function accountEmail(req: Request): string | null {
  const email: unknown = (req.body as { email?: unknown } | undefined)?.email;
  return typeof email === 'string' && email !== '' ? email.trim().toLowerCase() : null;
}

const reasonWords: Record<SignInFailure['reason'], string> = {
  wrong_password: 'wrong password',
  unknown_account: 'no account has this e-mail',
  account_disabled: 'the account is disabled',
};

/**
 * Writes one failed sign-in to the audit log (entity `user`): the account tried (its id, or the e-mail when
 * no account has it), the client address and the reason, so an administrator can see who is being tried.
 * The actor is unknown, so `userId` stays null. Refusals by the limiters are not written (each would be a row
 * an attacker could add at will); the limits bound how many failures are.
 */
export function auditFailedSignIn(
  deps: { db: Db; logger: Logger },
  attempt: { email: string; address: string },
  failure: SignInFailure,
): void {
  const { email, address } = attempt;
  const reason = reasonWords[failure.reason];
  recordUserAudit(deps.db, {
    userId: null,
    entityId: failure.userId ?? email,
    action: 'sign_in_failed',
    summary: `Failed sign-in for ${email} from ${address}: ${reason}`,
    after: { email, address, reason: failure.reason },
  });
  deps.logger.warn({ email, address, reason: failure.reason }, 'failed sign-in');
}
