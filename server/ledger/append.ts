import { sql } from 'drizzle-orm';

import { canonicalJson, headHashOf, nextEntry, type LedgerKind } from '@/features/ledger';
import type { Db } from '@/server/db';
import { liveForm } from '@/server/ledger/forms';
import { nodeEd25519 } from '@/server/ledger/ed25519';
import { ledgerKeyOf, type LedgerKey } from '@/server/ledger/key';

type Writer = Pick<Db, 'get' | 'run'>;

export type LedgerRef = {
  kind: LedgerKind;
  refId: string;
  /** The ride, needed when the row is gone (a removed finding); otherwise the row's own. */
  rideId?: string;
  /** The phone's key and its signature over the record's hash, for a record a phone signed. */
  device?: { keyId: string; signature: string } | null;
};

type ChainEnd = { rideId: string; seq: number; entryHash: string };

/**
 * Appends the record's entry to its ride's chain and moves the ride's signed head, inside the caller's
 * transaction (call it after the write, before the transaction ends). A record whose form is the same as
 * its latest entry's gets no new entry, so a re-sent inspection or a write that changed nothing the chain
 * records is harmless.
 */
export function appendToLedger(db: Writer, ref: LedgerRef, now: Date): void {
  const key = ledgerKeyOf(db);
  const end = appendEntry(db, key, ref, now);
  if (end) signHead(db, key, end);
}

/**
 * Appends several records' entries (a phone's push) in order, then signs each ride's head once, at the
 * end of its chain: the head signature vouches for the whole chain up to it, so the ones in between would
 * be overwritten unread.
 */
export function appendManyToLedger(db: Writer, refs: readonly LedgerRef[], now: Date): void {
  if (refs.length === 0) return;
  const key = ledgerKeyOf(db);
  const ends = new Map<string, ChainEnd>();
  for (const ref of refs) {
    const end = appendEntry(db, key, ref, now);
    if (end) ends.set(end.rideId, end);
  }
  for (const end of ends.values()) signHead(db, key, end);
}

function appendEntry(db: Writer, key: LedgerKey, ref: LedgerRef, now: Date): ChainEnd | null {
  const form = liveForm(db, ref.kind, ref.refId);
  const rideId = form?.rideId ?? ref.rideId;
  if (!rideId) throw new Error(`No ${ref.kind} ${ref.refId} to record in the chain.`);
  const kind = form?.kind ?? ref.kind;
  const value = form?.value ?? null;
  const latest = db.get<{ record: string }>(
    sql`SELECT record FROM ledger_entries WHERE ride_id = ${rideId} AND kind = ${kind} AND ref_id = ${ref.refId}
        ORDER BY seq DESC LIMIT 1`,
  );
  if (latest && latest.record === canonicalJson(value)) return null;
  if (!latest && value === null) return null;
  const prev = db.get<{ seq: number; entryHash: string }>(
    sql`SELECT seq, entry_hash AS entryHash FROM ledger_entries WHERE ride_id = ${rideId} ORDER BY seq DESC LIMIT 1`,
  );
  const e = nextEntry({
    rideId,
    prev: prev ?? null,
    kind,
    refId: ref.refId,
    at: now.toISOString(),
    value,
    device: ref.device ?? null,
    server: key,
    ed25519: nodeEd25519,
  });
  db.run(sql`INSERT INTO ledger_entries (ride_id, seq, kind, ref_id, at, record, record_hash, prev_hash,
      entry_hash, server_key_id, server_signature, device_key_id, device_signature)
    VALUES (${e.rideId}, ${e.seq}, ${e.kind}, ${e.refId}, ${e.at}, ${e.record}, ${e.recordHash}, ${e.prevHash},
      ${e.entryHash}, ${e.serverKeyId}, ${e.serverSignature}, ${e.deviceKeyId}, ${e.deviceSignature})`);
  return { rideId, seq: e.seq, entryHash: e.entryHash };
}

function signHead(db: Writer, key: LedgerKey, end: ChainEnd): void {
  const signature = nodeEd25519.sign(key.privateKey, headHashOf(end));
  db.run(sql`INSERT INTO ledger_heads (ride_id, seq, entry_hash, signature)
    VALUES (${end.rideId}, ${end.seq}, ${end.entryHash}, ${signature})
    ON CONFLICT (ride_id) DO UPDATE SET seq = excluded.seq, entry_hash = excluded.entry_hash,
      signature = excluded.signature`);
}
