import { Router } from 'express';

import { signInBodySchema, type SignInResponse } from '@/features/auth/schema';
import type { ApiDeps } from '@/server/deps';
import { currentUser, requireAuth } from '@/server/auth/require-auth';
import { validate } from '@/server/http/validate';
import { signIn } from '@/server/auth/service';
import { endSessions } from '@/server/auth/sessions';
import { recordUserAudit } from '@/server/auth/user-audit';
import {
  accountSignInLimiter,
  addressSignInLimiter,
  auditFailedSignIn,
  defaultSignInLimit,
} from '@/server/auth/sign-in-limits';

/** `POST /auth/sign-in`, `POST /auth/sign-out` and `GET /me`. */
export function authRouter(deps: ApiDeps): Router {
  const router = Router();
  const addressLimit = deps.signInLimit ?? defaultSignInLimit;
  // A test that loosens the address limit loosens this one too unless it sets it apart.
  const accountLimit = deps.accountSignInLimit ?? deps.signInLimit ?? defaultSignInLimit;

  // The address limit runs first, before the body is validated; the account limit needs the validated e-mail.
  const signInInput = validate({ body: signInBodySchema });
  router.post(
    '/auth/sign-in',
    addressSignInLimiter(addressLimit, { logger: deps.logger, trustProxy: deps.config.trustProxy }),
    signInInput,
    accountSignInLimiter(accountLimit),
    async (req, res) => {
      const body = signInInput.body(res);
      const attempt = { email: body.email, address: req.ip ?? 'unknown' };
      const response: SignInResponse = await signIn(deps.db, deps.config, body, (failure) =>
        auditFailedSignIn(deps, attempt, failure),
      );
      res.json(response);
    },
  );

  // Ends every session of the signed-in person, on every device: the stamp moves, so each token they hold
  // (this one included) is refused from the next request on. Stamped by the real clock, as tokens are.
  router.post('/auth/sign-out', requireAuth(deps), (_req, res) => {
    const user = currentUser(res);
    deps.db.transaction((tx) => {
      endSessions(tx, user.id, new Date());
      recordUserAudit(tx, {
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
