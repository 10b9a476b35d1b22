/**
 * Part replacements: what was fitted to a ride, by whom, with which certificates. Rows are only added; a
 * wrong record is corrected by a later one naming it (`correctsId`), and both stay in the ride's history.
 */
import { randomUUID } from 'node:crypto';

import { and, asc, desc, eq, inArray } from 'drizzle-orm';

import { partReplacementDocuments, partReplacements } from '@/db/server/parts';
import { users } from '@/db/server/schema';
import type { PartReplacement, PartReplacementValues, RideParts } from '@/features/parts/schema';
import type { Db } from '@/server/db';
import { missingDocument } from '@/server/documents/store';
import { HttpError } from '@/server/http/errors';
import { findDesignVersion } from '@/server/registry/design';

type Reader = Pick<Db, 'select'>;

const problem = (path: string, message: string) =>
  new HttpError(400, 'validation_failed', message, [{ path, message }]);

/** A ride's part replacements, newest fitted first (then newest recorded), each with its documents. */
export function partReplacementsOfRide(db: Reader, rideId: string): PartReplacement[] {
  const rows = db
    .select({
      id: partReplacements.id,
      rideId: partReplacements.rideId,
      component: partReplacements.component,
      joint: partReplacements.joint,
      pivotName: partReplacements.pivotName,
      serialNumber: partReplacements.serialNumber,
      maker: partReplacements.maker,
      fittedOn: partReplacements.fittedOn,
      fittedBy: partReplacements.fittedBy,
      replacedSerial: partReplacements.replacedSerial,
      note: partReplacements.note,
      correctsId: partReplacements.correctsId,
      createdAt: partReplacements.createdAt,
      createdByName: users.name,
    })
    .from(partReplacements)
    .leftJoin(users, eq(users.id, partReplacements.createdBy))
    .where(eq(partReplacements.rideId, rideId))
    .orderBy(desc(partReplacements.fittedOn), desc(partReplacements.createdAt))
    .all();
  if (rows.length === 0) return [];
  const docs = db
    .select()
    .from(partReplacementDocuments)
    .where(
      inArray(
        partReplacementDocuments.replacementId,
        rows.map((r) => r.id),
      ),
    )
    .orderBy(asc(partReplacementDocuments.position))
    .all();
  const correctedBy = new Map<string, string>();
  // Oldest first, so the latest correction of a record is the one kept.
  for (const r of [...rows].sort((a, b) => a.createdAt.localeCompare(b.createdAt)))
    if (r.correctsId) correctedBy.set(r.correctsId, r.id);
  return rows.map((r) => ({
    ...r,
    correctedById: correctedBy.get(r.id) ?? null,
    documents: docs
      .filter((d) => d.replacementId === r.id)
      .map((d) => ({ sha256: d.sha256, title: d.title })),
  }));
}

/** The pivots of the design data in force, for naming where a part was fitted. */
function pivotsInForce(db: Reader, rideId: string) {
  const design = findDesignVersion(db, rideId);
  return {
    designVersion: design?.version ?? null,
    pivots: (design?.data.pivots ?? []).map((p) => ({ joint: p.joint, name: p.name })),
  };
}

/** `GET /rides/:id/parts`: `today` is the calendar day at the ride's site. */
export function rideParts(db: Reader, ride: { id: string; name: string }, today: string): RideParts {
  return {
    rideId: ride.id,
    rideName: ride.name,
    today,
    ...pivotsInForce(db, ride.id),
    replacements: partReplacementsOfRide(db, ride.id),
  };
}

/**
 * Stores one part replacement after checking it against the ride: a pivot named must be one of the
 * design in force, the date not after `today` at the ride's site, a corrected record must be this ride's,
 * and every PDF must be stored already (400 naming the field; nothing is written).
 */
export function addPartReplacement(
  db: Db,
  rideId: string,
  input: PartReplacementValues,
  userId: string,
  now: Date,
  today: string,
): PartReplacement {
  return db.transaction((tx) => {
    let pivotName: string | null = null;
    if (input.joint !== undefined && input.joint !== null) {
      const { designVersion, pivots } = pivotsInForce(tx, rideId);
      const pivot = pivots.find((p) => p.joint === input.joint);
      if (!pivot)
        throw problem(
          'joint',
          designVersion === null
            ? 'This ride has no design data in force, so no pivots; leave the pivot out.'
            : `The design data in force (version ${designVersion}) has no pivot at joint ${input.joint}; its ` +
                `pivots are ${pivots.map((p) => `${p.joint} (${p.name})`).join(', ') || 'none'}.`,
        );
      pivotName = pivot.name;
    }
    if (input.fittedOn > today)
      throw problem('fittedOn', `The date fitted cannot be after today at the ride’s site (${today}).`);
    if (input.correctsId) {
      const earlier = tx
        .select({ id: partReplacements.id })
        .from(partReplacements)
        .where(and(eq(partReplacements.id, input.correctsId), eq(partReplacements.rideId, rideId)))
        .get();
      if (!earlier) throw problem('correctsId', 'This ride has no part replacement record with this id.');
    }
    const hashes = input.documents.map((d) => d.sha256);
    const repeated = hashes.findIndex((h, i) => hashes.indexOf(h) !== i);
    if (repeated >= 0) throw problem(`documents.${repeated}.sha256`, 'The same PDF is listed twice.');
    const missing = missingDocument(tx, hashes);
    if (missing)
      throw problem(
        `documents.${hashes.indexOf(missing)}.sha256`,
        'No document with this SHA-256 is stored; upload the PDF first.',
      );
    const id = randomUUID();
    tx.insert(partReplacements)
      .values({
        id,
        rideId,
        component: input.component,
        joint: input.joint ?? null,
        pivotName,
        serialNumber: input.serialNumber,
        maker: input.maker,
        fittedOn: input.fittedOn,
        fittedBy: input.fittedBy,
        replacedSerial: input.replacedSerial ?? null,
        note: input.note ?? null,
        correctsId: input.correctsId ?? null,
        createdBy: userId,
        createdAt: now.toISOString(),
      })
      .run();
    if (input.documents.length > 0)
      tx.insert(partReplacementDocuments)
        .values(
          input.documents.map((d, position) => ({
            replacementId: id,
            sha256: d.sha256,
            title: d.title,
            position,
          })),
        )
        .run();
    const created = partReplacementsOfRide(tx, rideId).find((r) => r.id === id);
    if (!created) throw new Error('The part replacement just stored could not be read back.');
    return created;
  });
}
