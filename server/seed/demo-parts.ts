/**
 * The demo's documents and parts on Skylark: an invented maker's manual attached to its design data in
 * force, and two part replacements (one by the operator's fitter with a certificate of conformity, one a
 * bushing fitted by the maker's service team). The PDFs are drawn here with pdfkit and stored like any
 * upload. Added only while Skylark has no design documents and no part replacements, so it is safe to run
 * again. Every name is invented.
 */
import { createHash } from 'node:crypto';

import { count, eq } from 'drizzle-orm';

import { designDocuments, partReplacements } from '@/db/server/parts';
import { rides, users } from '@/db/server/schema';
import { addDays, dayInZone } from '@/lib/dates';
import type { Db } from '@/server/db';
import { storeDocument } from '@/server/documents/store';
import { addPartReplacement } from '@/server/parts/replacements';
import { startPdf } from '@/server/pdf/document';
import { findDesignVersion } from '@/server/registry/design';
import { rideTimeZone } from '@/server/schedule-due';
import type { ObjectStorage } from '@/server/storage';

const SKYLARK_SERIAL = 'ORW-PX15-0412';

/** A short PDF of headed paragraphs, dated `createdAt` so the same text gives the same bytes. */
async function demoPdf(title: string, paragraphs: string[], createdAt: string): Promise<Buffer> {
  const { doc, finished } = startPdf({
    size: 'A4',
    margins: 56,
    title,
    author: 'Pivotwatch demo (invented document)',
    subject: title,
    createdAt,
  });
  doc.fontSize(18).text(title);
  doc.moveDown();
  doc.fontSize(11);
  for (const p of paragraphs) {
    doc.text(p);
    doc.moveDown(0.6);
  }
  doc.moveDown();
  doc.fontSize(9).text('Invented for the Pivotwatch demo. Not a real document of any maker.');
  doc.end();
  return finished;
}

async function store(db: Db, storage: ObjectStorage, bytes: Buffer, userId: string, now: Date) {
  const sha256 = createHash('sha256').update(bytes).digest('hex');
  await storeDocument(db, storage, { sha256, bytes, userId }, now);
  return sha256;
}

export async function storeDemoParts(db: Db, storage: ObjectStorage, now: Date): Promise<void> {
  const ride = db
    .select({ id: rides.id, name: rides.name })
    .from(rides)
    .where(eq(rides.serial, SKYLARK_SERIAL))
    .get();
  if (!ride) return;
  const design = findDesignVersion(db, ride.id);
  const has = (table: typeof designDocuments | typeof partReplacements) =>
    (db.select({ n: count() }).from(table).where(eq(table.rideId, ride.id)).get()?.n ?? 0) > 0;
  if (!design || has(designDocuments) || has(partReplacements)) return;
  const userOf = (email: string) =>
    db.select({ id: users.id }).from(users).where(eq(users.email, email)).get()?.id;
  const supervisor = userOf('supervisor@pivotwatch.test');
  const operator = userOf('operator@pivotwatch.test');
  const inspector = userOf('inspector@pivotwatch.test');
  if (!supervisor || !operator || !inspector) return;
  const today = dayInZone(now, rideTimeZone(db, ride.id));

  const manual = await demoPdf(
    'Skylark PX-15 — operation and maintenance manual, issue 4',
    [
      'Orrin Ride Works, model PX-15 pendulum swing with turning ring gondola.',
      'Chapter 6, pivots: the main pivot pin and the gondola hanger pins are inspected for wear at every ' +
        'annual inspection; pins are replaced as a set when the clearance reaches the limit in the design ' +
        'data. Replacement pins come with a certificate of conformity naming the material batch.',
      'Chapter 7, daily checks: see the operator’s daily check list before the first ride of the day.',
    ],
    '2024-03-18T09:00:00Z',
  );
  const certificate = await demoPdf(
    'Certificate of conformity — gondola hanger pin HP-60-2291',
    [
      'Kestrel Pinworks Ltd certifies that the part below conforms to drawing PX15-GH-060 revision D.',
      'Part: gondola hanger pin, 60 mm. Serial: HP-60-2291. Material batch: 4411-B.',
      'Inspection document type 2.1 (declaration of compliance with the order).',
    ],
    `${addDays(today, -20)}T08:00:00Z`,
  );
  const manualSha = await store(db, storage, manual, supervisor, now);
  const certificateSha = await store(db, storage, certificate, operator, now);

  // Written directly, as the rest of the demo is: the seed leaves no audit entries of its own.
  db.insert(designDocuments)
    .values({
      rideId: ride.id,
      designVersionId: design.id,
      version: design.version,
      sha256: manualSha,
      kind: 'makers_manual',
      title: 'Skylark PX-15 operation and maintenance manual',
      revision: 'Issue 4',
      issuedOn: '2024-03-18',
      firstVersion: design.version,
      attachedBy: supervisor,
      attachedAt: now.toISOString(),
      createdAt: now.toISOString(),
    })
    .run();
  const pivot = design.data.pivots[0];
  addPartReplacement(
    db,
    ride.id,
    {
      component: 'Gondola hanger pin',
      joint: pivot?.joint ?? null,
      serialNumber: 'HP-60-2291',
      maker: 'Kestrel Pinworks Ltd',
      fittedOn: addDays(today, -14),
      fittedBy: 'Dale Merriweather, Tamsworth Pier Leisure',
      replacedSerial: 'HP-60-1870',
      note: 'Old pin showed fretting marks at the lug; replaced with its pair.',
      documents: [{ sha256: certificateSha, title: 'Certificate of conformity' }],
    },
    operator,
    now,
    today,
  );
  addPartReplacement(
    db,
    ride.id,
    {
      component: 'Drive wheel bushing',
      joint: null,
      serialNumber: 'DB-115-0078',
      maker: 'Orrin Ride Works',
      fittedOn: addDays(today, -120),
      fittedBy: 'Orrin Ride Works service team (Ansel Brightwater)',
      replacedSerial: undefined,
      note: undefined,
      documents: [],
    },
    inspector,
    now,
    today,
  );
}
