/**
 * How long the phone keeps what the server already has. A record leaves the outbox only once the server
 * accepted it, every photo it names is uploaded, its decision is settled, nothing on the phone still
 * points at it, and its keeping time since acceptance has run out. A photo's bytes leave once uploaded
 * and no record or draft left on the phone names them. Drafts and unsent records (queued, sending,
 * refused) are never touched, whoever's they are.
 *
 * A browser may evict a whole origin's storage when the disk fills, so a phone that never let go of
 * anything would in the end lose unsent work too; pruning the sent part keeps room for what matters.
 */
import { inArray, sql } from 'drizzle-orm';

import { decisions, drafts, outbox, photoBlobs } from '@/db/device/schema';
import type { DeviceDb } from '@/features/device-db/connection';

const DAY_MS = 86_400_000;

export type PrunePolicy = {
  /** Days an accepted, decided record (and its photos) stays after the server accepted it. */
  keepDays: number;
  /**
   * Days an accepted record whose decision has not reached the phone stays. Long, because the inspector
   * may yet have to correct it; bounded, because an inspection the desk never decides (one a correction
   * replaced, say) must not stay on the phone for ever.
   */
  pendingDays: number;
  /**
   * Days a photo taken for a draft that was then discarded stays (never uploaded, named by nothing). The
   * wait covers a photo stored a moment before the draft that names it is saved.
   */
  orphanPhotoDays: number;
};

export const defaultPrunePolicy: PrunePolicy = { keepDays: 30, pendingDays: 180, orphanPhotoDays: 7 };

/** "Free space now": what is sent and settled goes at once; the waits for a decision and for drafts stay. */
export const freeSpacePolicy: PrunePolicy = { ...defaultPrunePolicy, keepDays: 0 };

export type PruneReport = { records: number; photos: number; photoBytes: number };

/** Why an accepted record stays; null when it may go. Exported for the tests' own reading of the rule. */
export type KeepReason = 'recent' | 'decision_pending' | 'returned' | 'photos_uploading' | 'named_by_draft';

type AcceptedRow = { id: string; acceptedAt: string; amendsId: string | null };

/** Lower-case hex SHA-256 values and UUIDs anywhere in a text: what a draft may name, read generously. */
const SHA_RE = /[0-9a-f]{64}/g;
const UUID_RE = /[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}/gi;

export function keepReason(
  row: AcceptedRow,
  facts: {
    now: Date;
    policy: PrunePolicy;
    /** Decision state by inspection id, as pulled (`approved`, `returned`, or whatever a server sent). */
    decisionOf: Map<string, string | null>;
    /** Ids of originals that a correction already accepted by the server amends. */
    correctedOnServer: Set<string>;
    /** Ids of originals that a correction still on its way amends. */
    correctionUnsent: Set<string>;
    /** Accepted records with a photo still to upload. */
    photosWaiting: Set<string>;
    /** Ids named anywhere in a draft (a correction being recorded names its original). */
    namedByDrafts: Set<string>;
  },
): KeepReason | null {
  const age = facts.now.getTime() - Date.parse(row.acceptedAt);
  if (facts.namedByDrafts.has(row.id.toLowerCase())) return 'named_by_draft';
  if (facts.photosWaiting.has(row.id)) return 'photos_uploading';
  const state = facts.decisionOf.get(row.id);
  // A returned record is where its correction starts from: it stays until the correction is on the server.
  if (state === 'returned' && (!facts.correctedOnServer.has(row.id) || facts.correctionUnsent.has(row.id)))
    return 'returned';
  // An unparseable time reads as "now": keep rather than guess.
  if (!Number.isFinite(age)) return 'recent';
  if (state !== 'approved' && state !== 'returned')
    return age < facts.policy.pendingDays * DAY_MS ? 'decision_pending' : null;
  return age < facts.policy.keepDays * DAY_MS ? 'recent' : null;
}

function decisionState(json: string): string | null {
  try {
    const value = JSON.parse(json) as { state?: unknown };
    return typeof value?.state === 'string' ? value.state : null;
  } catch {
    return null;
  }
}

/** The SHA-256 of each photo a record's `photos` array (as JSON text) names; nothing for text that is not one. */
function photoShas(photosJson: string | null): string[] {
  if (!photosJson) return [];
  try {
    const photos = JSON.parse(photosJson) as unknown;
    if (!Array.isArray(photos)) return [];
    return photos.flatMap((p) =>
      p && typeof p === 'object' && typeof (p as { sha256?: unknown }).sha256 === 'string'
        ? [(p as { sha256: string }).sha256]
        : [],
    );
  } catch {
    return [];
  }
}

