/**
 * The record chain on the server (DEVELOPERS.md, "Record chain"): every acceptance path appends its entry
 * in the same transaction (an inspection at push, a finding created and its state changes, the decision,
 * the notice it issues, an NDT record), `GET /api/rides/:id/chain/verify` answers intact, and then finds
 * each kind of tampering done directly in SQLite at exactly the entry it touched. The countersignatures are
 * checked with @noble/curves' Ed25519 against the public key derived from DATA_DIR/ledger-key, outside the
 * server's own verify. Data is the invented demo scenario.
 */
import fs from 'node:fs';
import path from 'node:path';

import { ed25519 } from '@noble/curves/ed25519';
import Database from 'better-sqlite3';
import { sql } from 'drizzle-orm';

import { databaseFileName } from '@/server/db';
import type { ChainVerification } from '@/features/ledger';
import { qrModules } from '@/server/notices/pdf/chain-mark';

import jsQR from 'jsqr';

import type { TestServer } from './helpers';
import { pdfText } from './notices-fixtures';
import { pushAccepted } from './review-desk-fixtures';
import { demoClients, makePinnedServer, type Clients } from './registry-helpers';
import { demoRide, makeRecord } from './sync-fixtures';

const now = new Date('2026-05-04T10:00:00.000Z');
let server: TestServer;
let api: Clients;
let rideId = '';
let inspectionId = '';
let findingId = '';
let noticeId = '';

type Row = { seq: number; kind: string; refId: string; entryHash: string; serverSignature: string };
const entries = (): Row[] =>
  server.db.all<Row>(
    sql`SELECT seq, kind, ref_id AS refId, entry_hash AS entryHash, server_signature AS serverSignature
        FROM ledger_entries WHERE ride_id = ${rideId} ORDER BY seq`,
  );

const verify = async (as: Clients['supervisor'] = api.supervisor) => {
  const res = await as.get(`/api/rides/${rideId}/chain/verify`);
  expect(res.status).toBe(200);
  return res.body as ChainVerification;
};

/** A second handle on the database file, as someone with the file (not the server) would edit it. */
function tamper(statements: string[]): void {
  const other = new Database(path.join(server.dataDir, databaseFileName));
  try {
    other.pragma('foreign_keys = OFF');
    other.transaction(() => statements.forEach((s) => other.prepare(s).run()))();
  } finally {
    other.close();
  }
}

beforeAll(async () => {
  server = await makePinnedServer(now);
  api = await demoClients(server.app);
  const ride = demoRide(server.db, 'Skylark');
  rideId = ride.id;

  const record = makeRecord(ride, { type: 'periodic' });
  inspectionId = record.id;
  await pushAccepted(server.db, api.inspector, [record]);
  // The same record again (a phone's re-send) is a duplicate and adds nothing.
  const again = await api.inspector.push([record]);
  expect(again.body.results[0].status).toBe('duplicate');

  const created = await api.supervisor.post(`/api/inspections/${inspectionId}/findings`, {
    severity: 'note',
    description: 'Paint worn on the gondola step; no corrosion seen.',
  });
  expect(created.status).toBe(201);
  findingId = created.body.finding.id;
  const removed = await api.supervisor.post(`/api/inspections/${inspectionId}/findings`, {
    severity: 'note',
    description: 'Written by mistake.',
  });
  expect((await api.supervisor.delete(`/api/findings/${removed.body.finding.id}`)).status).toBe(204);

  const decided = await api.supervisor.post(`/api/inspections/${inspectionId}/decision`, {
    decision: 'approve',
  });
  expect(decided.status).toBe(200);
  noticeId = decided.body.notice.id;

  const action = await api.operator.post(`/api/findings/${findingId}/actions`, { note: 'Step repainted.' });
  expect(action.status).toBe(201);
  const closed = await api.supervisor.post(`/api/findings/${findingId}/close`, {
    note: 'Seen repainted',
    evidenceRef: 'Site visit log 2026-05-04, entry 2',
  });
  expect(closed.status).toBe(200);

  const ndt = await api.inspector.post(`/api/rides/${rideId}/ndt-records`, {
    joint: 0,
    testedOn: '2026-05-01',
    method: 'MT',
    technician: 'Ines Harrowgate',
    level: 2,
    result: 'no_indications',
  });
  expect(ndt.status).toBe(201);
});
afterAll(() => server.close());

