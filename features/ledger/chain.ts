/**
 * The tamper-evident record chain (issue #18), pure: the canonical form of a record (RFC 8785, JSON
 * Canonicalization Scheme, through the `canonicalize` package), SHA-256 hashes, Ed25519 signatures
 * (@noble/curves) and the check of a ride's chain. The server appends and verifies with it; the phone uses
 * the same canonical form and hash, so both sides hash the same bytes.
 */
import { ed25519 } from '@noble/curves/ed25519';
import { sha256 } from '@noble/hashes/sha2';
import { bytesToHex, hexToBytes, utf8ToBytes } from '@noble/hashes/utils';
import canonicalize from 'canonicalize';

import { type ChainBreak, type LedgerKind } from './schema';

/** The `prevHash` of a ride's first entry. */
export const genesisHash = '0'.repeat(64);

/** RFC 8785 canonical JSON of a value; a value with no JSON form (undefined, a function) is refused. */
export function canonicalJson(value: unknown): string {
  const text = canonicalize(value);
  if (text === undefined) throw new Error('This value has no JSON form.');
  return text;
}

/** SHA-256 of a string's UTF-8 bytes, in lowercase hex. */
export const sha256Hex = (text: string): string => bytesToHex(sha256(utf8ToBytes(text)));

/** SHA-256 of a record's canonical JSON: what a signature and the chain commit to. */
export const recordHashOf = (value: unknown): string => sha256Hex(canonicalJson(value));

/** One entry of a ride's chain as stored. `record` is the canonical JSON of the record as accepted. */
export type LedgerEntry = {
  rideId: string;
  seq: number;
  kind: LedgerKind;
  refId: string;
  at: string;
  record: string;
  recordHash: string;
  prevHash: string;
  entryHash: string;
  serverKeyId: string;
  serverSignature: string;
  deviceKeyId: string | null;
  deviceSignature: string | null;
};

type Hashed = Omit<LedgerEntry, 'record' | 'entryHash' | 'serverKeyId' | 'serverSignature'>;

/** The entry's hash: over its place (ride, seq, previous hash), what it is, when, the record's hash and the phone's signature. */
export function entryHashOf(e: Hashed): string {
  return sha256Hex(
    canonicalJson({
      rideId: e.rideId,
      seq: e.seq,
      kind: e.kind,
      refId: e.refId,
      at: e.at,
      recordHash: e.recordHash,
      prevHash: e.prevHash,
      deviceKeyId: e.deviceKeyId,
      deviceSignature: e.deviceSignature,
    }),
  );
}

/** The hash a ride's head signature covers: the last entry's seq and hash. */
export const headHashOf = (head: { rideId: string; seq: number; entryHash: string }): string =>
  sha256Hex(canonicalJson({ rideId: head.rideId, seq: head.seq, entryHash: head.entryHash }));

/** A new Ed25519 private key (32 random bytes), hex. */
export const newPrivateKey = (): string => bytesToHex(ed25519.utils.randomPrivateKey());

export const publicKeyOf = (privateKeyHex: string): string =>
  bytesToHex(ed25519.getPublicKey(hexToBytes(privateKeyHex)));

/** A key's id: the first 16 hex digits of its public key's SHA-256. */
export const keyIdOf = (publicKeyHex: string): string =>
  bytesToHex(sha256(hexToBytes(publicKeyHex))).slice(0, 16);

/** Ed25519 signature (hex) of a hex message (a hash's 32 bytes). */
export const signHex = (privateKeyHex: string, messageHex: string): string =>
  bytesToHex(ed25519.sign(hexToBytes(messageHex), hexToBytes(privateKeyHex)));

/** True only for a well-formed signature that verifies; anything malformed is false, never a throw. */
export function verifyHex(publicKeyHex: string, messageHex: string, signatureHex: string): boolean {
  try {
    return ed25519.verify(hexToBytes(signatureHex), hexToBytes(messageHex), hexToBytes(publicKeyHex));
  } catch {
    return false;
  }
}

/**
 * Ed25519 as the chain uses it, over hex strings. The phone and the tests use @noble/curves (`nobleEd25519`);
 * the server passes Node's own (server/ledger/ed25519.ts), some twenty times faster, which gives the same
 * signatures (RFC 8032 Ed25519 is deterministic).
 */
export type Ed25519Ops = {
  sign(privateKeyHex: string, messageHex: string): string;
  verify(publicKeyHex: string, messageHex: string, signatureHex: string): boolean;
};

export const nobleEd25519: Ed25519Ops = { sign: signHex, verify: verifyHex };

/**
 * The entry that follows `prev` (null for a ride's first) for `value`, countersigned with the server's key.
 * `device` is the phone's key id and its signature over the record's hash, when it signed.
 */
/** A record already in canonical form with its hash (`canonicalRecord`), as `nextEntry` takes it. */
const CANONICAL = Symbol('canonical record');

/** Marks a record's canonical JSON and hash, made by the caller, for `nextEntry` to use as they are. */
export const canonicalRecord = (canonical: string, hash: string) => ({ [CANONICAL]: true, canonical, hash });

const isCanonical = (v: unknown): v is { canonical: string; hash: string } =>
  typeof v === 'object' && v !== null && CANONICAL in v;

