/**
 * A phone's signing key in tests, made and used the way the phone does it: an Ed25519 key pair from
 * @noble/curves (features/ledger), each record signed over `recordHashOf` of the record as
 * `inspectionRecordSchema` parses it. The server checks these with Node's own Ed25519 (server/ledger/ed25519.ts),
 * so every signed push in the tests checks one implementation against the other.
 */
import { randomUUID } from 'node:crypto';

import { keyIdOf, newPrivateKey, publicKeyOf, recordHashOf, signHex } from '@/features/ledger';
import { inspectionRecordSchema } from '@/features/records/schema';

export type PhoneKey = { privateKey: string; publicKey: string; keyId: string };

export function newPhoneKey(): PhoneKey {
  const privateKey = newPrivateKey();
  const publicKey = publicKeyOf(privateKey);
  return { privateKey, publicKey, keyId: keyIdOf(publicKey) };
}

/** The phone's signature of one record (null for a record that is not one: the server refuses it first). */
export function signRecord(
  record: unknown,
  key: PhoneKey,
): { id: string; keyId: string; signature: string } | null {
  const parsed = inspectionRecordSchema.safeParse(record);
  if (!parsed.success) return null;
  return {
    id: parsed.data.id,
    keyId: key.keyId,
    signature: signHex(key.privateKey, recordHashOf(parsed.data)),
  };
}

/** A push body as the phone sends it: the records, and each one's signature by `key`. */
export function signedBatch<R>(records: readonly R[], key: PhoneKey, batchId: string = randomUUID()) {
  const signatures: Record<string, { keyId: string; signature: string }> = {};
  for (const record of records) {
    const signed = signRecord(record, key);
    if (signed) signatures[signed.id] = { keyId: signed.keyId, signature: signed.signature };
  }
  return { batchId, records: [...records], signatures };
}
