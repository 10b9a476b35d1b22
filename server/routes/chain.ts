import { Router } from 'express';

import { idParamsSchema } from '@/features/registry/schema';
import type { ChainVerification } from '@/features/ledger';
import { companyScope } from '@/server/auth/scope';
import { nowOf, type ApiDeps } from '@/server/deps';
import { currentUser, requireAuth, requireRole } from '@/server/auth/require-auth';
import { validate } from '@/server/http/validate';
import { verifyRideChain } from '@/server/ledger/verify';
import { mustFindRide } from '@/server/registry/rides';

const oneRide = validate({ params: idParamsSchema });

/**
 * A ride's record chain (DEVELOPERS.md, "Record chain").
 *
 * - `GET /rides/:id/chain/verify` → `ChainVerification`: intact, or the first entry that breaks the chain
 *   and why. Supervisors and administrators for any ride, operators for their own company's rides (a
 *   notice's QR opens it), 404 for unknown rides and other companies'; inspectors 403.
 */
export function chainRouter(deps: ApiDeps): Router {
  const router = Router();
  const auth = requireAuth(deps);

  router.get(
    '/rides/:id/chain/verify',
    auth,
    requireRole('admin', 'supervisor', 'operator'),
    oneRide,
    (_req, res) => {
      const ride = mustFindRide(deps.db, oneRide.params(res).id, companyScope(currentUser(res)));
      const body: ChainVerification = verifyRideChain(deps.db, ride.id, nowOf(deps));
      res.json(body);
    },
  );

  return router;
}
