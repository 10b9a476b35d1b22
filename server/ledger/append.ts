import type Database from 'better-sqlite3';
import { sql } from 'drizzle-orm';

import {
  canonicalJson,
  canonicalRecord,
  headHashOf,
  nextEntry,
  type LedgerEntry,
  type LedgerKind,
} from '@/features/ledger';
import type { Db } from '@/server/db';
import { sqliteOf } from '@/server/sqlite-client';
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

const ENTRY_COLUMNS = `ride_id, seq, kind, ref_id, at, record, record_hash, prev_hash, entry_hash, server_key_id,
  server_signature, device_key_id, device_signature`;

/** An entry's values in ENTRY_COLUMNS' order. */
const insertParams = (e: LedgerEntry) => [
  e.rideId,
  e.seq,
  e.kind,
  e.refId,
  e.at,
  e.record,
  e.recordHash,
  e.prevHash,
  e.entryHash,
  e.serverKeyId,
  e.serverSignature,
  e.deviceKeyId,
  e.deviceSignature,
];

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
  db.run(sql`INSERT INTO ledger_entries (${sql.raw(ENTRY_COLUMNS)})
    VALUES (${sql.join(
      insertParams(e).map((v) => sql`${v}`),
      sql`, `,
    )})`);
  return { rideId, seq: e.seq, entryHash: e.entryHash };
}

function signHead(db: Writer, key: LedgerKey, end: ChainEnd): void {
  const signature = nodeEd25519.sign(key.privateKey, headHashOf(end));
  db.run(sql`INSERT INTO ledger_heads (ride_id, seq, entry_hash, signature)
    VALUES (${end.rideId}, ${end.seq}, ${end.entryHash}, ${signature})
    ON CONFLICT (ride_id) DO UPDATE SET seq = excluded.seq, entry_hash = excluded.entry_hash,
      signature = excluded.signature`);
}

/** A record accepted just now (never in the chain before), with the form and hash its check computed. */
export type NewRecordEntry = {
  rideId: string;
  kind: Extract<LedgerKind, 'inspection' | 'amendment'>;
  refId: string;
  /** The record's RFC 8785 canonical JSON: the form `server/ledger/forms.ts` reads back from its row. */
  record: string;
  recordHash: string;
  device: { keyId: string; signature: string } | null;
};

type Prepared = {
  last: Database.Statement<[string], ChainEnd>;
  insert: Database.Statement<unknown[]>;
  head: Database.Statement<unknown[]>;
};
const prepared = new WeakMap<Database.Database, Prepared>();

function statementsOf(sqlite: Database.Database): Prepared {
  let st = prepared.get(sqlite);
  if (!st) {
    st = {
      last: sqlite.prepare(
        'SELECT ride_id AS rideId, seq, entry_hash AS entryHash FROM ledger_entries WHERE ride_id = ? ORDER BY seq DESC LIMIT 1',
      ),
      insert: sqlite.prepare(
        `INSERT INTO ledger_entries (${ENTRY_COLUMNS}) VALUES (${ENTRY_COLUMNS.split(',')
          .map(() => '?')
          .join(', ')})`,
      ),
      head: sqlite.prepare(`INSERT INTO ledger_heads (ride_id, seq, entry_hash, signature) VALUES (?, ?, ?, ?)
        ON CONFLICT (ride_id) DO UPDATE SET seq = excluded.seq, entry_hash = excluded.entry_hash,
          signature = excluded.signature`),
    };
    prepared.set(sqlite, st);
  }
  return st;
}

/**
 * A push's accepted records into their rides' chains (server/sync/ingest.ts), inside its transaction: the
 * same entries `appendToLedger` would write, without reading back rows the push has just stored. The
 * push's check already made each record's canonical form and hash (the phone signed that hash), and a
 * record accepted now has no entry yet (a re-sent one is answered as a duplicate), so each entry follows
 * its ride's last in memory; prepared statements, and one head signature per ride at the end.
 */
export function appendNewRecords(db: Db, entries: readonly NewRecordEntry[], now: Date): void {
  if (entries.length === 0) return;
  const st = statementsOf(sqliteOf(db));
  const key = ledgerKeyOf(db);
  const at = now.toISOString();
  const ends = new Map<string, ChainEnd>();
  for (const e of entries) {
    const entry = nextEntry({
      rideId: e.rideId,
      prev: ends.get(e.rideId) ?? st.last.get(e.rideId) ?? null,
      kind: e.kind,
      refId: e.refId,
      at,
      value: canonicalRecord(e.record, e.recordHash),
      device: e.device,
      server: key,
      ed25519: nodeEd25519,
    });
    st.insert.run(...insertParams(entry));
    ends.set(e.rideId, { rideId: e.rideId, seq: entry.seq, entryHash: entry.entryHash });
  }
  for (const end of ends.values())
    st.head.run(end.rideId, end.seq, end.entryHash, nodeEd25519.sign(key.privateKey, headHashOf(end)));
}
