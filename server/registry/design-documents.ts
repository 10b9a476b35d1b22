/**
 * Documents on design-data versions: design reports, makers' manuals, drawings, certificates. Each
 * version has its own rows (`design_documents`); a new version starts with the documents of the version it
 * was made from (`carryDesignDocuments`), so a manual stays with the ride across revisions until someone
 * removes it. Removing detaches the row from that version only (audited); the file stays stored.
 */
import { randomUUID } from 'node:crypto';

import { and, asc, desc, eq, gt, isNull } from 'drizzle-orm';
import { alias } from 'drizzle-orm/sqlite-core';

import { designDocuments } from '@/db/server/parts';
import { users } from '@/db/server/schema';
import type { DesignDocument, DesignDocumentInput } from '@/features/registry/schema';
import { designDocumentKindVocabulary, type DesignDocumentKind } from '@/lib/vocabulary';
import type { Db } from '@/server/db';
import { missingDocument } from '@/server/documents/store';
import { HttpError, conflict, notFound } from '@/server/http/errors';
import { recordAudit } from '@/server/registry/audit';

type Reader = Pick<Db, 'select'>;

const attacher = alias(users, 'attacher');
const detacher = alias(users, 'detacher');

const columns = {
  id: designDocuments.id,
  rideId: designDocuments.rideId,
  version: designDocuments.version,
  sha256: designDocuments.sha256,
  kind: designDocuments.kind,
  title: designDocuments.title,
  revision: designDocuments.revision,
  issuedOn: designDocuments.issuedOn,
  firstVersion: designDocuments.firstVersion,
  attachedAt: designDocuments.attachedAt,
  attachedByName: attacher.name,
  detachedAt: designDocuments.detachedAt,
  detachedByName: detacher.name,
};

function selectDocuments(db: Reader) {
  return db
    .select(columns)
    .from(designDocuments)
    .leftJoin(attacher, eq(attacher.id, designDocuments.attachedBy))
    .leftJoin(detacher, eq(detacher.id, designDocuments.detachedBy));
}

/** The documents attached to a design version now (not removed), oldest attachment first. */
export function versionDocuments(db: Reader, designVersionId: string): DesignDocument[] {
  return selectDocuments(db)
    .where(and(eq(designDocuments.designVersionId, designVersionId), isNull(designDocuments.detachedAt)))
    .orderBy(asc(designDocuments.attachedAt), asc(designDocuments.title))
    .all();
}

const problem = (path: string, message: string) =>
  new HttpError(400, 'validation_failed', message, [{ path, message }]);

type VersionRef = { id: string; version: number; approvalState?: string };
type Ride = { id: string; name: string };

/**
 * Attaches a stored PDF to one design version, with its audit entry. 400 naming `sha256` when the file
 * was not uploaded first; 409 `already_attached` when the version already has it; a rejected revision
 * takes no documents (409 `design_rejected`).
 */
export function attachDesignDocument(
  db: Db,
  userId: string,
  ride: Ride,
  version: VersionRef,
  input: DesignDocumentInput,
  now: Date,
): DesignDocument {
  return db.transaction((tx) => {
    if (version.approvalState === 'rejected')
      throw conflict(
        `Version ${version.version} was rejected; attach documents to the version in force.`,
        'design_rejected',
      );
    if (missingDocument(tx, [input.sha256]))
      throw problem('sha256', 'No document with this SHA-256 is stored; upload the PDF first.');
    const already = tx
      .select({ id: designDocuments.id })
      .from(designDocuments)
      .where(
        and(
          eq(designDocuments.designVersionId, version.id),
          eq(designDocuments.sha256, input.sha256),
          isNull(designDocuments.detachedAt),
        ),
      )
      .get();
    if (already)
      throw conflict(`This PDF is attached to version ${version.version} already.`, 'already_attached');
    const id = randomUUID();
    const at = now.toISOString();
    const row = {
      id,
      rideId: ride.id,
      designVersionId: version.id,
      version: version.version,
      sha256: input.sha256,
      kind: input.kind,
      title: input.title,
      revision: input.revision ?? null,
      issuedOn: input.issuedOn ?? null,
      firstVersion: version.version,
      attachedBy: userId,
      attachedAt: at,
      createdAt: at,
    };
    tx.insert(designDocuments).values(row).run();
    recordAudit(tx, {
      userId,
      entity: 'design',
      entityId: id,
      action: 'create',
      rideId: ride.id,
      summary:
        `${ride.name}: ${designDocumentKindVocabulary[input.kind].label.toLowerCase()} “${input.title}” ` +
        `attached to design data version ${version.version}`,
      after: {
        version: version.version,
        kind: input.kind,
        title: input.title,
        revision: row.revision,
        issuedOn: row.issuedOn,
        sha256: input.sha256,
      },
    });
    return mustFindDocument(tx, id);
  });
}

function mustFindDocument(db: Reader, id: string): DesignDocument {
  const found = selectDocuments(db).where(eq(designDocuments.id, id)).get();
  if (!found) throw notFound('No such document on this design version.');
  return found;
}

