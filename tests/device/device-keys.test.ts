/**
 * The phone's signing keys (features/device-db/device-keys.ts) and the push that carries their signatures
 * (features/sync/push.ts), on the real device schema in memory. Each signature is checked with
 * @noble/curves against the record's RFC 8785 canonical JSON hash (features/ledger), the same check the
 * server makes with Node's own Ed25519 (tests/server/ledger-ed25519.test.ts holds the two to RFC 8032's
 * vectors). The fake server refuses what the real one refuses: no signature, an unknown or withdrawn key,
 * a signature that does not verify.
 */
import { randomUUID } from 'node:crypto';

import { currentDeviceKey, deviceKeyOf, noteSession } from '@/features/device-db/device-keys';
import { releaseDeviceOwner } from '@/features/device-db/device-owner';
import { saveDraft, submitDraft } from '@/features/device-db/drafts';
import { getOutboxItem, listOutbox, requeueRejected } from '@/features/device-db/outbox';
import { keyIdOf, publicKeyOf, recordHashOf, verifyHex } from '@/features/ledger';
import type { InspectionRecord } from '@/features/records/schema';
import { pushOutbox } from '@/features/sync/push';

import { FakeSyncServer } from './fake-sync-server';
import { makeRecord } from '@/tests/support/inspection-fixtures';
import { type MemoryDeviceDb, TEST_PHONE_PERSON, signedInDeviceDb } from '@/tests/support/memory-device-db';

jest.mock('@/features/session/token-store', () => ({ tokenStore: { get: async () => null } }));

let dev: MemoryDeviceDb;
let server: FakeSyncServer;
const T0 = new Date('2026-06-01T09:00:00.000Z');
const opts = () => ({ newId: randomUUID, now: () => T0, force: true });

beforeEach(async () => {
  dev = await signedInDeviceDb();
  server = new FakeSyncServer();
});
afterEach(async () => {
  await dev.close();
});

async function submit(): Promise<InspectionRecord> {
  const rec = makeRecord();
  await saveDraft(dev, { id: rec.id, rideId: rec.rideId, data: { step: 'done' } });
  return submitDraft(dev, rec, T0);
}

const signatureRow = (id: string) =>
  dev.sqlite
    .prepare('SELECT json, device_key_id AS keyId, device_signature AS signature FROM outbox WHERE id = ?')
    .get(id) as {
    json: string;
    keyId: string | null;
    signature: string | null;
  };

test('a submitted record is signed as it enters the outbox: Ed25519 over its canonical hash, by this sign-in’s key', async () => {
  const rec = await submit();
  const key = await deviceKeyOf(dev, TEST_PHONE_PERSON);
  expect(key).not.toBeNull();
  // The key is a real Ed25519 pair and its id is the one the server will compute from the public half.
  expect(publicKeyOf(key!.privateKey)).toBe(key!.publicKey);
  expect(key!.keyId).toBe(keyIdOf(key!.publicKey));
  const row = signatureRow(rec.id);
  expect(row.keyId).toBe(key!.keyId);
  // What was queued is what was signed: the stored JSON's canonical hash verifies under the public key.
  expect(verifyHex(key!.publicKey, recordHashOf(JSON.parse(row.json)), row.signature!)).toBe(true);
  // and nothing else does: one changed value no longer verifies.
  const changed = { ...JSON.parse(row.json), notes: 'changed after signing' };
  expect(verifyHex(key!.publicKey, recordHashOf(changed), row.signature!)).toBe(false);
});

test('one key per sign-in: kept while the session lasts, a new pair after signing in again', async () => {
  const a = await submit();
  const b = await submit();
  expect(signatureRow(a.id).keyId).toBe(signatureRow(b.id).keyId);
  const first = signatureRow(a.id).keyId;
  await noteSession(dev, 'a later sign-in');
  const c = await submit();
  expect(signatureRow(c.id).keyId).not.toBe(first);
  expect((await deviceKeyOf(dev, TEST_PHONE_PERSON))!.keyId).toBe(signatureRow(c.id).keyId);
});

test('the push registers the key once, then every record arrives signed and is accepted', async () => {
  const recs = [await submit(), await submit(), await submit()];
  const report = await pushOutbox(server, dev, opts());
  expect(report).toMatchObject({ accepted: 3, rejected: 0, failure: null });
  expect(server.keyRegistrations).toBe(1);
  expect([...server.records.keys()].sort()).toEqual(recs.map((r) => r.id).sort());
  await submit();
  await pushOutbox(server, dev, opts());
  // Registered already (the phone remembers): not sent again.
  expect(server.keyRegistrations).toBe(1);
  expect(server.records.size).toBe(4);
});

test('a withdrawn key: the run stops with the server’s words, nothing is lost; after signing in again it goes', async () => {
  const rec = await submit();
  const key = await currentDeviceKey(dev, TEST_PHONE_PERSON, T0);
  server.revokedKeys.add(key.keyId);
  const refused = await pushOutbox(server, dev, opts());
  expect(refused.failure).toMatchObject({ kind: 'refused', status: 409 });
  expect(refused.failure?.message).toMatch(/withdrawn/);
  expect(server.records.size).toBe(0);
  expect((await getOutboxItem(dev, rec.id))?.state).toBe('queued');

  // The person signs in again with their password: a new key, which signs the waiting record as it leaves.
  await noteSession(dev, 'signed in again');
  const sent = await pushOutbox(server, dev, opts());
  expect(sent).toMatchObject({ accepted: 1, failure: null });
  const fresh = (await deviceKeyOf(dev, TEST_PHONE_PERSON))!;
  expect(fresh.keyId).not.toBe(key.keyId);
  expect(server.keys.has(fresh.keyId)).toBe(true);
});

test('a record the server refused for its signature goes again, signed anew, once sent again after a new sign-in', async () => {
  const rec = await submit();
  // The server lost the key (or it was withdrawn after registration): the record is refused, kept on the phone.
  await pushOutbox(server, dev, opts());
  server.keys.clear();
  server.records.clear();
  server.batches.clear();
  const again = await submit();
  const refused = await pushOutbox(server, dev, opts());
  expect(refused.rejected).toBe(1);
  expect((await getOutboxItem(dev, again.id))?.state).toBe('rejected');
  await noteSession(dev, 'signed in again');
  await requeueRejected(dev, again.id, T0);
  const sent = await pushOutbox(server, dev, opts());
  expect(sent).toMatchObject({ accepted: 1, rejected: 0 });
  expect(server.records.has(again.id)).toBe(true);
  expect(server.records.has(rec.id)).toBe(false);
});

test('signing out removes the phone’s keys; the queued records keep their signatures', async () => {
  const rec = await submit();
  const before = signatureRow(rec.id);
  await releaseDeviceOwner(dev);
  expect(dev.sqlite.prepare('SELECT COUNT(*) AS n FROM device_keys').get()).toEqual({ n: 0 });
  // Sealed to its author until they sign in again (listOutbox shows no one's), still signed.
  expect(signatureRow(rec.id)).toEqual(before);
  expect(await listOutbox(dev)).toEqual([]);
});
