/**
 * What a ride's logbook shows of its parts and design documents: one row per event, newest first, with
 * the date, who, a one-line summary and the PDFs it refers to (each readable at `/api/documents/:sha256`
 * by whoever may read the ride).
 */
import type { Db } from '@/server/db';
import { partReplacementsOfRide } from '@/server/parts/replacements';

export { designDocumentEventsOfRide, type DesignDocumentEvent } from '@/server/registry/design-documents';

export type PartReplacementLogRow = {
  id: string;
  /** The day the part was fitted (YYYY-MM-DD, the site's calendar). */
  on: string;
  /** When the record was made (ISO instant). */
  recordedAt: string;
  /** Who fitted the part, as recorded (a person or company, usually not a Pivotwatch user). */
  fittedBy: string;
  recordedByName: string | null;
  /** "Gondola hanger pin at Main pivot: serial HP-2291 by Ostrava Pins, replacing HP-1870". */
  summary: string;
  /** The earlier record this one corrects, and the later one correcting it. */
  correctsId: string | null;
  correctedById: string | null;
  documentSha256s: string[];
};

/** A ride's part replacements as logbook rows, newest fitted first. */
export function partReplacementLogRows(db: Pick<Db, 'select'>, rideId: string): PartReplacementLogRow[] {
  return partReplacementsOfRide(db, rideId).map((r) => ({
    id: r.id,
    on: r.fittedOn,
    recordedAt: r.createdAt,
    fittedBy: r.fittedBy,
    recordedByName: r.createdByName,
    summary:
      `${r.component}${r.pivotName ? ` at ${r.pivotName}` : ''}: serial ${r.serialNumber} by ${r.maker}` +
      (r.replacedSerial ? `, replacing ${r.replacedSerial}` : '') +
      (r.correctsId ? ' (corrects an earlier record)' : ''),
    correctsId: r.correctsId,
    correctedById: r.correctedById,
    documentSha256s: r.documents.map((d) => d.sha256),
  }));
}
