import { Router } from 'express';

import { partReplacementInputSchema, type RideParts } from '@/features/parts/schema';
import {
  designDocumentInputSchema,
  designDocumentParamsSchema,
  designVersionParamsSchema,
  idParamsSchema,
  type VersionDocuments,
} from '@/features/registry/schema';
import { dayInZone } from '@/lib/dates';
import { companyScope } from '@/server/auth/scope';
import { currentUser, requireAuth, requireRole } from '@/server/auth/require-auth';
import { nowOf, type ApiDeps } from '@/server/deps';
import type { Db } from '@/server/db';
import { notFound } from '@/server/http/errors';
import { validate } from '@/server/http/validate';
import { addPartReplacement, rideParts } from '@/server/parts/replacements';
import { findDesignVersion, mustFindDesignVersion } from '@/server/registry/design';
import {
  attachDesignDocument,
  detachDesignDocument,
  versionDocuments,
} from '@/server/registry/design-documents';
import { mustFindRide } from '@/server/registry/rides';
import { rideTimeZone } from '@/server/schedule-due';
import type { SessionUser } from '@/features/session/schema';

const oneRide = validate({ params: idParamsSchema });
const oneVersion = validate({ params: designVersionParamsSchema });
const attachInput = validate({ params: designVersionParamsSchema, body: designDocumentInputSchema });
const oneDocument = validate({ params: designDocumentParamsSchema });
const addPart = validate({ params: idParamsSchema, body: partReplacementInputSchema });

/** A version a person may see: inspectors never see a revision waiting for approval (as the design routes). */
function visibleVersion(db: Pick<Db, 'select'>, user: SessionUser, rideId: string, version: number) {
  const found = mustFindDesignVersion(db, rideId, version);
  if (found.approvalState === 'pending' && user.role === 'inspector')
    throw notFound(`No design data version ${version}.`);
  return found;
}

/**
 * Documents on design-data versions, and part replacements.
 *
 * - `GET /rides/:id/documents` → `VersionDocuments` of the version in force (everyone who may see the ride;
 *   operators only their company's rides, 404 for others').
 * - `GET /rides/:id/design/versions/:version/documents` → `VersionDocuments` (staff).
 * - `POST /rides/:id/design/versions/:version/documents` (supervisor, admin) `designDocumentInputSchema` →
 *   201 `{ document }`; 400 naming the field (a PDF not uploaded first is `sha256`), 409 `already_attached`.
 * - `DELETE /rides/:id/design/versions/:version/documents/:documentId` (supervisor, admin) → `{ document }`
 *   detached from that version, audited; the file stays stored.
 * - `GET /rides/:id/parts` → `RideParts` (everyone who may see the ride, as above).
 * - `POST /rides/:id/parts` (the ride's operator, inspector, supervisor, admin) `partReplacementInputSchema`
 *   → 201 `{ replacement }`; 400 naming the field for a pivot the design lacks, a date after today at the
 *   ride's site, a corrected record not of this ride, or a PDF not uploaded first.
 */
export function partsRouter(deps: ApiDeps): Router {
  const router = Router();
  const auth = requireAuth(deps);
  const staff = requireRole('admin', 'supervisor', 'inspector');
  const editors = requireRole('admin', 'supervisor');

  const siteToday = (rideId: string) => dayInZone(nowOf(deps), rideTimeZone(deps.db, rideId));

  router.get('/rides/:id/documents', auth, oneRide, (_req, res) => {
    const ride = mustFindRide(deps.db, oneRide.params(res).id, companyScope(currentUser(res)));
    const design = findDesignVersion(deps.db, ride.id);
    const body: VersionDocuments = {
      rideId: ride.id,
      rideName: ride.name,
      version: design?.version ?? null,
      documents: design ? versionDocuments(deps.db, design.id) : [],
    };
    res.json(body);
  });

  router.get('/rides/:id/design/versions/:version/documents', auth, staff, oneVersion, (_req, res) => {
    const { id, version } = oneVersion.params(res);
    const ride = mustFindRide(deps.db, id);
    const found = visibleVersion(deps.db, currentUser(res), ride.id, version);
    const body: VersionDocuments = {
      rideId: ride.id,
      rideName: ride.name,
      version: found.version,
      documents: versionDocuments(deps.db, found.id),
    };
    res.json(body);
  });

  router.post('/rides/:id/design/versions/:version/documents', auth, editors, attachInput, (_req, res) => {
    const { id, version } = attachInput.params(res);
    const ride = mustFindRide(deps.db, id);
    const found = mustFindDesignVersion(deps.db, ride.id, version);
    const document = attachDesignDocument(
      deps.db,
      currentUser(res).id,
      ride,
      found,
      attachInput.body(res),
      nowOf(deps),
    );
    res.status(201).json({ document });
  });

  router.delete(
    '/rides/:id/design/versions/:version/documents/:documentId',
    auth,
    editors,
    oneDocument,
    (_req, res) => {
      const { id, version, documentId } = oneDocument.params(res);
      const ride = mustFindRide(deps.db, id);
      const found = mustFindDesignVersion(deps.db, ride.id, version);
      const document = detachDesignDocument(
        deps.db,
        currentUser(res).id,
        ride,
        found,
        documentId,
        nowOf(deps),
      );
      res.json({ document });
    },
  );

  router.get('/rides/:id/parts', auth, oneRide, (_req, res) => {
    const ride = mustFindRide(deps.db, oneRide.params(res).id, companyScope(currentUser(res)));
    const body: RideParts = rideParts(deps.db, ride, siteToday(ride.id));
    res.json(body);
  });

  router.post('/rides/:id/parts', auth, addPart, (_req, res) => {
    const user = currentUser(res);
    // Operators fit parts to their own rides; another company's ride is not there for them (404).
    const ride = mustFindRide(deps.db, addPart.params(res).id, companyScope(user));
    const replacement = addPartReplacement(
      deps.db,
      ride.id,
      addPart.body(res),
      user.id,
      nowOf(deps),
      siteToday(ride.id),
    );
    res.status(201).json({ replacement });
  });

  return router;
}
