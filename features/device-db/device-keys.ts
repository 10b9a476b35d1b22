/**
 * This phone's Ed25519 signing key per person (the `device_keys` table). A key pair is made when a person
 * signs in on the phone: a new sign-in (a new session token) makes a new key, so a key the server has
 * revoked (a phone reported lost) is never used again by a phone that stays signed in; only the person's
 * password makes a new one. The private key stays in the phone's database; the public half goes to the
 * server before the first push (features/sync/push.ts) and signs nothing until it is registered there.
 *
 * What is signed: `recordHashOf(record)` (features/ledger) of each record as it enters the outbox — the
 * SHA-256 of its RFC 8785 canonical JSON, the bytes the server hashes into the ride's record chain.
 */
import { sha256 } from '@noble/hashes/sha256';
import { bytesToHex, utf8ToBytes } from '@noble/hashes/utils';
import { eq } from 'drizzle-orm';

import { deviceKeys, syncMeta } from '@/db/device/schema';
import type { DeviceDb } from '@/features/device-db/connection';
import { loadLedger } from '@/features/device-db/ledger-loader';

export type DeviceKey = typeof deviceKeys.$inferSelect;
export type RecordSignature = { keyId: string; signature: string };

/** The session a key belongs to, kept in sync_meta when the phone is bound to the person. */
const SESSION_KEY = 'session';

/** A short tag of the session token: a new token (a new sign-in) means a new key. */
export const sessionTagOf = (token: string): string =>
  bytesToHex(sha256(utf8ToBytes(`pivotwatch session ${token}`))).slice(0, 32);

/**
 * Notes the sign-in the phone now works under (cheap: no key is made until a record is signed, so
 * the signing code does not load with the first screen). Run once the phone is bound to the person.
 */
export async function noteSession(dev: DeviceDb, token: string): Promise<void> {
  const value = sessionTagOf(token);
  const noted = await dev.db.select().from(syncMeta).where(eq(syncMeta.key, SESSION_KEY)).get();
  if (noted?.value === value) return;
  await dev.db
    .insert(syncMeta)
    .values({ key: SESSION_KEY, value })
    .onConflictDoUpdate({ target: syncMeta.key, set: { value } })
    .run();
}

export async function deviceKeyOf(dev: DeviceDb, userId: string): Promise<DeviceKey | null> {
  return (await dev.db.select().from(deviceKeys).where(eq(deviceKeys.userId, userId)).get()) ?? null;
}

/**
 * The person's key for the current sign-in: kept when it was made under the same session, else a new pair
 * (replacing the previous sign-in's).
 */
export async function currentDeviceKey(dev: DeviceDb, userId: string, now = new Date()): Promise<DeviceKey> {
  const ledger = await loadLedger();
  const session = await dev.db.select().from(syncMeta).where(eq(syncMeta.key, SESSION_KEY)).get();
  const sessionTag = session?.value ?? 'unknown';
  const held = await deviceKeyOf(dev, userId);
  if (held && held.sessionTag === sessionTag) return held;
  const privateKey = ledger.newPrivateKey();
  const publicKey = ledger.publicKeyOf(privateKey);
  const row: DeviceKey = {
    userId,
    keyId: ledger.keyIdOf(publicKey),
    privateKey,
    publicKey,
    sessionTag,
    createdAt: now.toISOString(),
    registeredAt: null,
  };
  const { userId: _user, ...update } = row;
  await dev.db
    .insert(deviceKeys)
    .values(row)
    .onConflictDoUpdate({ target: deviceKeys.userId, set: update })
    .run();
  return row;
}

/** The server has the key's public half (only this key: a newer one made meanwhile stays unregistered). */
export async function markDeviceKeyRegistered(dev: DeviceDb, keyId: string, now = new Date()): Promise<void> {
  await dev.db
    .update(deviceKeys)
    .set({ registeredAt: now.toISOString() })
    .where(eq(deviceKeys.keyId, keyId))
    .run();
}

/** The phone's signature over a record: its key id and the Ed25519 signature of the record's hash, hex. */
export async function signRecord(
  key: Pick<DeviceKey, 'keyId' | 'privateKey'>,
  record: unknown,
): Promise<RecordSignature> {
  const ledger = await loadLedger();
  return { keyId: key.keyId, signature: ledger.signHex(key.privateKey, ledger.recordHashOf(record)) };
}
