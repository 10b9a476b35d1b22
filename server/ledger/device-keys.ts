import { sql } from 'drizzle-orm';

import type { Db } from '@/server/db';

export type PhoneKeyInfo = { publicKey: string; personName: string; revokedAt: string | null };

/**
 * The public key and owner's name of each phone key named, revoked ones too: revocation stops new
 * records, while what a key signed before stays verifiable with it. (Registering and revoking:
 * server/auth/device-keys.ts.)
 */
export function deviceKeyLookup(db: Pick<Db, 'all'>, keyIds: readonly string[]): Map<string, PhoneKeyInfo> {
  if (keyIds.length === 0) return new Map();
  const rows = db.all<PhoneKeyInfo & { keyId: string }>(
    sql`SELECT k.key_id AS keyId, k.public_key AS publicKey, u.name AS personName, k.revoked_at AS revokedAt
        FROM device_keys k JOIN users u ON u.id = k.user_id
        WHERE k.key_id IN (SELECT value FROM json_each(${JSON.stringify(keyIds)}))`,
  );
  return new Map(rows.map(({ keyId, ...row }) => [keyId, row]));
}
