import { Router } from 'express';
import { z } from 'zod';

import { registerDeviceKeyBodySchema } from '@/features/ledger/schema';
import { currentUser, requireAuth } from '@/server/auth/require-auth';
import { nowOf, type ApiDeps } from '@/server/deps';
import { forbidden } from '@/server/http/errors';
import { validate } from '@/server/http/validate';
import { listDeviceKeys, registerDeviceKey, revokeDeviceKey } from '@/server/auth/device-keys';

const register = validate({ body: registerDeviceKeyBodySchema });
const list = validate({ query: z.object({ userId: z.string().trim().min(1).max(100).optional() }) });
const oneKey = validate({ params: z.object({ keyId: z.string().trim().min(1).max(100) }) });

/**
 * The phones' signing keys (DEVELOPERS.md, "Record chain", phone keys), for anyone signed in.
 *
 * - `POST /devices/keys` `{ publicKey, label? }` → 201 `{ keyId, createdAt }` for a new key, 200 the same
 *   when this person registered it already; 409 `key_taken` (another person's) or `key_revoked`.
 * - `GET /devices/keys` → `DeviceKey[]`, the signed-in person's; an administrator may add
 *   `?userId=` for anyone's (anyone else asking for another person's gets 403).
 * - `POST /devices/keys/:keyId/revoke` → `{ key }`, by its owner or an administrator; 404 for an unknown
 *   key or another person's; revoking again changes nothing.
 */
export function devicesRouter(deps: ApiDeps): Router {
  const router = Router();
  const auth = requireAuth(deps);

  router.post('/devices/keys', auth, register, (_req, res) => {
    const { created, ...key } = registerDeviceKey(deps.db, currentUser(res), register.body(res), nowOf(deps));
    res.status(created ? 201 : 200).json(key);
  });

  router.get('/devices/keys', auth, list, (_req, res) => {
    const user = currentUser(res);
    const userId = list.query(res).userId ?? user.id;
    if (userId !== user.id && user.role !== 'admin')
      throw forbidden("Only an administrator may list another person's phone keys.");
    res.json(listDeviceKeys(deps.db, userId));
  });

  router.post('/devices/keys/:keyId/revoke', auth, oneKey, (_req, res) => {
    res.json({ key: revokeDeviceKey(deps.db, currentUser(res), oneKey.params(res).keyId, nowOf(deps)) });
  });

  return router;
}
