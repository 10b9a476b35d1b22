import type { RequestHandler, Response } from 'express';

import type { Role, SessionUser } from '@/features/session/schema';
import { knownSessionToken, verifySessionToken, type VerifiedSession } from '@/server/auth/jwt';
import { findSessionUserWithStamp } from '@/server/auth/service';
import type { Config } from '@/server/config';
import type { Db } from '@/server/db';
import { forbidden, unauthorized } from '@/server/http/errors';

const bearer = /^Bearer\s+(\S+)\s*$/i;

/**
 * Accepts `Authorization: Bearer <token>`, then re-reads the user so a disabled or deleted account is
 * refused at once, and so is a token issued before the user's session stamp (`users.tokens_valid_after`,
 * moved by sign-out, a password change, disabling or a role change: server/auth/sessions.ts). The user is
 * kept on `res.locals.user`; read it with `currentUser(res)`.
 */
export function requireAuth(deps: { db: Db; config: Config }): RequestHandler {
  const admit = (res: Response, { userId, issuedAtMs }: VerifiedSession) => {
    const found = findSessionUserWithStamp(deps.db, userId);
    if (!found) throw unauthorized('Your account is no longer active. Sign in again.');
    if (found.tokensValidAfterMs !== null && issuedAtMs < found.tokensValidAfterMs) {
      throw unauthorized(sessionEndedMessage, 'session_ended');
    }
    res.locals.user = found.user;
  };
  return (req, res, next) => {
    const match = bearer.exec(req.get('authorization') ?? '');
    if (!match) throw unauthorized();
    // A token this process has verified before is admitted without a promise (the desk's every request).
    const known = knownSessionToken(match[1], deps.config);
    if (known) {
      admit(res, known);
      next();
      return;
    }
    return verifySessionToken(match[1], deps.config).then((verified) => {
      admit(res, verified);
      next();
    });
  };
}

const sessionEndedMessage =
  'This session was ended: you signed out, or your password or access changed. Sign in again.';

/** The signed-in user; only valid behind `requireAuth`. */
export function currentUser(res: Response): SessionUser {
  const user: SessionUser | undefined = res.locals.user;
  if (!user) throw unauthorized();
  return user;
}

/** 403 unless the signed-in user has one of these roles. Place after `requireAuth`. */
export function requireRole(...allowed: Role[]): RequestHandler {
  return (_req, res, next) => {
    if (!allowed.includes(currentUser(res).role)) throw forbidden();
    next();
  };
}
