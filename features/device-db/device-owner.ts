/**
 * One person's data per phone. The phone is bound to one person at a time (the `deviceUser` key in
 * sync_meta). Every read of personal rows — drafts, outbox rows, cached decisions — is scoped in SQL to
 * that person, and every new row is stamped with them, so a reader can never see another person's work
 * even for a moment.
 *
 * When the person changes (sign-out, or someone else signs in after a token ran out) the shared caches go:
 * rides, design data, checklists, assignments, instruments, settings, decisions, accepted outbox rows,
 * photo bytes nobody still needs, the pull cursor and the sync outcome. The previous person's UNSENT work
 * (drafts, queued/sending/rejected outbox rows and the photos they or an accepted record still need to
 * upload) is never deleted: it stays sealed to its author and goes out when they sign in again.
 */
import { type SQL, and, eq, inArray, isNull, ne, notInArray, sql } from 'drizzle-orm';

import type { AnySQLiteColumn } from 'drizzle-orm/sqlite-core';

import {
  assignments,
  cachedChecklistTemplates,
  cachedDesignVersions,
  cachedInstruments,
  cachedRides,
  cachedSettings,
  decisions,
  deviceKeys,
  drafts,
  outbox,
  photoBlobs,
  syncMeta,
} from '@/db/device/schema';
import type { DeviceDb } from '@/features/device-db/connection';

const OWNER_KEY = 'deviceUser';

/** The bound person's id as an SQL scalar (NULL when nobody is bound). */
export const currentOwnerSql: SQL = sql`(SELECT ${syncMeta.value} FROM ${syncMeta} WHERE ${syncMeta.key} = ${OWNER_KEY})`;

/** `column IS owner`: also true for NULL = NULL, so rows made with nobody bound stay readable then. */
export const ownedBy = (column: AnySQLiteColumn): SQL => sql`${column} IS ${currentOwnerSql}`;

export async function getDeviceOwner(dev: DeviceDb): Promise<string | null> {
  const row = await dev.db.select().from(syncMeta).where(eq(syncMeta.key, OWNER_KEY)).get();
  return row?.value ?? null;
}

/** Outbox states that still have to reach the server (a rejected record waits for its author's action). */
const unsentStates = ['queued', 'sending', 'rejected'] as const;

/** Every `sha256` string value anywhere in a JSON document (drafts keep photos wherever their screen puts them). */
function photoShasIn(json: string, into: Set<string>): void {
  const walk = (value: unknown): void => {
    if (Array.isArray(value)) value.forEach(walk);
    else if (value !== null && typeof value === 'object')
      for (const [key, inner] of Object.entries(value)) {
        if (key === 'sha256' && typeof inner === 'string') into.add(inner);
        else walk(inner);
      }
  };
  try {
    walk(JSON.parse(json));
  } catch {
    // A row that does not parse names no photo we could find; its own reader reports it.
  }
}

/** Clears what belonged to the session that ends, keeping every person's unsent work. Run inside a transaction. */
async function wipeSharedData(tx: DeviceDb): Promise<void> {
  for (const table of [
    cachedRides,
    cachedDesignVersions,
    cachedChecklistTemplates,
    assignments,
    cachedInstruments,
    cachedSettings,
    decisions,
  ])
    await tx.db.delete(table).run();
  await tx.db.delete(outbox).where(eq(outbox.state, 'accepted')).run();

  const needed = new Set<string>();
  for (const row of await tx.db.select({ json: drafts.json }).from(drafts).all())
    photoShasIn(row.json, needed);
  const kept = await tx.db
    .select({ json: outbox.json })
    .from(outbox)
    .where(inArray(outbox.state, [...unsentStates]))
    .all();
  for (const row of kept) photoShasIn(row.json, needed);
  // A photo still waiting to upload is unsent work even when its record was already accepted.
  const waiting = inArray(photoBlobs.uploadState, ['pending', 'uploading']);
  await tx.db
    .delete(photoBlobs)
    .where(
      needed.size > 0
        ? and(sql`NOT ${waiting}`, notInArray(photoBlobs.sha256, [...needed]))
        : sql`NOT ${waiting}`,
    )
    .run();
  await tx.db.delete(syncMeta).where(ne(syncMeta.key, OWNER_KEY)).run();
  // Signing keys belong to a sign-in that has ended; what they signed keeps its signature in the outbox.
  await tx.db.delete(deviceKeys).run();
}

