/**
 * The web export sent as compressed at build time (scripts/precompress.ts + server/web.ts).
 * Bytes are read off a real socket (supertest would decode them) and decoded with node's zlib, an
 * independent implementation of brotli (RFC 7932) and gzip (RFC 1952): what arrives must decode to the
 * file exactly. Content negotiation follows RFC 9110 §12.5.3 (Accept-Encoding: q=0 means "not
 * acceptable", `*` stands for any coding not listed).
 */
import fs from 'node:fs';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import path from 'node:path';
import zlib from 'node:zlib';

import request from 'supertest';

import { precompressDir } from '@/scripts/precompress';
import { pickEncoding } from '@/server/web';

import { makeTempDir, makeTestServer, signInAs, type TestServer } from './helpers';

const bundleName = '_expo/static/js/web/entry-3f9c2a7d41b86e05a1c4d9e7f0b2c813.js';
const indexHtml = `<!doctype html><html><head><title>Pivotwatch</title>${'<meta name="x" content="y">'.repeat(40)}</head><body><div id="root"></div></body></html>`;
// Varied text, so the compressed sizes are realistic rather than a run of one letter.
const bundle = Array.from({ length: 2000 }, (_, i) => `var v${i} = ${(i * 7919) % 104729};`).join('\n');

type Raw = { status: number; headers: http.IncomingHttpHeaders; body: Buffer };

