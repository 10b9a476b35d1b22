/**
 * The phones' signing keys (DEVELOPERS.md, "Record chain", phone keys): registering, listing and revoking
 * them, and the push refusing any record not signed by a key of the sender's that is not withdrawn.
 * Records are signed as the phone signs them, with @noble/curves (tests/support/phone-keys.ts); the server
 * checks with Node's own Ed25519 (OpenSSL), so each accepted push checks one implementation against the
 * other. Key ids are checked against Node's SHA-256 (FIPS 180-4) and the stored signature again with
 * @noble/curves over the entry's record hash. People and rides are the invented demo scenario.
 */
import { createHash, randomUUID } from 'node:crypto';

import { ed25519 } from '@noble/curves/ed25519';
import { sql } from 'drizzle-orm';

import type { ChainVerification } from '@/features/ledger';
import { verifyRideChain } from '@/server/ledger/verify';
import { seedDemoData } from '@/server/seed/demo';

import { newPhoneKey, signedBatch, type PhoneKey } from '../support/phone-keys';
import { expectApiError, makeTestServer, userIdOf, type TestServer } from './helpers';
import { demoClients, type Clients } from './registry-helpers';
import { demoRide, makeRecord } from './sync-fixtures';

let server: TestServer;
let api: Clients;
let ride: ReturnType<typeof demoRide>;
let inspectorId = '';
let adminId = '';
const inspector2 = 'inspector2@pivotwatch.test';

beforeAll(async () => {
  server = await makeTestServer();
  api = await demoClients(server.app);
  ride = demoRide(server.db, 'Twin Comet');
  inspectorId = userIdOf(server.db, 'inspector@pivotwatch.test');
  adminId = userIdOf(server.db, 'admin@pivotwatch.test');
});
afterAll(() => server.close());

/** Key id as Node's SHA-256 gives it: the first 16 hex digits of the hash of the key's 32 bytes. */
const sha256KeyId = (publicKey: string) =>
  createHash('sha256').update(Buffer.from(publicKey, 'hex')).digest('hex').slice(0, 16);

const register = (key: PhoneKey, as: Clients['inspector'] = api.inspector, label?: string) =>
  as.post('/api/devices/keys', { publicKey: key.publicKey, ...(label ? { label } : {}) });

async function registered(as: Clients['inspector'] = api.inspector): Promise<PhoneKey> {
  const key = newPhoneKey();
  expect((await register(key, as)).status).toBe(201);
  return key;
}

const storedRows = (id: string) => ({
  inspections: server.db.all(sql`SELECT id FROM inspections WHERE id = ${id}`).length,
  entries: server.db.all(sql`SELECT seq FROM ledger_entries WHERE ref_id = ${id}`).length,
});

const chainOf = async (rideId: string) => {
  const res = await api.supervisor.get(`/api/rides/${rideId}/chain/verify`);
  expect(res.status).toBe(200);
  return res.body as ChainVerification;
};