describe('appends at each acceptance', () => {
  test('one entry per accepted change, in order, each linked to the one before and countersigned', () => {
    const rows = entries();
    const removedFinding = rows.filter((r) => r.kind === 'finding' && r.refId !== findingId);
    expect(removedFinding).toHaveLength(2); // created, then removed (its entry records null)
    expect(
      rows.map((r) => [r.kind, r.refId === findingId || r.refId === inspectionId || r.refId === noticeId]),
    ).toEqual([
      ['inspection', true],
      ['finding', true],
      ['finding', false],
      ['finding', false],
      ['decision', true],
      ['notice', true],
      ['finding', true], // action reported
      ['finding', true], // verified and closed
      ['ndt', false],
    ]);
    expect(rows.map((r) => r.seq)).toEqual([1, 2, 3, 4, 5, 6, 7, 8, 9]);
    const privateKey = fs.readFileSync(path.join(server.dataDir, 'ledger-key'), 'utf8').trim();
    const publicKey = ed25519.getPublicKey(Buffer.from(privateKey, 'hex'));
    for (const r of rows)
      expect(
        ed25519.verify(Buffer.from(r.serverSignature, 'hex'), Buffer.from(r.entryHash, 'hex'), publicKey),
      ).toBe(true);
  });
});

describe('amendments', () => {
  test('an amendment is its own entry, of kind amendment, after the inspection it amends', async () => {
    const comet = demoRide(server.db, 'Twin Comet');
    const original = makeRecord(comet, { type: 'periodic' });
    await pushAccepted(server.db, api.inspector, [original]);
    const amendment = makeRecord(comet, { type: 'periodic', amendsId: original.id });
    await pushAccepted(server.db, api.inspector, [amendment]);
    const rows = server.db.all<{ seq: number; kind: string; refId: string }>(
      sql`SELECT seq, kind, ref_id AS refId FROM ledger_entries WHERE ride_id = ${comet.id} ORDER BY seq`,
    );
    expect(rows.slice(-2)).toEqual([
      { seq: rows.length - 1, kind: 'inspection', refId: original.id },
      { seq: rows.length, kind: 'amendment', refId: amendment.id },
    ]);
    const res = await api.supervisor.get(`/api/rides/${comet.id}/chain/verify`);
    expect(res.body).toMatchObject({ intact: true, entries: rows.length });
  });
});

describe('the notice PDF', () => {
  test('prints the notice’s entry hash and a QR code that opens the ride’s verification', async () => {
    const entry = entries().find((r) => r.kind === 'notice' && r.refId === noticeId)!;
    const res = await api.supervisor.get(`/api/notices/${noticeId}/pdf`).buffer(true);
    expect(res.status).toBe(200);
    const text = await pdfText(res.body as Buffer);
    const verifyUrl = `${server.config.appUrl}/rides/${rideId}?verify=1`;
    expect(text).toContain('Record chain');
    expect(text).toContain(entry.entryHash);
    expect(text).toContain(verifyUrl);

    // The modules the PDF draws, put on a raster with ISO/IEC 18004's 4-module quiet zone and read back by
    // jsQR, a decoder independent of the encoder (qrcode).
    const rows = qrModules(verifyUrl);
    const scale = 4;
    const side = (rows.length + 8) * scale;
    const rgba = new Uint8ClampedArray(side * side * 4).fill(255);
    rows.forEach((row, r) =>
      row.forEach((dark, c) => {
        if (!dark) return;
        for (let dy = 0; dy < scale; dy++)
          for (let dx = 0; dx < scale; dx++) {
            const i = (((r + 4) * scale + dy) * side + (c + 4) * scale + dx) * 4;
            rgba[i] = rgba[i + 1] = rgba[i + 2] = 0;
          }
      }),
    );
    expect(jsQR(rgba, side, side)?.data).toBe(verifyUrl);
  });
});

