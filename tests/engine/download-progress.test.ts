/**
 * A download's byte progress (features/api/download-progress.ts) read from a real HTTP answer: a node:http
 * server sends a body in chunks with its Content-Length, Node's own fetch (undici, the WHATWG Fetch
 * standard's body stream) brings it in, and the reported bytes are checked against what was sent.
 * RFC 9110 §8.6: Content-Length is the length of the content as sent, so with a Content-Encoding it
 * counts the encoded bytes, which is why the total is then unknown.
 */
import { type Server, createServer } from 'node:http';
import type { AddressInfo } from 'node:net';

import { type DownloadProgress, expectedLength, readBody } from '@/features/api/download-progress';

const chunkSize = 16_384;
const body = Buffer.alloc(5 * chunkSize + 123, 7);
let server: Server;
let base = '';

beforeAll(async () => {
  server = createServer((req, res) => {
    const withLength = req.url === '/with-length';
    res.writeHead(200, {
      'Content-Type': 'application/pdf',
      ...(withLength ? { 'Content-Length': String(body.length) } : {}),
    });
    // Chunk by chunk with a pause, so the client's stream hands them over one at a time.
    let at = 0;
    const next = () => {
      if (at >= body.length) return res.end();
      res.write(body.subarray(at, at + chunkSize));
      at += chunkSize;
      setTimeout(next, 5);
    };
    next();
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
});
afterAll(() => new Promise<void>((resolve) => server.close(() => resolve())));

async function download(path: string) {
  const seen: DownloadProgress[] = [];
  const blob = await readBody(await fetch(`${base}${path}`), (p) => seen.push(p));
  return { blob, seen };
}

test('with Content-Length: the bytes rise to the whole, chunk by chunk, and the file is every byte sent', async () => {
  const { blob, seen } = await download('/with-length');
  expect(blob.size).toBe(body.length);
  expect(Buffer.from(await blob.arrayBuffer()).equals(body)).toBe(true);
  expect(blob.type).toBe('application/pdf');
  expect(seen.every((p) => p.step === 'downloading' && p.totalBytes === body.length)).toBe(true);
  expect(seen[0].receivedBytes).toBe(0);
  expect(seen[seen.length - 1].receivedBytes).toBe(body.length);
  // Several steps in between (6 chunks were written), each no smaller than the last.
  expect(seen.length).toBeGreaterThan(3);
  for (let i = 1; i < seen.length; i++)
    expect(seen[i].receivedBytes).toBeGreaterThanOrEqual(seen[i - 1].receivedBytes);
});

test('without Content-Length: the bytes still count, against no total (an indeterminate bar)', async () => {
  const { blob, seen } = await download('/no-length');
  expect(blob.size).toBe(body.length);
  expect(seen.every((p) => p.totalBytes === null)).toBe(true);
  expect(seen[seen.length - 1].receivedBytes).toBe(body.length);
});

test('the expected length: only a plain, unencoded Content-Length counts', () => {
  const h = (init: Record<string, string>) => new Headers(init);
  expect(expectedLength(h({ 'content-length': '81995' }))).toBe(81995);
  expect(expectedLength(h({ 'content-length': '81995', 'content-encoding': 'identity' }))).toBe(81995);
  expect(expectedLength(h({ 'content-length': '81995', 'content-encoding': 'gzip' }))).toBeNull();
  expect(expectedLength(h({}))).toBeNull();
  expect(expectedLength(h({ 'content-length': 'abc' }))).toBeNull();
  expect(expectedLength(h({ 'content-length': '0' }))).toBeNull();
});

test('a body longer than its stated length: the total becomes unknown rather than past 100 %', async () => {
  const res = new Response(new Blob([new Uint8Array(10), new Uint8Array(10)]).stream(), {
    headers: { 'content-length': '12' },
  });
  const seen: DownloadProgress[] = [];
  await readBody(res, (p) => seen.push(p));
  for (const p of seen) if (p.totalBytes !== null) expect(p.receivedBytes).toBeLessThanOrEqual(p.totalBytes);
  expect(seen[seen.length - 1]).toMatchObject({ receivedBytes: 20, totalBytes: null });
});
