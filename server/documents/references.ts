/**
 * Who besides the inspection body's staff may read a stored document. A document carries no owner of its
 * own: an operator reads it when a record of one of their company's rides refers to it (a design-data
 * version's documents, a part replacement's certificates, a bulletin for the ride's model…). Each kind of
 * record that refers to documents adds one check here.
 */
import { eq } from 'drizzle-orm';

import { bulletinModels, bulletins } from '@/db/server/bulletins';
import { rides } from '@/db/server/schema';
import { bulletinApplies } from '@/features/bulletins/schema';
import type { Db } from '@/server/db';

/** Whether a record on one of `companyId`'s rides refers to the document `sha256`. */
export type DocumentReference = (db: Pick<Db, 'select'>, companyId: string, sha256: string) => boolean;

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

export const operatorDocumentReferences: readonly DocumentReference[] = [bulletinOfTheirRide];

export function operatorMayReadDocument(db: Pick<Db, 'select'>, companyId: string, sha256: string): boolean {
  return operatorDocumentReferences.some((refers) => refers(db, companyId, sha256));
}