describe('POST /api/devices/keys', () => {
  test('a new key is 201 with its id; the same again by its owner is 200 with the same answer', async () => {
    const key = newPhoneKey();
    const first = await register(key, api.inspector, 'Chromium on Android');
    expect(first.status).toBe(201);
    expect(first.body).toEqual({ keyId: sha256KeyId(key.publicKey), createdAt: expect.any(String) });
    const again = await register(key);
    expect(again.status).toBe(200);
    expect(again.body).toEqual(first.body);
    const mine = await api.inspector.get('/api/devices/keys');
    expect(mine.status).toBe(200);
    expect(mine.body).toContainEqual({
      keyId: first.body.keyId,
      label: 'Chromium on Android',
      createdAt: first.body.createdAt,
      revokedAt: null,
      revokedBy: null,
    });
  });

  test("another person's key is 409 key_taken; a revoked key is 409 key_revoked", async () => {
    const key = await registered();
    expectApiError(await register(key, api.as(inspector2)), 409, 'key_taken');
    expect((await api.inspector.post(`/api/devices/keys/${key.keyId}/revoke`)).status).toBe(200);
    expectApiError(await register(key), 409, 'key_revoked');
  });

  test('a malformed key or label is 400 and registers nothing', async () => {
    const before = server.db.all(sql`SELECT key_id FROM device_keys`).length;
    const good = newPhoneKey().publicKey;
    for (const body of [
      {},
      { publicKey: 'not hex' },
      { publicKey: good.slice(2) },
      { publicKey: good.toUpperCase() },
      { publicKey: good, label: 'x'.repeat(81) },
    ])
      expectApiError(await api.inspector.post('/api/devices/keys', body), 400, 'validation_failed');
    expect(server.db.all(sql`SELECT key_id FROM device_keys`)).toHaveLength(before);
    expectApiError(await api.anonymous.post('/api/devices/keys', { publicKey: good }), 401, 'unauthorized');
  });

  test("GET lists one's own keys; only an administrator may ask for another person's", async () => {
    const key = await registered(api.as(inspector2));
    const theirs = await api.admin.get(`/api/devices/keys?userId=${userIdOf(server.db, inspector2)}`);
    expect(theirs.status).toBe(200);
    expect(theirs.body.map((k: { keyId: string }) => k.keyId)).toContain(key.keyId);
    const mine = await api.inspector.get('/api/devices/keys');
    expect(mine.body.map((k: { keyId: string }) => k.keyId)).not.toContain(key.keyId);
    expectApiError(
      await api.inspector.get(`/api/devices/keys?userId=${userIdOf(server.db, inspector2)}`),
      403,
      'forbidden',
    );
  });
});

describe('a signed push', () => {
  test("is accepted, its chain entry carries the phone's key and signature, and the chain verifies", async () => {
    const key = api.inspector.phoneKey!;
    const record = makeRecord(ride);
    const res = await api.inspector.push([record]);
    expect(res.body.results).toEqual([{ id: record.id, status: 'accepted' }]);
    const [entry] = server.db.all<{
      record: string;
      recordHash: string;
      deviceKeyId: string;
      deviceSignature: string;
    }>(
      sql`SELECT record, record_hash AS recordHash, device_key_id AS deviceKeyId,
            device_signature AS deviceSignature
          FROM ledger_entries WHERE ref_id = ${record.id}`,
    );
    expect(entry.deviceKeyId).toBe(key.keyId);
    // The entry is the record itself, hashed with Node's SHA-256; the phone's signature over that hash
    // verifies with @noble/curves.
    expect(JSON.parse(entry.record)).toEqual(JSON.parse(JSON.stringify(record)));
    expect(createHash('sha256').update(entry.record).digest('hex')).toBe(entry.recordHash);
    expect(
      ed25519.verify(
        Buffer.from(entry.deviceSignature, 'hex'),
        Buffer.from(entry.recordHash, 'hex'),
        Buffer.from(key.publicKey, 'hex'),
      ),
    ).toBe(true);
    const chain = await chainOf(ride.id);
    expect(chain.intact).toBe(true);
    expect(chain.signers).toContainEqual({
      keyId: key.keyId,
      personName: 'Tomas Reyne',
      records: expect.any(Number),
      revokedAt: null,
    });
    // Re-sent unsigned, the same record is still just a duplicate.
    const again = await api.inspector.post('/api/sync/push', { batchId: randomUUID(), records: [record] });
    expect(again.body.results).toEqual([{ id: record.id, status: 'duplicate' }]);
  });

  test('a key revoked later still verifies what it signed before', async () => {
    const key = await registered();
    const record = makeRecord(ride);
    const res = await api.inspector.post('/api/sync/push', signedBatch([record], key));
    expect(res.body.results[0].status).toBe('accepted');
    const revoked = await api.inspector.post(`/api/devices/keys/${key.keyId}/revoke`);
    expect(revoked.status).toBe(200);
    const chain = await chainOf(ride.id);
    expect(chain.intact).toBe(true);
    expect(chain.signers).toContainEqual({
      keyId: key.keyId,
      personName: 'Tomas Reyne',
      records: 1,
      revokedAt: revoked.body.key.revokedAt,
    });
  });
});

