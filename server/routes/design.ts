import express, { Router, type Request } from 'express';

import { zodIssues } from '@/lib/api-errors';
import { designToFile, parseDesignFile } from '@/features/registry/csv';
import {
  type DesignFileFormat,
  designDecisionBodySchema,
  designExportQuerySchema,
  designImportBodySchema,
  designImportQuerySchema,
  designPutBodySchema,
  designVersionParamsSchema,
  idParamsSchema,
  type DesignVersion,
} from '@/features/registry/schema';
import { nowOf, type ApiDeps } from '@/server/deps';
import { HttpError } from '@/server/http/errors';
import { currentUser, requireAuth, requireRole } from '@/server/auth/require-auth';
import { validate } from '@/server/http/validate';
import {
  createDesignVersion,
  decideDesignVersion,
  findDesignVersion,
  findPendingDesignVersion,
  listDesignVersions,
  mustFindDesignVersion,
} from '@/server/registry/design';
import { refreshRideLifeFlagsAfter } from '@/server/pivot-life/flags';
import { mustFindRide } from '@/server/registry/rides';

const byRide = validate({ params: idParamsSchema });
const byVersion = validate({ params: designVersionParamsSchema });
const putInput = validate({ params: idParamsSchema, body: designPutBodySchema });
const importQuery = validate({ params: idParamsSchema, query: designImportQuerySchema });
const exportInput = validate({ params: idParamsSchema, query: designExportQuerySchema });
const decisionInput = validate({ params: designVersionParamsSchema, body: designDecisionBodySchema });

/** CSV and plain-text uploads; JSON bodies are parsed by the app's JSON parser already. */
const textBody = express.text({ type: ['text/csv', 'text/plain', 'application/csv'], limit: '2mb' });

type ImportRequest = { format: DesignFileFormat; content: unknown; reason: string; basedOnVersion?: number };

/** The upload, from a JSON body `{ format, content, reason }` or a text body with the rest in the query. */
function importRequest(req: Request, query: ReturnType<typeof importQuery.query>): ImportRequest {
  const invalid = (issues: { path: string; message: string }[]) =>
    new HttpError(400, 'validation_failed', 'Some fields are missing or invalid.', issues);
  if (typeof req.body === 'string') {
    if (!query.reason && !query.dryRun)
      throw invalid([{ path: 'query.reason', message: 'Say why (the reason)' }]);
    return {
      format: query.format ?? 'csv',
      content: req.body,
      reason: query.reason ?? '',
      basedOnVersion: query.basedOnVersion,
    };
  }
  if (req.body === undefined)
    throw new HttpError(
      415,
      'unsupported_media_type',
      'Send the file as text (Content-Type text/csv) or as JSON { format, content, reason }.',
    );
  const schema = query.dryRun ? designImportBodySchema.partial({ reason: true }) : designImportBodySchema;
  const parsed = schema.safeParse(req.body);
  if (!parsed.success) throw invalid(zodIssues(parsed.error));
  return { ...parsed.data, reason: parsed.data.reason ?? '' };
}

/** A file name from the ride's name: letters, digits and dashes only. */
const fileSlug = (name: string) =>
  name
    .normalize('NFKD')
    .replace(/[^A-Za-z0-9]+/g, '-')
    .replace(/^-|-$/g, '')
    .toLowerCase() || 'ride';

/**
 * A ride's design data and its versions. Staff read (admin, supervisor, inspector); admins and supervisors
 * make new versions; operators may not see design data at all (403, before the ride is even looked up).
 *
 * - `GET /rides/:id/design` → `{ design: DesignVersion | null }` (the current version)
 * - `PUT /rides/:id/design` `{ reason, data, basedOnVersion? }` → 201 `{ design }`: a new version; 409
 *   `version_conflict` when `basedOnVersion` is not the current one, 409 `design_unchanged` for no change
 * - `GET /rides/:id/design/versions` → `{ versions: DesignVersionInfo[] }`, newest first
 * - `GET /rides/:id/design/versions/:version` → `{ design }`; versions never change
 * - `POST /rides/:id/design/import` (admin, supervisor): a CSV or JSON file, checked whole; any problem →
 *   400 `import_invalid` with every issue's row and column, nothing saved; else 201 `{ design }` (a new
 *   version). `?dryRun=true` only checks: 200 `{ ok: true, data }`.
 * - `GET /rides/:id/design/export?format=csv|json&version=` → the file (current version by default)
 *
 * A new version (edited or imported) that loosens any limit of the version in force is stored as
 * `approvalState: 'pending'` and does not take effect: "current" everywhere means the version in force.
 * - `GET /rides/:id/design/pending` (admin, supervisor) → `{ pending, current }` (either may be null)
 * - `POST /rides/:id/design/versions/:version/decision` (admin, supervisor, never the proposer)
 *   `{ decision: 'approve'|'reject', reason }` → `{ design }`; 403 `own_revision`, 409 `design_not_pending`
 * Inspectors never see a pending revision (not listed, 404 by number).
 */
