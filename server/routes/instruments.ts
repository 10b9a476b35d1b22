import { Router } from 'express';

import { idParamsSchema } from '@/features/registry/schema';
import {
  declarationSettingInputSchema,
  instrumentInputSchema,
  instrumentPatchSchema,
} from '@/features/instruments/schema';
import type { ApiDeps } from '@/server/deps';
import { notFound } from '@/server/http/errors';
import { currentUser, requireAuth, requireRole } from '@/server/auth/require-auth';
import { patchBody, validate } from '@/server/http/validate';
import {
  createInstrument,
  deleteInstrument,
  findInstrument,
  getDeclarationSetting,
  listInstruments,
  setDeclarationText,
  updateInstrument,
} from '@/server/instruments/instruments';

/**
 * The inspection body's instrument register and declaration text. Staff read them (inspectors also get
 * both through the pull); only admins change them.
 *
 * - `GET /instruments` → `{ instruments }` (all, retired included, by name); `GET /instruments/:id` →
 *   `{ instrument }`; `POST /instruments` → 201 `{ instrument }`; `PATCH /instruments/:id` →
 *   `{ instrument }`; `DELETE /instruments/:id` → 204.
 * - `GET /settings/declaration` → `{ declaration: { text, updatedAt, updatedByName } }`;
 *   `PUT /settings/declaration` `{ text }` → the same.
 */
export function instrumentsRouter(deps: ApiDeps): Router {
  const router = Router();
  const staff = [requireAuth(deps), requireRole('admin', 'supervisor', 'inspector')];
  const admin = [requireAuth(deps), requireRole('admin')];
  const byId = validate({ params: idParamsSchema });
  const create = validate({ body: instrumentInputSchema });
  const patch = validate({ params: idParamsSchema, body: patchBody(instrumentPatchSchema) });
  const declaration = validate({ body: declarationSettingInputSchema });

  router.get('/instruments', ...staff, (_req, res) => {
    res.json({ instruments: listInstruments(deps.db) });
  });
  router.get('/instruments/:id', ...staff, byId, (_req, res) => {
    const instrument = findInstrument(deps.db, byId.params(res).id);
    if (!instrument) throw notFound('No such instrument.');
    res.json({ instrument });
  });
  router.post('/instruments', ...admin, create, (_req, res) => {
    res.status(201).json({ instrument: createInstrument(deps.db, currentUser(res).id, create.body(res)) });
  });
  router.patch('/instruments/:id', ...admin, patch, (_req, res) => {
    res.json({
      instrument: updateInstrument(deps.db, currentUser(res).id, patch.params(res).id, patch.body(res)),
    });
  });
  router.delete('/instruments/:id', ...admin, byId, (_req, res) => {
    deleteInstrument(deps.db, currentUser(res).id, byId.params(res).id);
    res.status(204).end();
  });

  router.get('/settings/declaration', ...staff, (_req, res) => {
    res.json({ declaration: getDeclarationSetting(deps.db) });
  });
  router.put('/settings/declaration', ...admin, declaration, (_req, res) => {
    res.json({ declaration: setDeclarationText(deps.db, currentUser(res).id, declaration.body(res).text) });
  });
  return router;
}