/**
 * What the rule needs from the phone, read inside the pruning transaction. Records can carry megabytes of
 * recorded ride cycles, so only the two small parts are taken out of their JSON in SQL (`json_extract`
 * reads a path without building the whole document, unlike `json_each`), and nothing large crosses to
 * JavaScript.
 */
async function readFacts(tx: DeviceDb) {
  const rows = await tx.db
    .select({
      id: outbox.id,
      state: outbox.state,
      updatedAt: outbox.updatedAt,
      amendsId: sql<string | null>`json_extract(${outbox.json}, '$.amendsId')`,
      photos: sql<string | null>`json_extract(${outbox.json}, '$.photos')`,
    })
    .from(outbox)
    .all();
  const records = rows.map((r) => ({ ...r, shas: photoShas(r.photos) }));
  const correctedOnServer = new Set<string>();
  const correctionUnsent = new Set<string>();
  for (const r of records) {
    if (!r.amendsId) continue;
    (r.state === 'accepted' ? correctedOnServer : correctionUnsent).add(r.amendsId);
  }
  const decisionRows = await tx.db
    .select({ id: decisions.inspectionId, json: decisions.json })
    .from(decisions)
    .all();
  const notUploaded = new Set(
    (
      await tx.db
        .select({ sha: photoBlobs.sha256 })
        .from(photoBlobs)
        .where(sql`${photoBlobs.uploadState} <> 'uploaded'`)
        .all()
    ).map((b) => b.sha),
  );
  const draftTexts = (await tx.db.select({ json: drafts.json }).from(drafts).all()).map((d) => d.json);
  const accepted = records.filter((r) => r.state === 'accepted');
  return {
    records,
    accepted: accepted.map((r) => ({ id: r.id, acceptedAt: r.updatedAt, amendsId: r.amendsId })),
    decisionOf: new Map(decisionRows.map((d) => [d.id, decisionState(d.json)])),
    correctedOnServer,
    correctionUnsent,
    // A photo the phone holds that has not gone up yet: its record waits for it.
    photosWaiting: new Set(
      accepted.filter((r) => r.shas.some((sha) => notUploaded.has(sha))).map((r) => r.id),
    ),
    namedByDrafts: new Set(draftTexts.flatMap((t) => (t.match(UUID_RE) ?? []).map((id) => id.toLowerCase()))),
    draftShas: new Set(draftTexts.flatMap((t) => t.match(SHA_RE) ?? [])),
  };
}

const CHUNK = 400;
const chunks = <T>(items: T[]): T[][] =>
  Array.from({ length: Math.ceil(items.length / CHUNK) }, (_, i) => items.slice(i * CHUNK, (i + 1) * CHUNK));

/**
 * Applies the policy once, in one transaction (no draft save or sync write can slip in between reading
 * what is needed and deleting). Returns what went.
 */
export async function pruneDevice(
  dev: DeviceDb,
  options: { now?: Date; policy?: PrunePolicy } = {},
): Promise<PruneReport> {
  const now = options.now ?? new Date();
  const policy = options.policy ?? defaultPrunePolicy;
  return dev.transaction(async (tx) => {
    const facts = await readFacts(tx);
    const goes = facts.accepted
      .filter((r) => keepReason(r, { ...facts, now, policy }) === null)
      .map((r) => r.id);
    for (const ids of chunks(goes)) await tx.db.delete(outbox).where(inArray(outbox.id, ids)).run();

    // Photos named by any record left (every state, every author) or by any draft stay.
    const gone = new Set(goes);
    const named = new Set(facts.draftShas);
    for (const r of facts.records) if (!gone.has(r.id)) r.shas.forEach((sha) => named.add(sha));
    const orphanBefore = new Date(now.getTime() - policy.orphanPhotoDays * DAY_MS).toISOString();
    const candidates = await tx.db
      .select({ sha: photoBlobs.sha256, bytes: photoBlobs.bytes })
      .from(photoBlobs)
      .where(
        sql`${photoBlobs.uploadState} = 'uploaded' OR (${photoBlobs.uploadState} = 'local' AND ${photoBlobs.createdAt} < ${orphanBefore})`,
      )
      .all();
    const unneeded = candidates.filter((c) => !named.has(c.sha));
    for (const group of chunks(unneeded.map((c) => c.sha)))
      await tx.db.delete(photoBlobs).where(inArray(photoBlobs.sha256, group)).run();
    return {
      records: goes.length,
      photos: unneeded.length,
      photoBytes: unneeded.reduce((sum, c) => sum + c.bytes, 0),
    };
  });
}
