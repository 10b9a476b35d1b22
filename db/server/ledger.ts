import { check, index, integer, primaryKey, sqliteTable, text } from 'drizzle-orm/sqlite-core';

import { rides, users } from '@/db/server/schema';
import { ledgerKinds } from '@/features/ledger/schema';
import { oneOf } from '@/db/server/checks';

/*
 * The record chain (issue #18; design in DEVELOPERS.md, "Record chain"): per ride, an append-only sequence
 * of what was accepted, each entry hashed over the one before and countersigned with the server's key.
 * Rows are only ever inserted, in the same transaction as the acceptance they record.
 */

export const ledgerEntries = sqliteTable(
  'ledger_entries',
  {
    rideId: text('ride_id')
      .notNull()
      .references(() => rides.id, { onDelete: 'restrict' }),
    /** 1, 2, 3… per ride. */
    seq: integer('seq').notNull(),
    kind: text('kind', { enum: ledgerKinds }).notNull(),
    /** The inspection, finding, NDT record or notice the entry is about. */
    refId: text('ref_id').notNull(),
    at: text('at').notNull(),
    /** The record as accepted, in RFC 8785 canonical JSON. */
    record: text('record').notNull(),
    recordHash: text('record_hash').notNull(),
    prevHash: text('prev_hash').notNull(),
    entryHash: text('entry_hash').notNull(),
    serverKeyId: text('server_key_id').notNull(),
    /** Ed25519 over the entry hash, with the server's key (DATA_DIR/ledger-key). */
    serverSignature: text('server_signature').notNull(),
    /** The phone's key and its Ed25519 signature over the record hash; null for records the server made. */
    deviceKeyId: text('device_key_id'),
    deviceSignature: text('device_signature'),
  },
  (t) => [
    primaryKey({ columns: [t.rideId, t.seq] }),
    check('ledger_entries_kind_check', oneOf(t.kind, ledgerKinds)),
    index('ledger_entries_ref_idx').on(t.rideId, t.kind, t.refId, t.seq),
  ],
);

/** The end of each ride's chain as the server signed it, so entries cut off the end are found too. */
export const ledgerHeads = sqliteTable('ledger_heads', {
  rideId: text('ride_id')
    .primaryKey()
    .references(() => rides.id, { onDelete: 'restrict' }),
  seq: integer('seq').notNull(),
  entryHash: text('entry_hash').notNull(),
  /** Ed25519 over headHashOf(ride, seq, entry hash). */
  signature: text('signature').notNull(),
});

/**
 * The phones' signing keys: each sign-in on a phone makes an Ed25519 key pair and registers its public key
 * here before its first push; the push's records carry signatures by it. Revoking a key (a lost phone)
 * stops new records signed by it, while records accepted before still verify with it.
 */
export const deviceKeys = sqliteTable(
  'device_keys',
  {
    /** keyIdOf(publicKey): the first 16 hex digits of the public key's SHA-256. */
    keyId: text('key_id').primaryKey(),
    userId: text('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'restrict' }),
    /** The 32-byte Ed25519 public key, lowercase hex. */
    publicKey: text('public_key').notNull(),
    /** What the phone calls itself ("Chromium on Android"), for the person's list of keys. */
    label: text('label'),
    createdAt: text('created_at').notNull(),
    revokedAt: text('revoked_at'),
    revokedBy: text('revoked_by').references(() => users.id, { onDelete: 'restrict' }),
  },
  (t) => [index('device_keys_user_idx').on(t.userId, t.createdAt)],
);

export type LedgerEntryRow = typeof ledgerEntries.$inferSelect;
export type DeviceKeyRow = typeof deviceKeys.$inferSelect;
