/**
 * Sync through a bad network, end to end: the phone's own sync code (features/sync: syncOnce → pushOutbox,
 * uploadPhotos, pull) over its own device database (real schema and migrations, better-sqlite3 in memory)
 * talks through a proxy on 127.0.0.1 to the real server (startServer: createApp on a temp DATA_DIR,
 * listening on loopback). The proxy, driven by a seeded PRNG so a run can be repeated:
 *   - cuts 30 % of requests mid-body: half after forwarding part of the request body (the server never
 *     gets the whole request), half after forwarding part of the response (the server did the work, the
 *     phone never learns it);
 *   - answers 502 to another 10 %: half without forwarding, half after the server has answered;
 * and the server is stopped and started again on the same DATA_DIR and port in the middle of the run.
 *
 * The HTTP side is the phone's too: the sync endpoints of features/sync/http-api.ts over the app's API
 * client built by createApiClient (pointed at the proxy, with the inspector's token). Node has no
 * XMLHttpRequest, which the photo upload uses, so tests/support/fetch-xhr.ts stands in for the browser's.
 */
import { randomUUID } from 'node:crypto';
import fs from 'node:fs';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import path from 'node:path';

import Database from 'better-sqlite3';

import { countOutbox, listOutbox } from '@/features/device-db/outbox';
import { listPhotoBlobs, putPhotoBlob } from '@/features/device-db/photos';
import { submitDraft } from '@/features/device-db/drafts';
import { createApiClient } from '@/features/api';
import type { InspectionRecord } from '@/features/records/schema';
import { noteSession } from '@/features/device-db/device-keys';
import { bindDeviceOwner } from '@/features/device-db/device-owner';
import { createHttpSyncApi } from '@/features/sync/http-api';
import { syncOnce } from '@/features/sync/sync-run';
import { startServer, type RunningServer } from '@/server/main';

import { FetchXmlHttpRequest } from '@/tests/support/fetch-xhr';
import { type MemoryDeviceDb, memoryDeviceDb } from '@/tests/support/memory-device-db';
import { makeTempDir } from './helpers';
import { imageBytes, makeRecord, otherReading, photoRefFor, speedReading } from './sync-fixtures';

// The app's API client module stores the session with expo-secure-store, which node cannot load; this test
// passes its token explicitly and never reads the store.
jest.mock('@/features/session/token-store', () => ({ tokenStore: { get: async () => null } }));
// The API feature's index also offers the phone's PDF download (expo-file-system, which node cannot load
// either); sync never downloads a PDF.
jest.mock('@/features/api/pdf-download', () => ({}));
jest.setTimeout(120_000);

const N = 60;
const SEED = 20260504;
const MAX_ROUNDS = 400;
const DEADLINE_MS = 90_000;

