/**
 * The sheet of plates (GET /api/plates.pdf): admin only; A4 and US Letter page boxes (ISO 216: 595 × 842
 * pt; ANSI Letter: 612 × 792 pt); every ride and pivot named in the text an independent reader extracts
 * (pdf-parse, on Mozilla's pdf.js); and every printed code, read off the drawn page by a decoder that is
 * not the encoder (jsQR, the `jsqr` npm package; codes per ISO/IEC 18004), holding exactly the plate
 * address of its ride or pivot under APP_URL.
 */
import { execFileSync } from 'node:child_process';
import path from 'node:path';

import { asc } from 'drizzle-orm';
import request from 'supertest';

import { rides } from '@/db/server/schema';
import { parsePlateCode, plateUrl } from '@/features/rides/plate-url';
import { findDesignVersion } from '@/server/registry/design';

import { expectApiError, makeTestServer, signInAs, type TestServer } from './helpers';

jest.setTimeout(90_000);

const APP_URL = 'https://plates.pivotwatch.test';

const binary = (res: request.Response, cb: (err: Error | null, body: Buffer) => void) => {
  const chunks: Buffer[] = [];
  res.on('data', (c: Buffer) => chunks.push(c));
  res.on('end', () => cb(null, Buffer.concat(chunks)));
};

function readText(pdf: Buffer) {
  const out = execFileSync(process.execPath, [path.join(__dirname, 'support', 'read-pdf.cjs')], {
    input: pdf,
    maxBuffer: 64 * 1024 * 1024,
  });
  const parsed = JSON.parse(out.toString('utf8')) as {
    text: string;
    pages: { width: number; height: number }[];
  };
  return { flat: parsed.text.replace(/\s+/g, ' '), pages: parsed.pages };
}

function readCodes(pdf: Buffer): string[][] {
  const out = execFileSync(process.execPath, [path.join(__dirname, 'support', 'read-pdf-codes.cjs')], {
    input: pdf,
    maxBuffer: 64 * 1024 * 1024,
  });
  return (JSON.parse(out.toString('utf8')) as { pages: string[][] }).pages;
}

let server: TestServer;
const tokens: Record<string, string> = {};

beforeAll(async () => {
  server = await makeTestServer({ env: { APP_URL } });
  for (const role of ['admin', 'supervisor', 'inspector', 'operator'])
    tokens[role] = await signInAs(server.app, `${role}@pivotwatch.test`);
});
afterAll(() => server.close());

const get = (token: string | null, url: string) => {
  const req = request(server.app).get(url).buffer(true).parse(binary);
  return token ? req.set('Authorization', `Bearer ${token}`) : req;
};

/** A request whose answer is JSON (a refusal). */
const getJson = (token: string | null, url: string) => {
  const req = request(server.app).get(url);
  return token ? req.set('Authorization', `Bearer ${token}`) : req;
};

/** Each demo ride with its pivots' words as the readings step shows them ("Pivot n · name"). */
function expectedPlates() {
  return server.db
    .select({ id: rides.id, name: rides.name })
    .from(rides)
    .orderBy(asc(rides.name))
    .all()
    .map((ride) => {
      const design = findDesignVersion(server.db, ride.id)?.data;
      const pivots = (design?.bodies ?? []).map((body, joint) => ({
        joint,
        words: `Pivot ${joint + 1} · ${design?.pivots.find((p) => p.joint === joint)?.name ?? body.name}`,
      }));
      return { ...ride, pivots };
    });
}

test('only an admin may print plates: 401 signed out, 403 for every other role', async () => {
  expectApiError(await getJson(null, '/api/plates.pdf'), 401, 'unauthorized');
  for (const role of ['supervisor', 'inspector', 'operator'])
    expectApiError(await getJson(tokens[role], '/api/plates.pdf'), 403, 'forbidden');
});

test('bad input is refused plainly: an unknown paper size, an unknown ride', async () => {
  expectApiError(await getJson(tokens.admin, '/api/plates.pdf?size=A3'), 400, 'validation_failed');
  expectApiError(await getJson(tokens.admin, '/api/plates.pdf?rideId=no-such-ride'), 404, 'not_found');
});

test('the A4 sheet: a PDF on A4 pages naming every ride and pivot, each code decoding to its plate address', async () => {
  const res = await get(tokens.admin, '/api/plates.pdf?size=A4');
  expect(res.status).toBe(200);
  expect(res.headers['content-type']).toBe('application/pdf');
  const pdf = res.body as Buffer;
  expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-');
  const { flat, pages } = readText(pdf);
  for (const p of pages) {
    expect(p.width).toBeCloseTo(595.28, 0);
    expect(p.height).toBeCloseTo(841.89, 0);
  }
  const expected = expectedPlates();
  expect(expected.length).toBeGreaterThan(1);
  expect(expected.some((r) => r.pivots.length > 1)).toBe(true);
  const urls: string[] = [];
  for (const ride of expected) {
    expect(flat).toContain(ride.name);
    urls.push(plateUrl(APP_URL, { rideId: ride.id, joint: null }));
    for (const p of ride.pivots) {
      expect(flat).toContain(p.words);
      urls.push(plateUrl(APP_URL, { rideId: ride.id, joint: p.joint }));
    }
  }
  const decoded = readCodes(pdf).flat();
  // Every label's code read back, each exactly one plate's address, none missing, none extra.
  expect([...decoded].sort()).toEqual([...urls].sort());
  for (const url of decoded) expect(parsePlateCode(url, APP_URL).ok).toBe(true);
});

test('the Letter sheet of one ride: Letter pages, that ride and its pivots only', async () => {
  const ride = expectedPlates().find((r) => r.pivots.length > 1)!;
  const res = await get(tokens.admin, `/api/plates.pdf?size=LETTER&rideId=${encodeURIComponent(ride.id)}`);
  expect(res.status).toBe(200);
  const pdf = res.body as Buffer;
  expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-');
  const { flat, pages } = readText(pdf);
  expect(pages.length).toBeGreaterThan(0);
  for (const p of pages) {
    expect(p.width).toBeCloseTo(612, 0);
    expect(p.height).toBeCloseTo(792, 0);
  }
  expect(flat).toContain(ride.name);
  expect(flat).toContain('Whole ride');
  for (const p of ride.pivots) expect(flat).toContain(p.words);
  const decoded = readCodes(pdf).flat();
  expect(decoded.sort()).toEqual(
    [
      plateUrl(APP_URL, { rideId: ride.id, joint: null }),
      ...ride.pivots.map((p) => plateUrl(APP_URL, { rideId: ride.id, joint: p.joint })),
    ].sort(),
  );
});
