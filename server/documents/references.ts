/**
 * Who besides the inspection body's staff may read a stored document. A document carries no owner of its
 * own: an operator reads it when a record of one of their company's rides refers to it (a design-data
 * version's documents, a part replacement's certificates, a bulletin for the ride's model…). Each kind of
 * record that refers to documents adds one check here.
 */
import { and, eq, isNull } from 'drizzle-orm';

import { bulletinModels, bulletins } from '@/db/server/bulletins';
import { designDocuments, partReplacementDocuments, partReplacements } from '@/db/server/parts';
import { rides } from '@/db/server/schema';
import { bulletinApplies } from '@/features/bulletins/schema';
import type { Db } from '@/server/db';

/** Whether a record on one of `companyId`'s rides refers to the document `sha256`. */
export type DocumentReference = (db: Pick<Db, 'select'>, companyId: string, sha256: string) => boolean;

/** Attached (not removed) to a design-data version of one of the company's rides. */
const onDesignVersion: DocumentReference = (db, companyId, sha256) =>
  db
    .select({ id: designDocuments.id })
    .from(designDocuments)
    .innerJoin(rides, eq(rides.id, designDocuments.rideId))
    .where(
      and(
        eq(designDocuments.sha256, sha256),
        isNull(designDocuments.detachedAt),
        eq(rides.operatorCompanyId, companyId),
      ),
    )
    .limit(1)
    .get() !== undefined;

/** A certificate of a part replacement on one of the company's rides. */
const onPartReplacement: DocumentReference = (db, companyId, sha256) =>
  db
    .select({ id: partReplacements.id })
    .from(partReplacementDocuments)
    .innerJoin(partReplacements, eq(partReplacements.id, partReplacementDocuments.replacementId))
    .innerJoin(rides, eq(rides.id, partReplacements.rideId))
    .where(and(eq(partReplacementDocuments.sha256, sha256), eq(rides.operatorCompanyId, companyId)))
    .limit(1)
    .get() !== undefined;

/** A maker's bulletin whose PDF this is applies to one of the company's rides (by maker and model). */
const bulletinOfTheirRide: DocumentReference = (db, companyId, sha256) => {
  const found = db
    .select({ id: bulletins.id, maker: bulletins.maker })
    .from(bulletins)
    .where(eq(bulletins.documentSha256, sha256))
    .all();
  if (!found.length) return false;
  const theirs = db
    .select({ maker: rides.maker, model: rides.model })
    .from(rides)
    .where(eq(rides.operatorCompanyId, companyId))
    .all();
  return found.some((b) => {
    const models = db
      .select({ model: bulletinModels.model })
      .from(bulletinModels)
      .where(eq(bulletinModels.bulletinId, b.id))
      .all()
      .map((m) => m.model);
    return theirs.some((r) => bulletinApplies({ maker: b.maker, models }, r));
  });
};

export const operatorDocumentReferences: readonly DocumentReference[] = [
  onDesignVersion,
  onPartReplacement,
  bulletinOfTheirRide,
];

export function operatorMayReadDocument(db: Pick<Db, 'select'>, companyId: string, sha256: string): boolean {
  return operatorDocumentReferences.some((refers) => refers(db, companyId, sha256));
}
