import { Router } from 'express';
import { rateLimit } from 'express-rate-limit';

import { signInBodySchema, type SignInResponse } from '@/features/auth/schema';
import type { ApiDeps } from '@/server/deps';
import { sendError } from '@/server/http/errors';
import { currentUser, requireAuth } from '@/server/auth/require-auth';
import { validate } from '@/server/http/validate';
import { signIn } from '@/server/auth/service';

const defaultSignInLimit = { windowMs: 15 * 60 * 1000, max: 10 };

/** `POST /auth/sign-in` and `GET /me`. */
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

  router.get('/me', requireAuth(deps), (_req, res) => {
    res.json({ user: currentUser(res) });
  });

  return router;
}
