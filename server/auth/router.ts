import { Router } from 'express';
import { rateLimit } from 'express-rate-limit';

import { signInBodySchema, type SignInResponse } from '@/features/auth/schema';
import type { ApiDeps } from '@/server/deps';
import { sendError } from '@/server/http/errors';
import { currentUser, requireAuth } from '@/server/auth/require-auth';
import { validate } from '@/server/http/validate';
import { signIn } from '@/server/auth/service';
import { endSessions } from '@/server/auth/sessions';
import { recordSessionAudit } from '@/server/auth/session-audit';

const defaultSignInLimit = { windowMs: 15 * 60 * 1000, max: 10 };

/** `POST /auth/sign-in`, `POST /auth/sign-out` and `GET /me`. */
export function authRouter(deps: ApiDeps): Router {
  const router = Router();
  const limit = deps.signInLimit ?? defaultSignInLimit;
  // Per client IP, counting only failed attempts, so a crew signing in on one site's Wi-Fi isn't locked out.
  const signInLimiter = rateLimit({
    windowMs: limit.windowMs,
    limit: limit.max,
    skipSuccessfulRequests: true,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    handler: (_req, res) => {
      const minutes = Math.max(1, Math.ceil(limit.windowMs / 60000));
      sendError(
        res,
        429,
        'too_many_attempts',
        `Too many failed sign-in attempts. Wait up to ${minutes} minutes, then try again.`,
      );
    },
  });

  const signInInput = validate({ body: signInBodySchema });
  router.post('/auth/sign-in', signInLimiter, signInInput, async (_req, res) => {
    const response: SignInResponse = await signIn(deps.db, deps.config, signInInput.body(res));
    res.json(response);
  });

  // Ends every session of the signed-in person, on every device: the stamp moves, so each token they hold
  // (this one included) is refused from the next request on. Stamped by the real clock, as tokens are.
  router.post('/auth/sign-out', requireAuth(deps), (_req, res) => {
    const user = currentUser(res);
    deps.db.transaction((tx) => {
      endSessions(tx, user.id, new Date());
      recordSessionAudit(tx, {
        userId: user.id,
        entityId: user.id,
        action: 'sign_out',
        summary: `${user.name} signed out; every session ended`,
      });
    });
    res.status(204).end();
  });

  router.get('/me', requireAuth(deps), (_req, res) => {
    res.json({ user: currentUser(res) });
  });

  return router;
}
