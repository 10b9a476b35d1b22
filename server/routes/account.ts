import { Router, type Response } from 'express';
import { rateLimit } from 'express-rate-limit';
import { z } from 'zod';

import {
  passwordChangeBodySchema,
  passwordLinkBodySchema,
  type PasswordLinkInfo,
} from '@/features/auth/password-schema';
import type { SignInResponse } from '@/features/auth/schema';
import { changeOwnPassword, readPasswordLink, usePasswordLink } from '@/server/auth/password-links';
import { currentUser, requireAuth } from '@/server/auth/require-auth';
import { nowOf, type ApiDeps } from '@/server/deps';
import { sendError } from '@/server/http/errors';
import { validate } from '@/server/http/validate';

const windowMs = 15 * 60 * 1000;

const limiter = (max: number, message: string, key?: (res: Response) => string) =>
  rateLimit({
    windowMs,
    limit: max,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    ...(key ? { keyGenerator: (_req, res) => key(res), skipSuccessfulRequests: true } : {}),
    handler: (_req, res) => sendError(res, 429, 'too_many_attempts', message),
  });

const tokenParams = z.object({ token: z.string().min(1).max(400) });

/**
 * A person's own password (`POST /auth/password`, signed in) and the set-password links (anonymous: the
 * token is the proof). Link requests are limited per address, counting every try, so nobody can probe
 * tokens or hammer the hashing; a wrong current password is limited per account.
 */
export function accountRouter(deps: ApiDeps): Router {
  const router = Router();
  const linkLimiter = limiter(
    30,
    'Too many tries with set-password links from this address. Wait 15 minutes, then open the link again.',
  );
  const changeLimiter = limiter(
    10,
    'Too many wrong current passwords. Wait 15 minutes, then try again.',
    (res) => currentUser(res).id,
  );

  const change = validate({ body: passwordChangeBodySchema });
  router.post('/auth/password', requireAuth(deps), changeLimiter, change, async (_req, res) => {
    const answer: SignInResponse = await changeOwnPassword(
      deps.db,
      deps.config,
      currentUser(res),
      change.body(res),
      nowOf(deps),
    );
    res.json(answer);
  });

  const read = validate({ params: tokenParams });
  router.get('/auth/password-links/:token', linkLimiter, read, (_req, res) => {
    const info: PasswordLinkInfo = readPasswordLink(deps.db, read.params(res).token, nowOf(deps));
    res.json(info);
  });

  const use = validate({ params: tokenParams, body: passwordLinkBodySchema });
  router.post('/auth/password-links/:token', linkLimiter, use, async (_req, res) => {
    const answer: SignInResponse = await usePasswordLink(
      deps.db,
      deps.config,
      use.params(res).token,
      use.body(res).password,
      nowOf(deps),
    );
    res.json(answer);
  });
  return router;
}