/** Rows from before authors were recorded belong to the person the phone was used by then: the first one bound. */
async function adoptUnowned(tx: DeviceDb, userId: string): Promise<void> {
  await tx.db.update(drafts).set({ authorId: userId }).where(isNull(drafts.authorId)).run();
  await tx.db.update(outbox).set({ authorId: userId }).where(isNull(outbox.authorId)).run();
  await tx.db.update(photoBlobs).set({ authorId: userId }).where(isNull(photoBlobs.authorId)).run();
  await tx.db.update(decisions).set({ authorId: userId }).where(isNull(decisions.authorId)).run();
}

/**
 * Makes `userId` the phone's person. Nothing happens when they already are; otherwise the shared caches
 * are wiped first (all in one transaction). Returns whether the person changed, so the caller can drop
 * its in-memory caches too.
 */
export async function bindDeviceOwner(dev: DeviceDb, userId: string): Promise<{ changed: boolean }> {
  // The usual start (the same person again) is one read. Only bind and release write the owner, each in
  // one transaction behind the same queue, so a read that finds this person bound is as good as one
  // inside a transaction; any other answer is checked again inside the transaction below.
  if ((await getDeviceOwner(dev)) === userId) return { changed: false };
  return dev.transaction(async (tx) => {
    const current = await getDeviceOwner(tx);
    if (current === userId) return { changed: false };
    // Nobody bound means a fresh phone, one signed out (already wiped) or one just updated to this version,
    // whose rows without an author and whose caches belong to whoever used it then: keep them for offline use.
    if (current !== null) await wipeSharedData(tx);
    await adoptUnowned(tx, userId);
    await tx.db
      .insert(syncMeta)
      .values({ key: OWNER_KEY, value: userId })
      .onConflictDoUpdate({ target: syncMeta.key, set: { value: userId } })
      .run();
    return { changed: true };
  });
}

/** Sign-out: wipes the shared caches and unbinds, so the next person starts clean and sees nothing sealed. */
export async function releaseDeviceOwner(dev: DeviceDb): Promise<void> {
  await dev.transaction(async (tx) => {
    await wipeSharedData(tx);
    await tx.db.delete(syncMeta).where(eq(syncMeta.key, OWNER_KEY)).run();
  });
}

export type UnsentWork = { drafts: number; queued: number; rejected: number; photos: number };

/** What the bound person has not yet got to the server: the sign-out warning counts it. */
export async function countUnsentWork(dev: DeviceDb): Promise<UnsentWork> {
  const [d, q, r, p] = await Promise.all([
    dev.db
      .select({ n: sql<number>`count(*)` })
      .from(drafts)
      .where(ownedBy(drafts.authorId))
      .get(),
    dev.db
      .select({ n: sql<number>`count(*)` })
      .from(outbox)
      .where(and(ownedBy(outbox.authorId), inArray(outbox.state, ['queued', 'sending'])))
      .get(),
    dev.db
      .select({ n: sql<number>`count(*)` })
      .from(outbox)
      .where(and(ownedBy(outbox.authorId), eq(outbox.state, 'rejected')))
      .get(),
    dev.db
      .select({ n: sql<number>`count(*)` })
      .from(photoBlobs)
      .where(and(ownedBy(photoBlobs.authorId), inArray(photoBlobs.uploadState, ['pending', 'uploading'])))
      .get(),
  ]);
  return {
    drafts: Number(d?.n ?? 0),
    queued: Number(q?.n ?? 0),
    rejected: Number(r?.n ?? 0),
    photos: Number(p?.n ?? 0),
  };
}
