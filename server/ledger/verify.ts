import { sql } from 'drizzle-orm';

import {
  breakWords,
  canonicalJson,
  verifyChain,
  type ChainVerification,
  type LedgerEntry,
  type LedgerKind,
} from '@/features/ledger';
import type { Db } from '@/server/db';
import { deviceKeyLookup } from '@/server/ledger/device-keys';
import { liveForm } from '@/server/ledger/forms';
import { nodeEd25519 } from '@/server/ledger/ed25519';
import { ledgerKeyOf } from '@/server/ledger/key';

type Reader = Pick<Db, 'get' | 'all'>;

/**
 * Checks a ride's whole chain (features/ledger/chain.ts, `verifyChain`) and each record's live row against
 * its latest entry; answers intact, or the first entry that breaks the chain and why, with the phone keys
 * that signed its records (by their owners' names) and how many entries no phone signed.
 */
export function verifyRideChain(db: Reader, rideId: string, now: Date = new Date()): ChainVerification {
  const entries = db.all<LedgerEntry>(
    sql`SELECT ride_id AS rideId, seq, kind, ref_id AS refId, at, record, record_hash AS recordHash,
          prev_hash AS prevHash, entry_hash AS entryHash, server_key_id AS serverKeyId,
          server_signature AS serverSignature, device_key_id AS deviceKeyId, device_signature AS deviceSignature
        FROM ledger_entries WHERE ride_id = ${rideId} ORDER BY seq`,
  );
  const head =
    db.get<{ seq: number; entryHash: string; signature: string }>(
      sql`SELECT seq, entry_hash AS entryHash, signature FROM ledger_heads WHERE ride_id = ${rideId}`,
    ) ?? null;
  const key = ledgerKeyOf(db);
  // Revoked keys too: revocation stops new records, it does not unmake what a key signed before.
  const signed = new Map<string, number>();
  for (const e of entries) if (e.deviceKeyId) signed.set(e.deviceKeyId, (signed.get(e.deviceKeyId) ?? 0) + 1);
  const phones = deviceKeyLookup(db, [...signed.keys()]);
  const result = verifyChain({
    entries,
    head,
    rideId,
    serverKey: (keyId) => (keyId === key.keyId ? key.publicKey : null),
    deviceKey: (keyId) => phones.get(keyId)?.publicKey ?? null,
    ed25519: nodeEd25519,
    live: (kind: LedgerKind, refId: string) => {
      const form = liveForm(db, kind, refId);
      return form ? canonicalJson(form.value) : null;
    },
  });
  return {
    rideId,
    intact: result.intact,
    entries: result.entries,
    checkedAt: now.toISOString(),
    break: result.intact ? null : { ...result.break, words: breakWords[result.break.why] },
    signers: [...signed].map(([keyId, records]) => {
      const phone = phones.get(keyId);
      return {
        keyId,
        personName: phone?.personName ?? 'an unknown key',
        records,
        revokedAt: phone?.revokedAt ?? null,
      };
    }),
    unsigned: entries.length - [...signed.values()].reduce((n, k) => n + k, 0),
  };
}