describe('GET /api/rides/:id/chain/verify', () => {
  test('an untouched chain is intact', async () => {
    expect(await verify()).toMatchObject({ rideId, intact: true, entries: 9, break: null });
    expect(await verify(api.admin)).toMatchObject({ intact: true });
    expect(await verify(api.operator)).toMatchObject({ intact: true });
  });

  test('scope: inspectors are refused, another company’s operator does not find the ride', async () => {
    expect((await api.inspector.get(`/api/rides/${rideId}/chain/verify`)).status).toBe(403);
    expect((await api.operator2.get(`/api/rides/${rideId}/chain/verify`)).status).toBe(404);
    expect((await api.anonymous.get(`/api/rides/${rideId}/chain/verify`)).status).toBe(401);
  });

  // Each case changes the file, checks, then puts it back exactly, so the next starts intact.
  test('one byte flipped in a stored entry is found at that entry', async () => {
    tamper([
      `UPDATE ledger_entries SET record = replace(record, 'Paint', 'Paimt') WHERE ride_id = '${rideId}' AND seq = 2`,
    ]);
    expect((await verify()).break).toMatchObject({
      seq: 2,
      kind: 'finding',
      refId: findingId,
      why: 'altered',
    });
    tamper([
      `UPDATE ledger_entries SET record = replace(record, 'Paimt', 'Paint') WHERE ride_id = '${rideId}' AND seq = 2`,
    ]);
    expect(await verify()).toMatchObject({ intact: true });
  });

  test('a live record changed behind the server is found at its latest entry', async () => {
    tamper([`UPDATE findings SET state = 'open', closed_at = NULL WHERE id = '${findingId}'`]);
    expect((await verify()).break).toMatchObject({
      seq: 8,
      kind: 'finding',
      refId: findingId,
      why: 'live_differs',
    });
    const closedAt = server.db.get<{ at: string }>(
      sql`SELECT json_extract(record, '$.closedAt') AS at FROM ledger_entries WHERE ride_id = ${rideId} AND seq = 8`,
    )!.at;
    tamper([`UPDATE findings SET state = 'closed', closed_at = '${closedAt}' WHERE id = '${findingId}'`]);

    tamper([`UPDATE inspections SET review_note = 'changed later' WHERE id = '${inspectionId}'`]);
    const result = await verify();
    expect(result.break).toMatchObject({ seq: 5, kind: 'decision', why: 'live_differs' });
    expect(result.break?.words).toBe('the record as it stands now differs from what was accepted');
    tamper([`UPDATE inspections SET review_note = NULL WHERE id = '${inspectionId}'`]);
    expect(await verify()).toMatchObject({ intact: true });
  });

  test('a deleted entry is found at its seq, in the middle and at the end', async () => {
    const keep = server.db.all<Record<string, unknown>>(
      sql`SELECT * FROM ledger_entries WHERE ride_id = ${rideId}`,
    );
    tamper([`DELETE FROM ledger_entries WHERE ride_id = '${rideId}' AND seq = 4`]);
    expect((await verify()).break).toMatchObject({ seq: 4, why: 'missing' });
    tamper([`DELETE FROM ledger_entries WHERE ride_id = '${rideId}'`]);
    restore(keep);
    tamper([`DELETE FROM ledger_entries WHERE ride_id = '${rideId}' AND seq = 9`]);
    expect((await verify()).break).toMatchObject({ seq: 9, why: 'missing' });
    tamper([`DELETE FROM ledger_entries WHERE ride_id = '${rideId}'`]);
    restore(keep);
    expect(await verify()).toMatchObject({ intact: true });
  });

  test('two entries reordered are found at the first of them', async () => {
    tamper([
      `UPDATE ledger_entries SET seq = -1 WHERE ride_id = '${rideId}' AND seq = 6`,
      `UPDATE ledger_entries SET seq = 6 WHERE ride_id = '${rideId}' AND seq = 7`,
      `UPDATE ledger_entries SET seq = 7 WHERE ride_id = '${rideId}' AND seq = -1`,
    ]);
    expect((await verify()).break).toMatchObject({ seq: 6, kind: 'finding', refId: findingId, why: 'order' });
    tamper([
      `UPDATE ledger_entries SET seq = -1 WHERE ride_id = '${rideId}' AND seq = 6`,
      `UPDATE ledger_entries SET seq = 6 WHERE ride_id = '${rideId}' AND seq = 7`,
      `UPDATE ledger_entries SET seq = 7 WHERE ride_id = '${rideId}' AND seq = -1`,
    ]);
    expect(await verify()).toMatchObject({ intact: true });
  });

  test('a countersignature that does not verify is found at its entry', async () => {
    const sig = entries()[2].serverSignature;
    const bad = (parseInt(sig[0], 16) ^ 1).toString(16) + sig.slice(1);
    tamper([`UPDATE ledger_entries SET server_signature = '${bad}' WHERE ride_id = '${rideId}' AND seq = 3`]);
    expect((await verify()).break).toMatchObject({ seq: 3, why: 'countersignature' });
    tamper([`UPDATE ledger_entries SET server_signature = '${sig}' WHERE ride_id = '${rideId}' AND seq = 3`]);
    expect(await verify()).toMatchObject({ intact: true });
  });
});

function restore(rows: Record<string, unknown>[]): void {
  const other = new Database(path.join(server.dataDir, databaseFileName));
  try {
    const cols = Object.keys(rows[0]);
    const insert = other.prepare(
      `INSERT INTO ledger_entries (${cols.join(', ')}) VALUES (${cols.map((c) => `@${c}`).join(', ')})`,
    );
    other.transaction(() => rows.forEach((r) => insert.run(r)))();
  } finally {
    other.close();
  }
}
