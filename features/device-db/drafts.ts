/**
 * Drafts: the inspection being recorded, saved whole on every change (one small transaction: is it
 * still a draft, then an upsert), and moved to the outbox on submit.
 */
import { and, desc, eq, inArray, sql } from 'drizzle-orm';
import { z } from 'zod';

import { drafts, outbox, photoBlobs } from '@/db/device/schema';
import type { DeviceDb } from '@/features/device-db/connection';
import { currentDeviceKey, signRecord } from '@/features/device-db/device-keys';
import { currentOwnerSql, getDeviceOwner, ownedBy } from '@/features/device-db/device-owner';
import { DeviceDataError } from '@/features/device-db/errors';
import { queuePhotosForUpload } from '@/features/device-db/photos';
import { type InspectionRecord, inspectionRecordSchema } from '@/features/records/schema';

const draftKeySchema = z.object({
  id: z.uuid({ error: 'Must be a UUID' }),
  rideId: z.string().min(1, 'Required'),
});

type Draft<T = unknown> = {
  id: string;
  rideId: string;
  data: T;
  createdAt: string;
  updatedAt: string;
};
type DraftSummary = Omit<Draft, 'data'>;

function issuesOf(error: z.ZodError): { path: string; message: string }[] {
  return error.issues.map((i) => ({ path: i.path.join('.'), message: i.message }));
}

/**
 * In one statement (drafts are saved on every change): whether the id is already in the outbox, the
 * phone's person, and the author of an existing draft with that id (undefined when there is none).
 */
async function draftFacts(
  tx: DeviceDb,
  id: string,
): Promise<{ sent: boolean; authorId: string | null; draftAuthor: string | null | undefined }> {
  const row = await tx.db
    .select({
      sent: sql<number>`EXISTS (SELECT 1 FROM ${outbox} WHERE ${outbox.id} = ${id})`,
      authorId: sql<string | null>`${currentOwnerSql}`,
      draftExists: sql<number>`EXISTS (SELECT 1 FROM ${drafts} WHERE ${drafts.id} = ${id})`,
      draftAuthor: sql<string | null>`(SELECT ${drafts.authorId} FROM ${drafts} WHERE ${drafts.id} = ${id})`,
    })
    .from(sql`(SELECT 1)`)
    .get();
  return {
    sent: Number(row?.sent) === 1,
    authorId: row?.authorId ?? null,
    draftAuthor: Number(row?.draftExists) === 1 ? (row?.draftAuthor ?? null) : undefined,
  };
}

/**
 * Saves the in-progress record (any JSON value; its shape is the recording screen's). Refuses a record
 * that was already submitted: a submitted inspection is immutable, a correction is an amendment.
 */
export async function saveDraft(
  dev: DeviceDb,
  input: { id: string; rideId: string; data: unknown },
  now = new Date(),
): Promise<void> {
  const key = draftKeySchema.safeParse(input);
  if (!key.success) throw new DeviceDataError('The draft cannot be saved.', issuesOf(key.error));
  let json: string | undefined;
  try {
    json = JSON.stringify(input.data);
  } catch (err) {
    throw new DeviceDataError(`The draft cannot be saved: ${(err as Error).message}`);
  }
  if (json === undefined) throw new DeviceDataError('The draft cannot be saved: it has no data.');
  const at = now.toISOString();
  await dev.transaction(async (tx) => {
    const { sent, authorId, draftAuthor } = await draftFacts(tx, key.data.id);
    if (sent) throw new DeviceDataError('This inspection was submitted and can no longer be changed.');
    if (draftAuthor !== undefined && draftAuthor !== authorId)
      throw new DeviceDataError('This draft belongs to someone else on this phone.');
    const row = { id: key.data.id, rideId: key.data.rideId, json, createdAt: at, updatedAt: at, authorId };
    await tx.db
      .insert(drafts)
      .values(row)
      .onConflictDoUpdate({
        target: drafts.id,
        set: { rideId: row.rideId, json: row.json, updatedAt: row.updatedAt },
      })
      .run();
  });
}

