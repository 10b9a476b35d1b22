import { Router } from 'express';
import { z } from 'zod';

import { createPersonBodySchema, updatePersonBodySchema } from '@/features/admin/schema';
import {
  companyChoices,
  createPerson,
  listPeople,
  readPerson,
  resetPerson,
  setDisabled,
  updatePerson,
} from '@/server/auth/people';
import { currentUser, requireAuth, requireRole } from '@/server/auth/require-auth';
import { nowOf, type ApiDeps } from '@/server/deps';
import { validate } from '@/server/http/validate';

const idParams = z.object({ id: z.string().trim().min(1).max(100) });

/**
 * People administration, administrators only: `GET /admin/users` (everyone, and the operator companies to
 * choose from), `POST /admin/users` (with a password, or an invitation by e-mail), `GET|PATCH
 * /admin/users/:id`, and `POST /admin/users/:id/disable|enable|reset`. Never password hashes.
 */
export function adminUsersRouter(deps: ApiDeps): Router {
  const router = Router();
  const admin = [requireAuth(deps), requireRole('admin')];
  const ctx = () => ({ now: nowOf(deps), appUrl: deps.config.appUrl });

  router.get('/admin/users', ...admin, (_req, res) => {
    res.json({ users: listPeople(deps.db), companies: companyChoices(deps.db) });
  });

  const create = validate({ body: createPersonBodySchema });
  router.post('/admin/users', ...admin, create, async (_req, res) => {
    const result = await createPerson(deps.db, currentUser(res), create.body(res), ctx());
    res.status(201).json(result);
  });

  const one = validate({ params: idParams });
  router.get('/admin/users/:id', ...admin, one, (_req, res) => {
    res.json({ person: readPerson(deps.db, one.params(res).id, nowOf(deps)) });
  });

  const patch = validate({ params: idParams, body: updatePersonBodySchema });
  router.patch('/admin/users/:id', ...admin, patch, (_req, res) => {
    const user = updatePerson(deps.db, currentUser(res), patch.params(res).id, patch.body(res), ctx());
    res.json({ user });
  });

  router.post('/admin/users/:id/disable', ...admin, one, (_req, res) => {
    res.json({ user: setDisabled(deps.db, currentUser(res), one.params(res).id, true, ctx()) });
  });
  router.post('/admin/users/:id/enable', ...admin, one, (_req, res) => {
    res.json({ user: setDisabled(deps.db, currentUser(res), one.params(res).id, false, ctx()) });
  });
  router.post('/admin/users/:id/reset', ...admin, one, async (_req, res) => {
    res.json({ user: await resetPerson(deps.db, currentUser(res), one.params(res).id, ctx()) });
  });
  return router;
}
