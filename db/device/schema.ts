import { sql } from 'drizzle-orm';
import { check, index, integer, sqliteTable, text } from 'drizzle-orm/sqlite-core';

/*
 * The phone's own database (expo-sqlite; OPFS in the browser). It keeps what the inspector needs with no
 * signal: the rides assigned to them with design data and checklist templates, drafts, the outbox of
 * submitted records, photo bytes until the server has them, and the sync cursor. Shapes are stored as
 * JSON text validated by the shared zod schemas at the edges; the columns hold only what is queried.
 * Timestamps are ISO 8601 UTC strings, so ordering by text is ordering by time.
 */

/*
 * One person's data per phone: drafts, outbox rows, cached decisions and photo bytes carry `author_id`, the
 * user id of the person signed in when they were made. Nullable because rows from before it existed have
 * none; the first person bound to the phone adopts them (features/device-db/device-owner.ts).
 */

export const outboxKinds = ['inspection'] as const;
/** queued → sending → accepted | rejected; a failed send goes back to queued (see features/sync/outbox-machine). */
export const outboxStates = ['queued', 'sending', 'accepted', 'rejected'] as const;
/** local: only a draft uses it · pending: a submitted record needs it on the server · then uploading → uploaded | rejected. */
export const photoUploadStates = ['local', 'pending', 'uploading', 'uploaded', 'rejected'] as const;

export type OutboxKind = (typeof outboxKinds)[number];
export type OutboxState = (typeof outboxStates)[number];
export type PhotoUploadState = (typeof photoUploadStates)[number];

// Unqualified column names, so a table rebuilt by a later migration keeps valid CHECKs.
const col = (column: { name: string }) => sql.identifier(column.name);
const oneOf = (values: readonly string[]) =>
  sql.raw(values.map((v) => `'${v.replace(/'/g, "''")}'`).join(', '));

export const cachedRides = sqliteTable('cached_rides', {
  id: text('id').primaryKey(),
  json: text('json').notNull(),
  updatedAt: text('updated_at').notNull(),
});

/** Design-data versions never change once made, so a cached one is never stale, only superseded. */
export const cachedDesignVersions = sqliteTable(
  'cached_design_versions',
  {
    id: text('id').primaryKey(),
    rideId: text('ride_id').notNull(),
    version: integer('version').notNull(),
    json: text('json').notNull(),
  },
  (t) => [index('cached_design_versions_ride_idx').on(t.rideId, t.version)],
);

export const cachedChecklistTemplates = sqliteTable(
  'cached_checklist_templates',
  {
    id: text('id').primaryKey(),
    rideClass: text('ride_class').notNull(),
    json: text('json').notNull(),
    updatedAt: text('updated_at').notNull(),
  },
  (t) => [index('cached_checklist_templates_class_idx').on(t.rideClass)],
);

export const assignments = sqliteTable(
  'assignments',
  {
    id: text('id').primaryKey(),
    rideId: text('ride_id').notNull(),
    json: text('json').notNull(),
    updatedAt: text('updated_at').notNull(),
  },
  (t) => [index('assignments_ride_idx').on(t.rideId)],
);

/** An inspection being recorded: the whole in-progress record as JSON, rewritten on every change. */
export const drafts = sqliteTable(
  'drafts',
  {
    id: text('id').primaryKey(),
    rideId: text('ride_id').notNull(),
    json: text('json').notNull(),
    createdAt: text('created_at').notNull(),
    updatedAt: text('updated_at').notNull(),
    authorId: text('author_id'),
  },
  (t) => [index('drafts_updated_idx').on(t.updatedAt), index('drafts_author_idx').on(t.authorId)],
);

/**
 * Submitted records waiting for (or answered by) the server. `batchId` is written before a send and kept
 * through failures, so a re-send after a cut connection carries the same idempotency key.
 */
