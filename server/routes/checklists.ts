import { Router } from 'express';

import {
  checklistTemplateCreateSchema,
  checklistTemplateListQuerySchema,
  checklistTemplatePutSchema,
  checklistVersionParamsSchema,
  idParamsSchema,
} from '@/features/registry/schema';
import { nowOf, type ApiDeps } from '@/server/deps';
import { currentUser, requireAuth, requireRole } from '@/server/auth/require-auth';
import { validate } from '@/server/http/validate';
import {
  archiveChecklistTemplate,
  createChecklistTemplate,
  listChecklistTemplates,
  listChecklistVersions,
  mustFindChecklistTemplate,
  updateChecklistTemplate,
} from '@/server/registry/checklists';

const byId = validate({ params: idParamsSchema });
const byVersion = validate({ params: checklistVersionParamsSchema });
const listInput = validate({ query: checklistTemplateListQuerySchema });
const createInput = validate({ body: checklistTemplateCreateSchema });
const putInput = validate({ params: idParamsSchema, body: checklistTemplatePutSchema });

/**
 * Checklist templates per ride class, versioned like design data. Staff read; admins and supervisors edit.
 *
 * - `GET /checklist-templates?rideClass=&includeArchived=` → `{ templates: ChecklistTemplateSummary[] }`
 * - `GET /checklist-templates/:id` → `{ template }` (with its current version's areas and items)
 * - `POST /checklist-templates` `{ name, rideClass, content, reason? }` → 201 `{ template }`
 * - `PUT /checklist-templates/:id` `{ name?, content, reason, basedOnVersion? }` → `{ template }` (new version)
 * - `DELETE /checklist-templates/:id` → 204 (archived; its versions stay readable)
 * - `GET /checklist-templates/:id/versions` → `{ versions }`; `…/versions/:version` → `{ template }`
 */
export function checklistsRouter(deps: ApiDeps): Router {
  const router = Router();
  const readers = [requireAuth(deps), requireRole('admin', 'supervisor', 'inspector')];
  const editors = [requireAuth(deps), requireRole('admin', 'supervisor')];

  router.get('/checklist-templates', ...readers, listInput, (_req, res) => {
    res.json({ templates: listChecklistTemplates(deps.db, listInput.query(res)) });
  });
  router.get('/checklist-templates/:id', ...readers, byId, (_req, res) => {
    res.json({ template: mustFindChecklistTemplate(deps.db, byId.params(res).id) });
  });
  router.post('/checklist-templates', ...editors, createInput, (_req, res) => {
    res
      .status(201)
      .json({ template: createChecklistTemplate(deps.db, currentUser(res).id, createInput.body(res)) });
  });
  router.put('/checklist-templates/:id', ...editors, putInput, (_req, res) => {
    const template = updateChecklistTemplate(
      deps.db,
      currentUser(res).id,
      putInput.params(res).id,
      putInput.body(res),
    );
    res.json({ template });
  });
  router.delete('/checklist-templates/:id', ...editors, byId, (_req, res) => {
    archiveChecklistTemplate(deps.db, currentUser(res).id, byId.params(res).id, nowOf(deps));
    res.status(204).end();
  });
  router.get('/checklist-templates/:id/versions', ...readers, byId, (_req, res) => {
    res.json({ versions: listChecklistVersions(deps.db, byId.params(res).id) });
  });
  router.get('/checklist-templates/:id/versions/:version', ...readers, byVersion, (_req, res) => {
    const { id, version } = byVersion.params(res);
    res.json({ template: mustFindChecklistTemplate(deps.db, id, version) });
  });
  return router;
}