export async function loadDraft<T = unknown>(dev: DeviceDb, id: string): Promise<Draft<T> | null> {
  const row = await dev.db
    .select()
    .from(drafts)
    .where(and(eq(drafts.id, id), ownedBy(drafts.authorId)))
    .get();
  if (!row) return null;
  return {
    id: row.id,
    rideId: row.rideId,
    data: JSON.parse(row.json) as T,
    createdAt: row.createdAt,
    updatedAt: row.updatedAt,
  };
}

/** The signed-in person's drafts, most recently changed first; without their data, so listing stays cheap. */
export async function listDrafts(dev: DeviceDb, rideId?: string): Promise<DraftSummary[]> {
  const query = dev.db
    .select({
      id: drafts.id,
      rideId: drafts.rideId,
      createdAt: drafts.createdAt,
      updatedAt: drafts.updatedAt,
    })
    .from(drafts);
  const mine = ownedBy(drafts.authorId);
  const filtered = query.where(rideId ? and(mine, eq(drafts.rideId, rideId)) : mine);
  return filtered.orderBy(desc(drafts.updatedAt)).all();
}

/** Discards a draft (the inspector's explicit choice). Its photos stay until a clean-up removes unused ones. */
export async function deleteDraft(dev: DeviceDb, id: string): Promise<void> {
  await dev.db
    .delete(drafts)
    .where(and(eq(drafts.id, id), ownedBy(drafts.authorId)))
    .run();
}

/**
 * Submit: the finished record goes into the outbox and its draft is removed, in one transaction. The
 * record must pass the shared schema and every photo it names must be stored on the phone; otherwise
 * nothing changes and the error lists what to fix. The record carries its author (the phone's person), so
 * the server can refuse it under anyone else's name, and is signed with the person's key on this phone
 * (features/device-db/device-keys.ts) as it enters the outbox.
 */
export async function submitDraft(
  dev: DeviceDb,
  record: unknown,
  now = new Date(),
): Promise<InspectionRecord> {
  const parsed = inspectionRecordSchema.safeParse(record);
  if (!parsed.success)
    throw new DeviceDataError(
      'The inspection is not complete or has invalid values.',
      issuesOf(parsed.error),
    );
  let rec = parsed.data;
  const shas = [...new Set(rec.photos.map((p) => p.sha256))];
  const at = now.toISOString();
  // Made (or read) before the transaction: the first signing loads the chain's code and may make the key.
  const owner = await getDeviceOwner(dev);
  const key = owner === null ? null : await currentDeviceKey(dev, owner, now);
  await dev.transaction(async (tx) => {
    const { sent, authorId } = await draftFacts(tx, rec.id);
    if (sent) throw new DeviceDataError('This inspection was already submitted.');
    if (authorId !== null) {
      if (rec.authorId !== undefined && rec.authorId !== authorId)
        throw new DeviceDataError('This inspection was recorded by someone else.', [
          { path: 'authorId', message: 'Not the person signed in on this phone' },
        ]);
      rec = { ...rec, authorId };
    }
    if (shas.length > 0) {
      const held = new Set(
        (
          await tx.db
            .select({ sha256: photoBlobs.sha256 })
            .from(photoBlobs)
            .where(inArray(photoBlobs.sha256, shas))
            .all()
        ).map((r) => r.sha256),
      );
      const missing = rec.photos
        .map((p, i) => ({ p, i }))
        .filter(({ p }) => !held.has(p.sha256))
        .map(({ i }) => ({ path: `photos.${i}.sha256`, message: 'This photo is not stored on the phone' }));
      if (missing.length > 0)
        throw new DeviceDataError('Some photos of this inspection are missing.', missing);
    }
    // The key is the bound person's, who is the record's author (checked above when the draft had one).
    const signed = key && (rec.authorId ?? owner) === key.userId ? await signRecord(key, rec) : null;
    await tx.db
      .insert(outbox)
      .values({
        id: rec.id,
        kind: 'inspection',
        json: JSON.stringify(rec),
        state: 'queued',
        attempts: 0,
        createdAt: at,
        updatedAt: at,
        authorId: rec.authorId ?? null,
        deviceKeyId: signed?.keyId ?? null,
        deviceSignature: signed?.signature ?? null,
      })
      .run();
    await queuePhotosForUpload(tx, shas, now);
    await tx.db.delete(drafts).where(eq(drafts.id, rec.id)).run();
  });
  return rec;
}