export function nextEntry(args: {
  rideId: string;
  prev: Pick<LedgerEntry, 'seq' | 'entryHash'> | null;
  kind: LedgerKind;
  refId: string;
  at: string;
  /** The record, or `canonicalRecord(...)` when the caller has made its canonical JSON and hash already. */
  value: unknown;
  device: { keyId: string; signature: string } | null;
  server: { keyId: string; privateKey: string };
  ed25519?: Ed25519Ops;
}): LedgerEntry {
  const made = isCanonical(args.value) ? args.value : null;
  const record = made ? made.canonical : canonicalJson(args.value);
  const hashed = {
    rideId: args.rideId,
    seq: args.prev ? args.prev.seq + 1 : 1,
    kind: args.kind,
    refId: args.refId,
    at: args.at,
    recordHash: made ? made.hash : sha256Hex(record),
    prevHash: args.prev ? args.prev.entryHash : genesisHash,
    deviceKeyId: args.device?.keyId ?? null,
    deviceSignature: args.device?.signature ?? null,
  };
  const entryHash = entryHashOf(hashed);
  return {
    ...hashed,
    record,
    entryHash,
    serverKeyId: args.server.keyId,
    serverSignature: (args.ed25519 ?? nobleEd25519).sign(args.server.privateKey, entryHash),
  };
}

export type ChainResult =
  { intact: true; entries: number } | { intact: false; entries: number; break: ChainBreak };

export type ChainInput = {
  /** The ride's entries ordered by seq. */
  entries: readonly LedgerEntry[];
  /** The server's signed head of the ride's chain; null when the ride has none. */
  head: { seq: number; entryHash: string; signature: string } | null;
  rideId: string;
  /** The server's public key by key id (null: unknown key). */
  serverKey: (keyId: string) => string | null;
  /** A phone's public key by key id (null: unknown key). */
  deviceKey: (keyId: string) => string | null;
  /** The canonical JSON of each record as it stands now, by `kind:refId` (null: the row is gone). */
  live: (kind: LedgerKind, refId: string) => string | null | undefined;
  ed25519?: Ed25519Ops;
};

const broken = (entries: number, e: ChainBreak): ChainResult => ({ intact: false, entries, break: e });

/**
 * Checks a ride's chain entry by entry and returns the first entry that breaks it: a seq missing, a
 * previous-hash link that does not meet (entries reordered or replaced), an entry whose content no longer
 * gives its hash, a server countersignature or phone signature that does not verify, an end that is not
 * the server's signed head (entries cut off or added), then a live record that differs from the latest
 * entry of its ref.
 */
export function verifyChain(input: ChainInput): ChainResult {
  const { entries } = input;
  const { verify } = input.ed25519 ?? nobleEd25519;
  const n = entries.length;
  let prev: LedgerEntry | null = null;
  for (const e of entries) {
    const expectedSeq = prev ? prev.seq + 1 : 1;
    const at = { seq: e.seq, kind: e.kind, refId: e.refId };
    if (e.seq !== expectedSeq)
      return broken(n, { seq: expectedSeq, kind: null, refId: null, why: 'missing' });
    if (e.prevHash !== (prev ? prev.entryHash : genesisHash)) return broken(n, { ...at, why: 'order' });
    if (e.rideId !== input.rideId || sha256Hex(e.record) !== e.recordHash || entryHashOf(e) !== e.entryHash)
      return broken(n, { ...at, why: 'altered' });
    const serverKey = input.serverKey(e.serverKeyId);
    if (!serverKey || !verify(serverKey, e.entryHash, e.serverSignature))
      return broken(n, { ...at, why: 'countersignature' });
    if (e.deviceKeyId !== null || e.deviceSignature !== null) {
      const deviceKey = e.deviceKeyId ? input.deviceKey(e.deviceKeyId) : null;
      if (!deviceKey || !e.deviceSignature || !verify(deviceKey, e.recordHash, e.deviceSignature))
        return broken(n, { ...at, why: 'device_signature' });
    }
    prev = e;
  }
  const lastSeq = prev?.seq ?? 0;
  const head = input.head;
  if (head === null) {
    if (prev) return broken(n, { seq: prev.seq, kind: prev.kind, refId: prev.refId, why: 'head' });
  } else {
    if (head.seq > lastSeq) return broken(n, { seq: lastSeq + 1, kind: null, refId: null, why: 'missing' });
    const headKey = prev ? input.serverKey(prev.serverKeyId) : null;
    const signed =
      headKey !== null &&
      verify(
        headKey,
        headHashOf({ rideId: input.rideId, seq: head.seq, entryHash: head.entryHash }),
        head.signature,
      );
    if (!prev || head.seq < lastSeq || head.entryHash !== prev.entryHash || !signed) {
      const after = entries.find((e) => e.seq === head.seq + 1) ?? prev;
      return broken(n, {
        seq: after?.seq ?? head.seq,
        kind: after?.kind ?? null,
        refId: after?.refId ?? null,
        why: 'head',
      });
    }
  }
  // The latest entry of each record against the record as it stands now.
  const latest = new Map<string, LedgerEntry>();
  for (const e of entries) latest.set(`${e.kind}:${e.refId}`, e);
  const byPlace = [...latest.values()].sort((a, b) => a.seq - b.seq);
  for (const e of byPlace) {
    const now = input.live(e.kind, e.refId);
    if (now === undefined) continue;
    if ((now === null ? 'null' : now) !== e.record)
      return broken(n, { seq: e.seq, kind: e.kind, refId: e.refId, why: 'live_differs' });
  }
  return { intact: true, entries: n };
}