export function designRouter(deps: ApiDeps): Router {
  const router = Router();
  const readers = [requireAuth(deps), requireRole('admin', 'supervisor', 'inspector')];
  const editors = [requireAuth(deps), requireRole('admin', 'supervisor')];

  router.get('/rides/:id/design', ...readers, byRide, (_req, res) => {
    const ride = mustFindRide(deps.db, byRide.params(res).id);
    const design: DesignVersion | null = findDesignVersion(deps.db, ride.id);
    res.json({ design });
  });

  router.get('/rides/:id/design/pending', ...editors, byRide, (_req, res) => {
    const ride = mustFindRide(deps.db, byRide.params(res).id);
    res.json({
      pending: findPendingDesignVersion(deps.db, ride.id),
      current: findDesignVersion(deps.db, ride.id),
    });
  });

  router.post('/rides/:id/design/versions/:version/decision', ...editors, decisionInput, (_req, res) => {
    const { id, version } = decisionInput.params(res);
    const design = decideDesignVersion(deps.db, currentUser(res), id, version, decisionInput.body(res));
    refreshRideLifeFlagsAfter(deps.db, id, nowOf(deps)); // an approval changes the NDT plans in force
    res.json({ design });
  });

  router.put('/rides/:id/design', ...editors, putInput, (_req, res) => {
    const { reason, data, basedOnVersion } = putInput.body(res);
    const design = createDesignVersion(deps.db, currentUser(res).id, putInput.params(res).id, {
      reason,
      data,
      basedOnVersion,
      origin: 'editor',
    });
    refreshRideLifeFlagsAfter(deps.db, putInput.params(res).id, nowOf(deps));
    res.status(201).json({ design });
  });

  router.post('/rides/:id/design/import', ...editors, textBody, importQuery, (req, res) => {
    const rideId = importQuery.params(res).id;
    const query = importQuery.query(res);
    const ride = mustFindRide(deps.db, rideId);
    const upload = importRequest(req, query);
    const result = parseDesignFile(upload.format, upload.content);
    if (!result.ok) {
      const n = result.issues.length;
      throw new HttpError(
        400,
        'import_invalid',
        `The file has ${n} problem${n === 1 ? '' : 's'}; nothing was saved.`,
        result.issues,
      );
    }
    if (query.dryRun) {
      res.json({ ok: true, data: result.data });
      return;
    }
    const design = createDesignVersion(deps.db, currentUser(res).id, ride.id, {
      reason: upload.reason,
      data: result.data,
      basedOnVersion: upload.basedOnVersion,
      origin: upload.format === 'csv' ? 'import_csv' : 'import_json',
    });
    refreshRideLifeFlagsAfter(deps.db, ride.id, nowOf(deps));
    res.status(201).json({ design });
  });

  router.get('/rides/:id/design/export', ...readers, exportInput, (_req, res) => {
    const { format, version } = exportInput.query(res);
    const ride = mustFindRide(deps.db, exportInput.params(res).id);
    const design = mustFindDesignVersion(deps.db, ride.id, version);
    if (design.approvalState === 'pending' && currentUser(res).role === 'inspector')
      throw new HttpError(404, 'not_found', `No design data version ${version}.`);
    const fileName = `${fileSlug(ride.name)}-design-v${design.version}.${format}`;
    res
      .type(format === 'csv' ? 'text/csv; charset=utf-8' : 'application/json; charset=utf-8')
      .attachment(fileName)
      .send(designToFile(format, design.data));
  });

  router.get('/rides/:id/design/versions', ...readers, byRide, (_req, res) => {
    const ride = mustFindRide(deps.db, byRide.params(res).id);
    const withPending = currentUser(res).role !== 'inspector';
    res.json({ versions: listDesignVersions(deps.db, ride.id, { withPending }) });
  });

  router.get('/rides/:id/design/versions/:version', ...readers, byVersion, (_req, res) => {
    const { id, version } = byVersion.params(res);
    const ride = mustFindRide(deps.db, id);
    const design = mustFindDesignVersion(deps.db, ride.id, version);
    if (design.approvalState === 'pending' && currentUser(res).role === 'inspector')
      throw new HttpError(404, 'not_found', `No design data version ${version}.`);
    res.json({ design });
  });

  return router;
}
