import { Router } from 'express';

import {
  companyInputSchema,
  companyListQuerySchema,
  companyPatchSchema,
  idParamsSchema,
  siteInputSchema,
  siteListQuerySchema,
  sitePatchSchema,
  timeZoneSettingInputSchema,
} from '@/features/registry/schema';
import { nowOf, type ApiDeps } from '@/server/deps';
import { notFound } from '@/server/http/errors';
import { currentUser, requireAuth, requireRole } from '@/server/auth/require-auth';
import { patchBody, validate } from '@/server/http/validate';
import {
  createCompany,
  deleteCompany,
  findCompany,
  listCompanies,
  updateCompany,
} from '@/server/registry/companies';
import { createSite, deleteSite, findSite, listSites, updateSite } from '@/server/registry/sites';
import { getTimeZoneSetting, setDefaultTimeZone } from '@/server/registry/time-zone';

const byId = validate({ params: idParamsSchema });

/**
 * Operator companies and sites. The inspection body's staff read them (inspectors need the contacts in the
 * field); only admins change them. Operators use neither: they see their rides through `/rides`.
 *
 * - `GET /companies?q=&sort=name|-name|createdAt|-createdAt&page=&pageSize=` → `{ companies, total, page,
 *   pageSize }`; `GET /companies/:id` → `{ company }`; `POST /companies` → 201 `{ company }`;
 *   `PATCH /companies/:id` → `{ company }`; `DELETE /companies/:id` → 204, 409 while anything is attached.
 * - `GET /sites?q=&operatorId=&kind=&sort=&page=&pageSize=` → `{ sites, total, page, pageSize }`, and the
 *   same five routes as companies. A site's `timeZone` is an IANA name Intl knows, or null for the default.
 * - `GET /settings/time-zone` → `{ timeZone: { zone, updatedAt, updatedByName } }`: the inspection body's
 *   default zone for sites that name none (UTC until set); `PUT` (admins) `{ zone }` → the same, audited.
 */
export function registerRouter(deps: ApiDeps): Router {
  const router = Router();
  const staff = [requireAuth(deps), requireRole('admin', 'supervisor', 'inspector')];
  const admin = [requireAuth(deps), requireRole('admin')];

  const companyList = validate({ query: companyListQuerySchema });
  const companyCreate = validate({ body: companyInputSchema });
  const companyPatch = validate({ params: idParamsSchema, body: patchBody(companyPatchSchema) });

  router.get('/companies', ...staff, companyList, (_req, res) => {
    res.json(listCompanies(deps.db, companyList.query(res)));
  });
  router.get('/companies/:id', ...staff, byId, (_req, res) => {
    const company = findCompany(deps.db, byId.params(res).id);
    if (!company) throw notFound('No such operator company.');
    res.json({ company });
  });
  router.post('/companies', ...admin, companyCreate, (_req, res) => {
    res.status(201).json({ company: createCompany(deps.db, currentUser(res).id, companyCreate.body(res)) });
  });
  router.patch('/companies/:id', ...admin, companyPatch, (_req, res) => {
    const company = updateCompany(
      deps.db,
      currentUser(res).id,
      companyPatch.params(res).id,
      companyPatch.body(res),
    );
    res.json({ company });
  });
  router.delete('/companies/:id', ...admin, byId, (_req, res) => {
    deleteCompany(deps.db, currentUser(res).id, byId.params(res).id);
    res.status(204).end();
  });

  const siteList = validate({ query: siteListQuerySchema });
  const siteCreate = validate({ body: siteInputSchema });
  const sitePatch = validate({ params: idParamsSchema, body: patchBody(sitePatchSchema) });

  router.get('/sites', ...staff, siteList, (_req, res) => {
    res.json(listSites(deps.db, siteList.query(res)));
  });
  router.get('/sites/:id', ...staff, byId, (_req, res) => {
    const site = findSite(deps.db, byId.params(res).id);
    if (!site) throw notFound('No such site.');
    res.json({ site });
  });
  router.post('/sites', ...admin, siteCreate, (_req, res) => {
    res.status(201).json({ site: createSite(deps.db, currentUser(res).id, siteCreate.body(res)) });
  });
  router.patch('/sites/:id', ...admin, sitePatch, (_req, res) => {
    res.json({
      site: updateSite(deps.db, currentUser(res).id, sitePatch.params(res).id, sitePatch.body(res)),
    });
  });
  router.delete('/sites/:id', ...admin, byId, (_req, res) => {
    deleteSite(deps.db, currentUser(res).id, byId.params(res).id);
    res.status(204).end();
  });

  const zoneInput = validate({ body: timeZoneSettingInputSchema });
  router.get('/settings/time-zone', ...staff, (_req, res) => {
    res.json({ timeZone: getTimeZoneSetting(deps.db) });
  });
  router.put('/settings/time-zone', ...admin, zoneInput, (_req, res) => {
    const { zone } = zoneInput.body(res);
    res.json({ timeZone: setDefaultTimeZone(deps.db, currentUser(res).id, zone, nowOf(deps)) });
  });

  return router;
}