describe('a push is refused at `signature`, storing nothing, when the record', () => {
  async function refused(body: { batchId: string; records: unknown[] }, id: string, message: RegExp) {
    const res = await api.inspector.post('/api/sync/push', body);
    expect(res.status).toBe(200);
    expect(res.body.results).toEqual([
      { id, status: 'rejected', issues: [{ path: 'signature', message: expect.stringMatching(message) }] },
    ]);
    expect(storedRows(id)).toEqual({ inspections: 0, entries: 0 });
  }

  test('is not signed', async () => {
    const record = makeRecord(ride);
    await refused(
      { batchId: randomUUID(), records: [record] },
      record.id,
      /^This inspection is not signed by this phone's key; sign in again on the phone/,
    );
  });

  test('is signed with a revoked key', async () => {
    const key = await registered();
    expect((await api.inspector.post(`/api/devices/keys/${key.keyId}/revoke`)).status).toBe(200);
    const record = makeRecord(ride);
    await refused(signedBatch([record], key), record.id, /was withdrawn \(revoked\)/);
  });

  test("is signed with another person's key", async () => {
    const record = makeRecord(ride);
    await refused(
      signedBatch([record], api.as(inspector2).phoneKey!),
      record.id,
      /another person's phone key/,
    );
  });

  test('is signed with a key never registered', async () => {
    const record = makeRecord(ride);
    await refused(signedBatch([record], newPhoneKey()), record.id, /a phone key the server does not know/);
  });

  test('was changed by one byte after it was signed', async () => {
    const record = makeRecord(ride, { notes: 'Windy, 8 m/s from the sea.' });
    const body = signedBatch([record], api.inspector.phoneKey!);
    body.records[0] = { ...record, notes: 'Windy, 9 m/s from the sea.' };
    await refused(body, record.id, /^The signature does not match this inspection's content$/);
  });
});

describe('POST /api/devices/keys/:keyId/revoke', () => {
  test('by the owner: withdrawn once, with an audit entry; again changes nothing', async () => {
    const key = await registered();
    const first = await api.inspector.post(`/api/devices/keys/${key.keyId}/revoke`);
    expect(first.status).toBe(200);
    expect(first.body.key).toMatchObject({ keyId: key.keyId, revokedBy: inspectorId });
    expect(first.body.key.revokedAt).toEqual(expect.any(String));
    const again = await api.inspector.post(`/api/devices/keys/${key.keyId}/revoke`);
    expect(again.status).toBe(200);
    expect(again.body.key).toEqual(first.body.key);
    const audit = server.db.all<{ summary: string }>(
      sql`SELECT summary FROM audit_log WHERE entity = 'user' AND entity_id = ${inspectorId}
            AND summary LIKE ${`%${key.keyId}%`}`,
    );
    expect(audit).toHaveLength(1);
  });

  test('by an administrator for anyone; not by another inspector, and never an unknown key', async () => {
    const key = await registered();
    expectApiError(await api.as(inspector2).post(`/api/devices/keys/${key.keyId}/revoke`), 404, 'not_found');
    expectApiError(await api.inspector.post('/api/devices/keys/0000000000000000/revoke'), 404, 'not_found');
    const byAdmin = await api.admin.post(`/api/devices/keys/${key.keyId}/revoke`);
    expect(byAdmin.status).toBe(200);
    expect(byAdmin.body.key.revokedBy).toBe(adminId);
  });
});

test("the demo seed's inspections are signed with the demo inspector's phone key, and verify", async () => {
  const demo = await makeTestServer({ seed: false });
  try {
    await seedDemoData(demo.db, demo.config, { activity: true });
    const keys = demo.db.all<{ keyId: string; userId: string }>(
      sql`SELECT key_id AS keyId, user_id AS userId FROM device_keys WHERE label = 'Demo phone'`,
    );
    expect(keys).toEqual([
      { keyId: expect.any(String), userId: userIdOf(demo.db, 'inspector@pivotwatch.test') },
    ]);
    const rides = demo.db.all<{ rideId: string }>(
      sql`SELECT DISTINCT ride_id AS rideId FROM ledger_entries WHERE device_key_id = ${keys[0].keyId}`,
    );
    expect(rides.length).toBeGreaterThan(0);
    for (const { rideId } of rides) {
      const chain = verifyRideChain(demo.db, rideId);
      expect(chain.intact).toBe(true);
      expect(chain.signers.find((s) => s.keyId === keys[0].keyId)?.personName).toBe('Tomas Reyne');
    }
  } finally {
    demo.close();
  }
});