describe('precompressed web export', () => {
  let server: TestServer;
  let webDir: string;
  let listener: http.Server;
  let port: number;

  /** A GET (or HEAD) straight off the socket: no client-side decoding. */
  const raw = (urlPath: string, headers: Record<string, string> = {}, method = 'GET'): Promise<Raw> =>
    new Promise((resolve, reject) => {
      const req = http.request({ host: '127.0.0.1', port, path: urlPath, method, headers }, (res) => {
        const chunks: Buffer[] = [];
        res.on('data', (c: Buffer) => chunks.push(c));
        res.on('end', () =>
          resolve({ status: res.statusCode ?? 0, headers: res.headers, body: Buffer.concat(chunks) }),
        );
      });
      req.on('error', reject);
      req.end();
    });

  const file = (name: string) => path.join(webDir, name);

  beforeAll(async () => {
    webDir = makeTempDir('pivotwatch-web-pre-');
    fs.writeFileSync(file('index.html'), indexHtml);
    fs.mkdirSync(path.dirname(file(bundleName)), { recursive: true });
    fs.writeFileSync(file(bundleName), bundle);
    fs.writeFileSync(
      file('sw.js'),
      `self.addEventListener('fetch', () => {});\n${'// precache\n'.repeat(100)}`,
    );
    fs.writeFileSync(file('tiny.js'), 'console.log(1);');
    fs.writeFileSync(file('icon-192.png'), Buffer.alloc(4096, 7));
    // An orphan from an earlier build: its original is gone.
    fs.writeFileSync(file('gone.js.br'), 'stale');
    await precompressDir(webDir);
    server = await makeTestServer({ env: { WEB_DIR: webDir } });
    listener = server.app.listen(0, '127.0.0.1');
    await new Promise((r) => listener.once('listening', r));
    port = (listener.address() as AddressInfo).port;
  });
  afterAll(async () => {
    await new Promise((r) => listener.close(r));
    server.close();
    fs.rmSync(webDir, { recursive: true, force: true });
  });

  test('precompress writes brotli and gzip copies that decode to the file, and only where they pay', () => {
    const original = fs.readFileSync(file(bundleName));
    const br = fs.readFileSync(file(bundleName) + '.br');
    const gz = fs.readFileSync(file(bundleName) + '.gz');
    expect(zlib.brotliDecompressSync(br).equals(original)).toBe(true);
    expect(zlib.gunzipSync(gz).equals(original)).toBe(true);
    // Brotli at quality 11 beats gzip 9 on text (the reason to precompress at all).
    expect(br.length).toBeLessThan(gz.length);
    expect(gz.length).toBeLessThan(original.length);
    // Too small to gain, already compressed formats, and orphans: no copies.
    for (const none of ['tiny.js.br', 'tiny.js.gz', 'icon-192.png.br', 'icon-192.png.gz', 'gone.js.br'])
      expect(fs.existsSync(file(none))).toBe(false);
  });

  test.each([
    // Chromium over https lists br after gzip.
    ['gzip, deflate, br, zstd', 'br'],
    // Chromium over plain http does not offer brotli.
    ['gzip, deflate', 'gzip'],
    ['br;q=0, gzip', 'gzip'],
    ['gzip;q=0.5, br;q=0.4', 'gzip'],
    ['br;q=0.4, gzip;q=0.4', 'br'],
    ['*', 'br'],
    ['*, br;q=0', 'gzip'],
    ['identity', null],
    ['gzip;q=0, br;q=0', null],
    ['', null],
  ])('Accept-Encoding %j → %s (RFC 9110 §12.5.3)', (header, expected) => {
    expect(pickEncoding(header)).toBe(expected);
  });

  test('brotli when accepted: the bytes decode to the file, same cache headers as before', async () => {
    const res = await raw(`/${bundleName}`, { 'accept-encoding': 'gzip, deflate, br' });
    expect(res.status).toBe(200);
    expect(res.headers['content-encoding']).toBe('br');
    expect(res.headers['content-type']).toMatch(/javascript/);
    expect(res.headers['cache-control']).toBe('public, max-age=31536000, immutable');
    expect(res.headers.vary).toMatch(/Accept-Encoding/i);
    expect(Number(res.headers['content-length'])).toBe(fs.statSync(file(bundleName) + '.br').size);
    expect(zlib.brotliDecompressSync(res.body).toString()).toBe(bundle);
  });

  test('gzip when brotli is not offered', async () => {
    const res = await raw(`/${bundleName}`, { 'accept-encoding': 'gzip, deflate' });
    expect(res.headers['content-encoding']).toBe('gzip');
    expect(zlib.gunzipSync(res.body).toString()).toBe(bundle);
  });

  test('identity when nothing is accepted, still varying by Accept-Encoding', async () => {
    const asked: Record<string, string>[] = [{}, { 'accept-encoding': 'identity' }];
    for (const headers of asked) {
      const res = await raw(`/${bundleName}`, headers);
      expect(res.status).toBe(200);
      expect(res.headers['content-encoding']).toBeUndefined();
      expect(res.headers.vary).toMatch(/Accept-Encoding/i);
      expect(res.body.toString()).toBe(bundle);
    }
  });

  test('the app page (any route) and the service worker are precompressed and revalidated', async () => {
    const page = await raw('/rides/abc-123', { 'accept-encoding': 'br' });
    expect(page.headers['content-encoding']).toBe('br');
    expect(page.headers['content-type']).toMatch(/^text\/html/);
    expect(page.headers['cache-control']).toBe('no-cache');
    expect(zlib.brotliDecompressSync(page.body).toString()).toBe(indexHtml);
    const sw = await raw('/sw.js', { 'accept-encoding': 'gzip' });
    expect(sw.headers['content-encoding']).toBe('gzip');
    expect(sw.headers['cache-control']).toBe('no-cache');
  });

  test('HEAD answers the headers of the compressed file without a body; a repeat is a 304', async () => {
    const head = await raw(`/${bundleName}`, { 'accept-encoding': 'br' }, 'HEAD');
    expect(head.status).toBe(200);
    expect(head.headers['content-encoding']).toBe('br');
    expect(head.body.length).toBe(0);
    const first = await raw(`/${bundleName}`, { 'accept-encoding': 'br' });
    const again = await raw(`/${bundleName}`, {
      'accept-encoding': 'br',
      'if-none-match': String(first.headers.etag),
    });
    expect(again.status).toBe(304);
    expect(again.body.length).toBe(0);
    // The gzip copy is another representation, so it must not share the brotli copy's validator.
    const gz = await raw(`/${bundleName}`, { 'accept-encoding': 'gzip' });
    expect(gz.headers.etag).not.toBe(first.headers.etag);
  });

  test('files without a copy go out as they are: static files are never compressed per request', async () => {
    const tiny = await raw('/tiny.js', { 'accept-encoding': 'gzip, br' });
    expect(tiny.headers['content-encoding']).toBeUndefined();
    expect(tiny.body.toString()).toBe('console.log(1);');
    const png = await raw('/icon-192.png', { 'accept-encoding': 'gzip, br' });
    expect(png.headers['content-encoding']).toBeUndefined();
    expect(png.body.length).toBe(4096);
  });

  test('a copy older than its file (another build) is ignored', async () => {
    const swFile = file('sw.js');
    const fresh = `self.addEventListener('install', () => {});\n${'// new build\n'.repeat(100)}`;
    fs.writeFileSync(swFile, fresh);
    const later = new Date(Date.now() + 60_000);
    fs.utimesSync(swFile, later, later);
    const res = await raw('/sw.js', { 'accept-encoding': 'br, gzip' });
    expect(res.headers['content-encoding']).toBeUndefined();
    expect(res.body.toString()).toBe(fresh);
  });

  test('paths outside the export or naming dotfiles are not served', async () => {
    fs.writeFileSync(file('.pivotwatch-build'), 'stamp');
    fs.writeFileSync(file('.pivotwatch-build.br'), zlib.brotliCompressSync('stamp'));
    // A name without an extension is an app route: the app's page answers, never the dotfile.
    const stamp = await raw('/.pivotwatch-build', { 'accept-encoding': 'br' });
    expect(zlib.brotliDecompressSync(stamp.body).toString()).toBe(indexHtml);
    const outside = await raw('/%2e%2e/etc/hostname', { 'accept-encoding': 'br' });
    expect([200, 404]).toContain(outside.status);
    expect(
      outside.headers['content-encoding'] === 'br'
        ? zlib.brotliDecompressSync(outside.body).toString()
        : outside.body.toString(),
    ).not.toBe(fs.readFileSync('/etc/hostname', 'utf8'));
  });

  test('API answers are still compressed on the fly', async () => {
    const token = await signInAs(server.app, 'admin@pivotwatch.test');
    const res = await request(server.app)
      .get('/api/rides')
      .set('Authorization', `Bearer ${token}`)
      .set('Accept-Encoding', 'gzip');
    expect(res.status).toBe(200);
    expect(res.headers['content-encoding']).toBe('gzip');
  });
});
