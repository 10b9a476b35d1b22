/**
 * Who besides the inspection body's staff may read a stored document. A document carries no owner of its
 * own: an operator reads it when a record of one of their company's rides refers to it (a design-data
 * version's documents, a part replacement's certificates, a bulletin for the ride's model…). Each kind of
 * record that refers to documents adds one check here.
 */
import type { Db } from '@/server/db';

/** Whether a record on one of `companyId`'s rides refers to the document `sha256`. */
export type DocumentReference = (db: Pick<Db, 'select'>, companyId: string, sha256: string) => boolean;

export const operatorDocumentReferences: readonly DocumentReference[] = [];

export function operatorMayReadDocument(db: Pick<Db, 'select'>, companyId: string, sha256: string): boolean {
  return operatorDocumentReferences.some((refers) => refers(db, companyId, sha256));
}