/**
 * Removes a document from one version (earlier versions keep theirs, later ones made from this version
 * no longer carry it), with its audit entry. 404 when the version has no such attachment now.
 */
export function detachDesignDocument(
  db: Db,
  userId: string,
  ride: Ride,
  version: VersionRef,
  documentId: string,
  now: Date,
): DesignDocument {
  return db.transaction((tx) => {
    const row = tx
      .select()
      .from(designDocuments)
      .where(
        and(
          eq(designDocuments.id, documentId),
          eq(designDocuments.designVersionId, version.id),
          isNull(designDocuments.detachedAt),
        ),
      )
      .get();
    if (!row) throw notFound(`Design data version ${version.version} has no such document attached.`);
    tx.update(designDocuments)
      .set({ detachedAt: now.toISOString(), detachedBy: userId })
      .where(eq(designDocuments.id, row.id))
      .run();
    const described = {
      version: row.version,
      kind: row.kind,
      title: row.title,
      revision: row.revision,
      issuedOn: row.issuedOn,
      sha256: row.sha256,
    };
    recordAudit(tx, {
      userId,
      entity: 'design',
      entityId: row.id,
      action: 'delete',
      rideId: ride.id,
      summary:
        `${ride.name}: ${designDocumentKindVocabulary[row.kind].label.toLowerCase()} “${row.title}” removed ` +
        `from design data version ${row.version} (the file stays stored)`,
      before: described,
      after: null,
    });
    return mustFindDocument(tx, row.id);
  });
}

/**
 * Copies the documents attached to version `from` onto the new version `to` (same transaction as the
 * version's insert). With `createdAfter`, only rows written after that instant: when a pending revision is
 * approved, the documents attached to the version it replaces while it waited follow it too.
 */
export function carryDesignDocuments(
  tx: Pick<Db, 'select' | 'insert'>,
  from: { id: string },
  to: { id: string; version: number },
  now: Date,
  createdAfter?: string,
): number {
  const rows = tx
    .select()
    .from(designDocuments)
    .where(
      and(
        eq(designDocuments.designVersionId, from.id),
        isNull(designDocuments.detachedAt),
        createdAfter === undefined ? undefined : gt(designDocuments.createdAt, createdAfter),
      ),
    )
    .all();
  const held = new Set(
    tx
      .select({ sha256: designDocuments.sha256 })
      .from(designDocuments)
      .where(and(eq(designDocuments.designVersionId, to.id), isNull(designDocuments.detachedAt)))
      .all()
      .map((r) => r.sha256),
  );
  const at = now.toISOString();
  const carried = rows
    .filter((r) => !held.has(r.sha256))
    .map((r) => ({
      ...r,
      id: randomUUID(),
      designVersionId: to.id,
      version: to.version,
      carriedFromId: r.id,
      createdAt: at,
    }));
  if (carried.length > 0) tx.insert(designDocuments).values(carried).run();
  return carried.length;
}

/** One line of a ride's logbook about its design documents: attached to a version, or removed from one. */
export type DesignDocumentEvent = {
  /** ISO instant of the attachment or removal. */
  at: string;
  action: 'attached' | 'removed';
  /** Who attached or removed it (a Pivotwatch user). */
  byName: string | null;
  version: number;
  kind: DesignDocumentKind;
  title: string;
  revision: string | null;
  issuedOn: string | null;
  /** "Maker’s manual “Skylark operation and maintenance” (Rev. C) attached to design data version 2". */
  summary: string;
  documentSha256s: string[];
};

/**
 * For the ride's logbook: every attachment of a document to a design version (carried copies are not
 * repeated: a new version's carrying them over is the version's own event) and every removal, newest
 * first.
 */
export function designDocumentEventsOfRide(db: Reader, rideId: string): DesignDocumentEvent[] {
  const rows = db
    .select({ ...columns, carriedFromId: designDocuments.carriedFromId })
    .from(designDocuments)
    .leftJoin(attacher, eq(attacher.id, designDocuments.attachedBy))
    .leftJoin(detacher, eq(detacher.id, designDocuments.detachedBy))
    .where(eq(designDocuments.rideId, rideId))
    .orderBy(desc(designDocuments.createdAt))
    .all();
  const events: DesignDocumentEvent[] = [];
  for (const r of rows) {
    const what =
      `${designDocumentKindVocabulary[r.kind].label} “${r.title}”` + (r.revision ? ` (${r.revision})` : '');
    const base = {
      version: r.version,
      kind: r.kind,
      title: r.title,
      revision: r.revision,
      issuedOn: r.issuedOn,
      documentSha256s: [r.sha256],
    };
    if (r.carriedFromId === null)
      events.push({
        ...base,
        at: r.attachedAt,
        action: 'attached',
        byName: r.attachedByName,
        summary: `${what} attached to design data version ${r.version}`,
      });
    if (r.detachedAt !== null)
      events.push({
        ...base,
        at: r.detachedAt,
        action: 'removed',
        byName: r.detachedByName,
        summary: `${what} removed from design data version ${r.version}`,
      });
  }
  return events.sort((a, b) => b.at.localeCompare(a.at));
}
