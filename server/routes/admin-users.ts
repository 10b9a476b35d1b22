import { Router } from 'express';

import { listUsers } from '@/server/auth/service';
import type { ApiDeps } from '@/server/deps';
import { requireAuth, requireRole } from '@/server/auth/require-auth';

/** `GET /admin/users` → `{ users }` (admins only; never password hashes). */
export function adminUsersRouter(deps: ApiDeps): Router {
  const router = Router();
  router.get('/admin/users', requireAuth(deps), requireRole('admin'), (_req, res) => {
    res.json({ users: listUsers(deps.db) });
  });
  return router;
}
