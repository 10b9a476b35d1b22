import type { RequestHandler, Response } from 'express';

import type { Role, SessionUser } from '@/features/session/schema';
import { verifySessionToken } from '@/server/auth/jwt';
import { findSessionUser } from '@/server/auth/service';
import type { Config } from '@/server/config';
import type { Db } from '@/server/db';
import { forbidden, unauthorized } from '@/server/http/errors';

const bearer = /^Bearer\s+(\S+)\s*$/i;

/**
 * Accepts `Authorization: Bearer <token>`, then re-reads the user so a disabled or deleted account is
 * refused at once. The user is kept on `res.locals.user`; read it with `currentUser(res)`.
 */
export function requireAuth(deps: { db: Db; config: Config }): RequestHandler {
  return async (req, res, next) => {
    const match = bearer.exec(req.get('authorization') ?? '');
    if (!match) throw unauthorized();
    const { userId } = await verifySessionToken(match[1], deps.config);
    const user = findSessionUser(deps.db, userId);
    if (!user) throw unauthorized('Your account is no longer active. Sign in again.');
    res.locals.user = user;
    next();
  };
}

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