/** mulberry32: a small, well-known 32-bit PRNG; the same seed gives the same fault sequence. */
function prng(seed: number) {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

type Fate = 'pass' | 'cut-request' | 'cut-response' | '502-before' | '502-after';
type Stats = Record<Fate, number> & {
  requests: number;
  upstreamDown: number;
  /** How many times each push batch id and each photo was sent: re-sends must reuse the batch id. */
  batchSends: Map<string, number>;
  photoSends: Map<string, number>;
};

function fateOf(r: number): Fate {
  if (r < 0.15) return 'cut-request';
  if (r < 0.3) return 'cut-response';
  if (r < 0.35) return '502-before';
  if (r < 0.4) return '502-after';
  return 'pass';
}

const readAll = (stream: NodeJS.ReadableStream) =>
  new Promise<Buffer>((resolve, reject) => {
    const chunks: Buffer[] = [];
    stream.on('data', (c: Buffer) => chunks.push(c));
    stream.on('end', () => resolve(Buffer.concat(chunks)));
    stream.on('error', reject);
  });

const badGateway = (res: http.ServerResponse) => {
  res.writeHead(502, { 'Content-Type': 'text/html' });
  res.end('<html><body><h1>502 Bad Gateway</h1></body></html>');
};

/** An HTTP proxy on loopback with scripted faults; `onRequest` lets the test act at a given request. */
async function startProxy(upstreamPort: () => number, random: () => number, onRequest: (n: number) => void) {
  const stats: Stats = {
    requests: 0,
    upstreamDown: 0,
    pass: 0,
    'cut-request': 0,
    'cut-response': 0,
    '502-before': 0,
    '502-after': 0,
    batchSends: new Map(),
    photoSends: new Map(),
  };
  const bump = (map: Map<string, number>, key: string) => map.set(key, (map.get(key) ?? 0) + 1);
  const server = http.createServer(async (req, res) => {
    const n = ++stats.requests;
    onRequest(n);
    const fate = fateOf(random());
    stats[fate]++;
    const body = await readAll(req);
    if (req.method === 'POST' && req.url === '/api/sync/push') {
      const sent: unknown = JSON.parse(body.toString('utf8'));
      if (typeof sent === 'object' && sent !== null && 'batchId' in sent && typeof sent.batchId === 'string')
        bump(stats.batchSends, sent.batchId);
    }
    if (req.method === 'PUT' && req.url?.startsWith('/api/photos/')) bump(stats.photoSends, req.url);
    if (fate === '502-before') {
      badGateway(res);
      return;
    }
    const headers = { ...req.headers, 'content-length': String(body.length) };
    delete headers.connection;
    delete headers['transfer-encoding'];
    const upstream = http.request({
      host: '127.0.0.1',
      port: upstreamPort(),
      method: req.method,
      path: req.url,
      headers,
      agent: false,
    });
    upstream.on('error', () => {
      // The server is down (restarting) or the proxy cut it: a real proxy answers 502 if it still can.
      if (fate !== 'cut-request') stats.upstreamDown++;
      if (!res.headersSent && !res.destroyed) badGateway(res);
    });
    if (fate === 'cut-request') {
      upstream.write(body.subarray(0, Math.floor(body.length / 2)));
      // Give the partial body a moment to reach the server, then cut both sides.
      setTimeout(() => {
        upstream.destroy();
        req.socket.destroy();
      }, 5);
      return;
    }
    upstream.end(body);
    upstream.on('response', async (up) => {
      const answer = await readAll(up);
      if (fate === '502-after') {
        badGateway(res);
        return;
      }
      const out: http.OutgoingHttpHeaders = { ...up.headers, 'content-length': String(answer.length) };
      delete out.connection;
      delete out['transfer-encoding'];
      delete out['keep-alive'];
      res.writeHead(up.statusCode ?? 502, out);
      if (fate === 'cut-response') {
        res.write(answer.subarray(0, Math.floor(answer.length / 2)));
        setTimeout(() => res.socket?.destroy(), 5);
        return;
      }
      res.end(answer);
    });
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  return {
    url: `http://127.0.0.1:${(server.address() as AddressInfo).port}`,
    stats,
    close: () =>
      new Promise<void>((resolve) => {
        server.closeAllConnections();
        server.close(() => resolve());
      }),
  };
}

async function directJson(url: string, init: RequestInit = {}): Promise<unknown> {
  const res = await fetch(url, init);
  if (!res.ok) throw new Error(`${init.method ?? 'GET'} ${url}: ${res.status} ${await res.text()}`);
  return res.json();
}

let dataDir: string;
let server: RunningServer | null = null;
let dev: MemoryDeviceDb;
beforeAll(async () => {
  dataDir = makeTempDir('pivotwatch-fault-');
  dev = await memoryDeviceDb();
});
afterAll(async () => {
  delete (global as { XMLHttpRequest?: unknown }).XMLHttpRequest;
  await server?.close();
  await dev.close();
  fs.rmSync(dataDir, { recursive: true, force: true });
});

const env = (port: number) => ({
  NODE_ENV: 'test',
  PORT: String(port),
  DATA_DIR: dataDir,
  WEB_DIR: path.join(dataDir, 'no-web-build'),
  SEED_DEMO: '1',
});

test(`${N} inspections with photos through cuts, 502s and a server restart: none lost, none doubled`, async () => {
  const started = Date.now();
  server = await startServer({ env: env(0), handleSignals: false });
  const port = server.port;
  const base = server.url.replace('localhost', '127.0.0.1');

  const signIn = (await directJson(`${base}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ email: 'inspector@pivotwatch.test', password: 'pivotwatch-demo' }),
  })) as { token: string; user: { id: string } };
  const auth = { Authorization: `Bearer ${signIn.token}` };
  // The phone as the app leaves it after this sign-in: bound to the inspector, its records signed with the
  // sign-in's key (registered with the server at the first push).
  await bindDeviceOwner(dev, signIn.user.id);
  await noteSession(dev, signIn.token);
  const rides = (await directJson(`${base}/api/rides?pageSize=100`, { headers: auth })) as {
    rides: { id: string; name: string }[];
  };
  const ride = rides.rides.find((r) => r.name === 'Twin Comet');
  if (!ride) throw new Error('no Twin Comet');

  // The restart happens when the proxy sees this request: whatever is in flight then finishes or fails.
  const RESTART_AT = 50;
  let restarts = 0;
  let recordsAtRestart = 0;
  let restarting: Promise<void> | null = null;
  const restart = async () => {
    recordsAtRestart = records.length;
    const running = server;
    server = null;
    await running?.close();
    // Down for a moment, as in a deployment: requests meanwhile find nothing listening.
    await new Promise((resolve) => setTimeout(resolve, 300));
    // Same DATA_DIR and port: the phone does not know the server went away.
    server = await startServer({ env: env(port), handleSignals: false });
    restarts++;
  };
  const proxy = await startProxy(
    () => port,
    prng(SEED),
    (n) => {
      if (n === RESTART_AT) restarting = restart();
    },
  );
  const getToken = async () => signIn.token;
  // A phone's network gives up on a request that hangs; a cut can leave one hanging.
  const fetchImpl: typeof fetch = (input, init) =>
    fetch(input, { ...init, signal: AbortSignal.timeout(15_000) });
  const apiFetch = createApiClient({ baseUrl: proxy.url, getToken, fetchImpl });
  const api = createHttpSyncApi({ apiFetch, baseUrl: proxy.url, getToken });
  (global as { XMLHttpRequest?: unknown }).XMLHttpRequest = FetchXmlHttpRequest;

  // The inspector records inspections through the day, three between syncs; some share a photo.
  const records: InspectionRecord[] = [];
  const shared = imageBytes(9_999, 'jpeg', 24_000);
  await putPhotoBlob(dev, { bytes: shared, mime: 'image/jpeg' });
  const recordOne = async (i: number) => {
    const own = imageBytes(i, 'jpeg', 12_000 + (i % 5) * 4_000);
    await putPhotoBlob(dev, { bytes: own, mime: 'image/jpeg' });
    const photos = [photoRefFor(own, { caption: `Axle, inspection ${i + 1}` })];
    if (i % 4 === 0) photos.push(photoRefFor(shared, { caption: 'Gondola A lap bar' }));
    const record = makeRecord(
      { id: ride.id, designVersionId: null },
      { readings: [speedReading(11 + (i % 7) / 10), otherReading(i)], photos },
    );
    await submitDraft(dev, record);
    records.push(record);
  };

  let rounds = 0;
  let syncErrors = 0;
  for (; rounds < MAX_ROUNDS && Date.now() - started < DEADLINE_MS; rounds++) {
    for (let k = 0; k < 3 && records.length < N; k++) await recordOne(records.length);
    const report = await syncOnce(api, dev, { newId: randomUUID, force: true });
    if (report.error) syncErrors++;
    const outbox = await countOutbox(dev);
    const waiting = (await listPhotoBlobs(dev)).filter((p) => p.uploadState !== 'uploaded').length;
    if (records.length === N && outbox.accepted === N && waiting === 0 && report.error === null) break;
  }
  await restarting;
  await proxy.close();

  // ——— the phone: everything accepted, every photo uploaded, nothing refused ———
  const outbox = await countOutbox(dev);
  expect(outbox).toEqual({ queued: 0, sending: 0, accepted: N, rejected: 0 });
  expect((await listPhotoBlobs(dev)).every((p) => p.uploadState === 'uploaded')).toBe(true);

  // ——— the server, asked directly: exactly these N inspections, each with all its photos ———
  const running = server as RunningServer | null;
  if (!running) throw new Error('the server did not come back');
  const list = (await directJson(`${base}/api/inspections?mine=1&pageSize=200`, { headers: auth })) as {
    total: number;
    inspections: { id: string; photoCount: number; photosMissing: number }[];
  };
  expect(list.total).toBe(N);
  expect(list.inspections.map((i) => i.id).sort()).toEqual(records.map((r) => r.id).sort());
  const deviceIds = (await listOutbox(dev)).map((o) => o.id).sort();
  expect(deviceIds).toEqual(records.map((r) => r.id).sort());
  const photosOf = new Map(records.map((r) => [r.id, r.photos.length]));
  for (const i of list.inspections) {
    expect(i.photoCount).toBe(photosOf.get(i.id));
    expect(i.photosMissing).toBe(0);
  }

  // Each photo's bytes are on disk once; the one photo shared by many inspections too.
  const uniquePhotos = new Set(records.flatMap((r) => r.photos.map((p) => p.sha256)));
  const files = fs.readdirSync(path.join(dataDir, 'photos')).filter((f) => !f.startsWith('.'));
  expect(files.sort()).toEqual([...uniquePhotos].sort());

  // And every accepted inspection is analysed by the server, before or after its restart.
  const deadline = Date.now() + 20_000;
  let unanalysed = N;
  while (unanalysed > 0 && Date.now() < deadline) {
    const sqlite = new Database(path.join(dataDir, 'pivotwatch.db'), { readonly: true });
    unanalysed = (
      sqlite.prepare('SELECT count(*) AS n FROM inspections WHERE analysed_at IS NULL').get() as { n: number }
    ).n;
    const total = (sqlite.prepare('SELECT count(*) AS n FROM inspections').get() as { n: number }).n;
    sqlite.close();
    expect(total).toBe(N);
    if (unanalysed > 0) await new Promise((resolve) => setTimeout(resolve, 50));
  }
  expect(unanalysed).toBe(0);

  // The faults really happened, and the server really restarted.
  const { stats } = proxy;
  expect(restarts).toBe(1);
  expect(recordsAtRestart).toBeGreaterThan(0);
  expect(recordsAtRestart).toBeLessThan(N);
  const resentBatches = [...stats.batchSends.values()].filter((n) => n > 1).length;
  const resentPhotos = [...stats.photoSends.values()].filter((n) => n > 1).length;
  expect(resentBatches).toBeGreaterThan(0);
  expect(resentPhotos).toBeGreaterThan(0);
  expect(stats['cut-request']).toBeGreaterThan(0);
  expect(stats['cut-response']).toBeGreaterThan(0);
  expect(stats['502-before'] + stats['502-after']).toBeGreaterThan(0);
  const cutShare = (stats['cut-request'] + stats['cut-response']) / stats.requests;
  const badGatewayShare = (stats['502-before'] + stats['502-after']) / stats.requests;
  console.log(
    `fault run: ${N} inspections, ${uniquePhotos.size} photos, ${rounds + 1} sync rounds (${syncErrors} with an ` +
      `error), ${stats.requests} requests through the proxy: ${stats['cut-request']} cut mid-request, ` +
      `${stats['cut-response']} cut mid-response (${(cutShare * 100).toFixed(0)} %), ${stats['502-before']} + ` +
      `${stats['502-after']} answered 502 before/after the server (${(badGatewayShare * 100).toFixed(0)} %), ` +
      `${stats.upstreamDown} while the server was down; ${restarts} restart at request ${RESTART_AT} ` +
      `(${recordsAtRestart} of ${N} recorded by then); ${stats.batchSends.size} batches, ${resentBatches} of them ` +
      `re-sent under the same id; ${resentPhotos} photos sent more than once; ` +
      `${((Date.now() - started) / 1000).toFixed(1)} s`,
  );
});
