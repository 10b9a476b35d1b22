/**
 * Documents attached to design-data versions, and part replacements with their certificates. Both refer
 * to PDFs in the documents store (`db/server/documents.ts`) by SHA-256; the file is uploaded first.
 */
import { randomUUID } from 'node:crypto';

import { sql } from 'drizzle-orm';
import { check, index, integer, primaryKey, sqliteTable, text } from 'drizzle-orm/sqlite-core';

import { documents } from '@/db/server/documents';
import { designVersions, rides, users } from '@/db/server/schema';
import { designDocumentKinds } from '@/lib/vocabulary';
import { col, oneOf } from '@/db/server/checks';

/**
 * One document on one design-data version. When a new version is made, the attachments of the version
 * it was made from are copied to it (`carriedFromId` names the row copied, `firstVersion` the version it
 * was first attached to), so a maker's manual stays with the ride across revisions until someone removes
 * it. Removing detaches: `detachedAt`/`detachedBy` are set (and the audit log says so); the row and the
 * file stay, and earlier versions keep their own rows.
 */
export const designDocuments = sqliteTable(
  'design_documents',
  {
    id: text('id')
      .primaryKey()
      .$defaultFn(() => randomUUID()),
    rideId: text('ride_id')
      .notNull()
      .references(() => rides.id, { onDelete: 'restrict' }),
    designVersionId: text('design_version_id')
      .notNull()
      .references(() => designVersions.id, { onDelete: 'restrict' }),
    /** The version number of `designVersionId`, kept here for the ride's lists. */
    version: integer('version').notNull(),
    sha256: text('sha256')
      .notNull()
      .references(() => documents.sha256, { onDelete: 'restrict' }),
    kind: text('kind', { enum: designDocumentKinds }).notNull(),
    title: text('title').notNull(),
    /** The document's own revision or issue ("Rev. C", "Issue 4"); null when it has none. */
    revision: text('revision'),
    issuedOn: text('issued_on'),
    /** The version the document was first attached to (this one, or an earlier one it was carried from). */
    firstVersion: integer('first_version').notNull(),
    carriedFromId: text('carried_from_id'),
    attachedBy: text('attached_by')
      .notNull()
      .references(() => users.id, { onDelete: 'restrict' }),
    /** When the document was first attached (kept when carried). */
    attachedAt: text('attached_at').notNull(),
    /** When this row was written: the attachment itself, or the new version's carrying it over. */
    createdAt: text('created_at').notNull(),
    detachedBy: text('detached_by').references(() => users.id, { onDelete: 'restrict' }),
    detachedAt: text('detached_at'),
  },
  (t) => [
    check('design_documents_kind_check', oneOf(t.kind, designDocumentKinds)),
    check('design_documents_version_check', sql`${col(t.version)} >= ${col(t.firstVersion)}`),
    index('design_documents_version_idx').on(t.designVersionId),
    index('design_documents_ride_idx').on(t.rideId, t.version),
    index('design_documents_sha_idx').on(t.sha256),
  ],
);

/**
 * A part fitted to a ride, as its fitter reported it. Rows are only added: a wrong record is corrected by
 * a later one that names it (`correctsId`), so what was reported and when stays whole.
 */
export const partReplacements = sqliteTable(
  'part_replacements',
  {
    id: text('id')
      .primaryKey()
      .$defaultFn(() => randomUUID()),
    rideId: text('ride_id')
      .notNull()
      .references(() => rides.id, { onDelete: 'restrict' }),
    component: text('component').notNull(),
    /** The pivot of the design in force it was fitted at (its joint number), null for elsewhere. */
    joint: integer('joint'),
    /** The pivot's name in the design in force when recorded ("Main pivot"). */
    pivotName: text('pivot_name'),
    serialNumber: text('serial_number').notNull(),
    maker: text('maker').notNull(),
    fittedOn: text('fitted_on').notNull(),
    /** Who fitted it: a person and/or company, usually not a Pivotwatch user. */
    fittedBy: text('fitted_by').notNull(),
    /** The serial number of the part taken out, when known. */
    replacedSerial: text('replaced_serial'),
    note: text('note'),
    /** The earlier record of the same ride this one corrects. */
    correctsId: text('corrects_id'),
    createdBy: text('created_by')
      .notNull()
      .references(() => users.id, { onDelete: 'restrict' }),
    createdAt: text('created_at').notNull(),
  },
  (t) => [
    check('part_replacements_joint_check', sql`${col(t.joint)} IS NULL OR ${col(t.joint)} >= 0`),
    index('part_replacements_ride_idx').on(t.rideId, t.fittedOn),
  ],
);

/** The PDFs of a part replacement (certificates of conformity, material certificates), in the order given. */
export const partReplacementDocuments = sqliteTable(
  'part_replacement_documents',
  {
    replacementId: text('replacement_id')
      .notNull()
      .references(() => partReplacements.id, { onDelete: 'restrict' }),
    sha256: text('sha256')
      .notNull()
      .references(() => documents.sha256, { onDelete: 'restrict' }),
    /** What the file is, in the recorder's words ("Certificate of conformity"). */
    title: text('title').notNull(),
    position: integer('position').notNull(),
  },
  (t) => [
    primaryKey({ columns: [t.replacementId, t.sha256] }),
    index('part_replacement_documents_sha_idx').on(t.sha256),
  ],
);