export const outbox = sqliteTable(
  'outbox',
  {
    id: text('id').primaryKey(),
    kind: text('kind', { enum: outboxKinds }).notNull(),
    json: text('json').notNull(),
    state: text('state', { enum: outboxStates }).notNull(),
    attempts: integer('attempts').notNull().default(0),
    lastError: text('last_error'),
    /** The server's reasons for a rejection, JSON `[{ path, message }]`. */
    issues: text('issues'),
    batchId: text('batch_id'),
    nextAttemptAt: text('next_attempt_at'),
    createdAt: text('created_at').notNull(),
    updatedAt: text('updated_at').notNull(),
    authorId: text('author_id'),
    /** The phone key that signed the record (`device_keys.key_id`) and its Ed25519 signature, hex. */
    deviceKeyId: text('device_key_id'),
    deviceSignature: text('device_signature'),
  },
  (t) => [
    index('outbox_state_idx').on(t.state, t.nextAttemptAt),
    index('outbox_author_idx').on(t.authorId, t.state),
    index('outbox_batch_idx').on(t.batchId),
    check('outbox_kind_check', sql`${col(t.kind)} IN (${oneOf(outboxKinds)})`),
    check('outbox_state_check', sql`${col(t.state)} IN (${oneOf(outboxStates)})`),
    check('outbox_attempts_check', sql`${col(t.attempts)} >= 0`),
  ],
);

/** Photo bytes keyed by their SHA-256 (lower-case hex), base64 in `data`, kept until the server has them. */
export const photoBlobs = sqliteTable(
  'photo_blobs',
  {
    sha256: text('sha256').primaryKey(),
    mime: text('mime').notNull(),
    bytes: integer('bytes').notNull(),
    data: text('data').notNull(),
    uploadState: text('upload_state', { enum: photoUploadStates }).notNull(),
    uploadedBytes: integer('uploaded_bytes').notNull().default(0),
    attempts: integer('attempts').notNull().default(0),
    lastError: text('last_error'),
    nextAttemptAt: text('next_attempt_at'),
    createdAt: text('created_at').notNull(),
    updatedAt: text('updated_at').notNull(),
    /** Who took it; only they upload it (a photo two people stored keeps its first author). */
    authorId: text('author_id'),
  },
  (t) => [
    index('photo_blobs_state_idx').on(t.uploadState),
    check('photo_blobs_state_check', sql`${col(t.uploadState)} IN (${oneOf(photoUploadStates)})`),
    check('photo_blobs_sha_check', sql`length(${col(t.sha256)}) = 64`),
    check('photo_blobs_bytes_check', sql`${col(t.bytes)} > 0`),
  ],
);

/** Supervisor decisions on this inspector's submitted inspections, as pulled from the server. */
export const decisions = sqliteTable('decisions', {
  inspectionId: text('inspection_id').primaryKey(),
  json: text('json').notNull(),
  updatedAt: text('updated_at').notNull(),
  /** The person whose pull brought it. */
  authorId: text('author_id'),
});

/** The inspection body's instrument register as last pulled (replaced whole on every pull). */
export const cachedInstruments = sqliteTable('cached_instruments', {
  id: text('id').primaryKey(),
  json: text('json').notNull(),
  updatedAt: text('updated_at').notNull(),
});

/** Settings of the inspection body the phone needs offline, e.g. `declaration` (its text at submit). */
export const cachedSettings = sqliteTable('cached_settings', {
  key: text('key').primaryKey(),
  json: text('json').notNull(),
  updatedAt: text('updated_at').notNull(),
});

/**
 * This phone's signing key for each person who signed in on it (features/device-db/device-keys.ts): an
 * Ed25519 key pair made at each sign-in (`sessionTag` names the sign-in's token: a new token, a new key),
 * whose public half the server learns before the first push (`registeredAt`). Records are signed with it
 * as they enter the outbox.
 */
export const deviceKeys = sqliteTable('device_keys', {
  userId: text('user_id').primaryKey(),
  keyId: text('key_id').notNull(),
  privateKey: text('private_key').notNull(),
  publicKey: text('public_key').notNull(),
  sessionTag: text('session_tag').notNull(),
  createdAt: text('created_at').notNull(),
  registeredAt: text('registered_at'),
});

/** Small key/value facts about sync: the pull cursor, the last success, the last error. */
export const syncMeta = sqliteTable('sync_meta', {
  key: text('key').primaryKey(),
  value: text('value').notNull(),
});

export type OutboxRow = typeof outbox.$inferSelect;
export type PhotoBlobRow = typeof photoBlobs.$inferSelect;
export type DraftRow = typeof drafts.$inferSelect;
