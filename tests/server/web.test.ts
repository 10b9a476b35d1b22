import fs from 'node:fs';
import path from 'node:path';

import request from 'supertest';

import { expectApiError, makeTempDir, makeTestServer, type TestServer } from './helpers';

const indexHtml =
  '<!doctype html><html><head><title>Pivotwatch</title></head><body><div id="root"></div></body></html>';
const bundleName = '_expo/static/js/web/entry-3f9c2a7d41b86e05a1c4d9e7f0b2c813.js';

describe('with a web export in WEB_DIR', () => {
  let server: TestServer;
  let webDir: string;
  beforeAll(async () => {
    webDir = makeTempDir('pivotwatch-web-');
    fs.writeFileSync(path.join(webDir, 'index.html'), indexHtml);
    fs.mkdirSync(path.join(webDir, path.dirname(bundleName)), { recursive: true });
    fs.writeFileSync(path.join(webDir, bundleName), `console.log(${JSON.stringify('x'.repeat(20_000))});`);
    fs.writeFileSync(path.join(webDir, 'sw.js'), 'self.addEventListener("fetch", () => {});');
    fs.mkdirSync(path.join(webDir, 'assets/fonts'), { recursive: true });
    fs.writeFileSync(path.join(webDir, 'assets/fonts/Plex.f7c4c8c20e7d7fc722d9b99ff968f80c.ttf'), 'font');
    fs.writeFileSync(path.join(webDir, 'assets/close.808e1b1b9b53114ec2838071a7e6daa7@2x.png'), 'png');
    server = await makeTestServer({ env: { WEB_DIR: webDir } });
  });
  afterAll(() => {
    server.close();
    fs.rmSync(webDir, { recursive: true, force: true });
  });

  test.each(['/', '/sign-in', '/rides/abc-123/inspections', '/admin/users'])(
    'app route %s → index.html, not cached',
    async (route) => {
      const res = await request(server.app).get(route);
      expect(res.status).toBe(200);
      expect(res.headers['content-type']).toMatch(/^text\/html/);
      expect(res.text).toBe(indexHtml);
      expect(res.headers['cache-control']).toBe('no-cache');
    },
  );

  test('hashed bundles are cached for a year', async () => {
    const res = await request(server.app).get(`/${bundleName}`).set('Accept-Encoding', 'gzip');
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/javascript/);
    expect(res.headers['cache-control']).toContain('immutable');
    expect(res.headers['cache-control']).toContain('max-age=31536000');
    // Not precompressed here, and static files are never compressed per request (web-precompressed.test.ts).
    expect(res.headers['content-encoding']).toBeUndefined();
  });

  test.each([
    '/assets/fonts/Plex.f7c4c8c20e7d7fc722d9b99ff968f80c.ttf',
    '/assets/close.808e1b1b9b53114ec2838071a7e6daa7@2x.png',
  ])('hashed asset %s is cached for a year', async (asset) => {
    const res = await request(server.app).get(asset);
    expect(res.status).toBe(200);
    expect(res.headers['cache-control']).toContain('max-age=31536000');
  });

  test('unhashed files such as the service worker are revalidated', async () => {
    const res = await request(server.app).get('/sw.js');
    expect(res.status).toBe(200);
    expect(res.headers['cache-control']).toBe('no-cache');
  });

  test('a missing file is a 404, not the app under a .js name', async () => {
    const res = await request(server.app).get('/_expo/static/js/web/entry-0000000000000000.js');
    expect(res.status).toBe(404);
    expect(res.text).not.toContain('<html');
  });

  test('unknown /api paths still answer JSON 404, never index.html', async () => {
    for (const route of ['/api/nope', '/api/', '/api/rides/extra/segments']) {
      const res = await request(server.app).get(route);
      expectApiError(res, 404, 'not_found');
      expect(res.text).not.toContain('<div id="root">');
    }
  });

  test('a non-GET request outside /api → JSON 404', async () => {
    expectApiError(await request(server.app).post('/rides').send({}), 404, 'not_found');
  });
});

describe('without a web export', () => {
  let server: TestServer;
  beforeAll(async () => {
    server = await makeTestServer();
  });
  afterAll(() => server.close());

  test('app routes → 503 page that says to run npm start; the API still works', async () => {
    const res = await request(server.app).get('/rides');
    expect(res.status).toBe(503);
    expect(res.headers['content-type']).toMatch(/^text\/html/);
    expect(res.text).toContain('npm start');
    expect((await request(server.app).get('/api/health')).status).toBe(200);
  });
});
