import { sql } from 'drizzle-orm';

import { keyIdOf, type DeviceKey, type RegisterDeviceKeyBody } from '@/features/ledger';
import type { SessionUser } from '@/features/session/schema';
import { recordUserAudit } from '@/server/auth/user-audit';
import type { Db } from '@/server/db';
import { conflict, notFound } from '@/server/http/errors';

/*
 * The phones' signing keys (DEVELOPERS.md, "Record chain", phone keys; their use in verification is
 * server/ledger/device-keys.ts): registered by the person signed in
 * on the phone, listed on their page, revoked by them or an administrator. A revoked key signs nothing new
 * that the server accepts; the records it signed before stay verifiable with it.
 */

type KeyRow = DeviceKey & { userId: string; publicKey: string };

function keyRow(db: Pick<Db, 'get'>, keyId: string): KeyRow | undefined {
  return db.get<KeyRow>(
    sql`SELECT key_id AS keyId, user_id AS userId, public_key AS publicKey, label, created_at AS createdAt,
          revoked_at AS revokedAt, revoked_by AS revokedBy
        FROM device_keys WHERE key_id = ${keyId}`,
  );
}

/**
 * Registers the phone's public key for `user`. `created` is false when this person had registered it
 * already (a phone repeating its registration); another person's key or a revoked one is a 409.
 */
export function registerDeviceKey(
  db: Db,
  user: SessionUser,
  body: RegisterDeviceKeyBody,
  now: Date,
): { keyId: string; createdAt: string; created: boolean } {
  const keyId = keyIdOf(body.publicKey);
  return db.transaction((tx) => {
    const known = keyRow(tx, keyId);
    if (known) {
      if (known.userId !== user.id || known.publicKey !== body.publicKey)
        throw conflict('This phone key is registered to another person.', 'key_taken');
      if (known.revokedAt !== null)
        throw conflict(
          'This phone key was withdrawn (revoked); sign out and in again on the phone to make a new one.',
          'key_revoked',
        );
      return { keyId, createdAt: known.createdAt, created: false };
    }
    const createdAt = now.toISOString();
    tx.run(sql`INSERT INTO device_keys (key_id, user_id, public_key, label, created_at)
      VALUES (${keyId}, ${user.id}, ${body.publicKey}, ${body.label ?? null}, ${createdAt})`);
    return { keyId, createdAt, created: true };
  });
}

/** A person's phone keys, newest first. */
export function listDeviceKeys(db: Pick<Db, 'all'>, userId: string): DeviceKey[] {
  return db.all<DeviceKey>(
    sql`SELECT key_id AS keyId, label, created_at AS createdAt, revoked_at AS revokedAt, revoked_by AS revokedBy
        FROM device_keys WHERE user_id = ${userId} ORDER BY created_at DESC, key_id`,
  );
}

/**
 * Withdraws a key: its owner or an administrator; anyone else gets the 404 an unknown key gets. Revoking
 * a revoked key changes nothing and answers the key as it is.
 */
export function revokeDeviceKey(db: Db, actor: SessionUser, keyId: string, now: Date): DeviceKey {
  return db.transaction((tx) => {
    const known = keyRow(tx, keyId);
    if (!known || (known.userId !== actor.id && actor.role !== 'admin'))
      throw notFound('No phone key with this id is yours to withdraw.');
    const { userId, publicKey: _publicKey, ...key } = known;
    if (key.revokedAt !== null) return key;
    const revokedAt = now.toISOString();
    tx.run(
      sql`UPDATE device_keys SET revoked_at = ${revokedAt}, revoked_by = ${actor.id} WHERE key_id = ${keyId}`,
    );
    const after = { ...key, revokedAt, revokedBy: actor.id };
    recordUserAudit(tx, {
      userId: actor.id,
      entityId: userId,
      action: 'update',
      summary: `Phone key ${keyId}${key.label ? ` (${key.label})` : ''} withdrawn`,
      before: key,
      after,
    });
    return after;
  });
}
