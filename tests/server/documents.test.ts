/**
 * The documents store through the API (PUT/GET /api/documents/:sha256): a PDF is kept once by its
 * SHA-256 and read back byte for byte; what is not a PDF (the ISO 32000-1 §7.5.2 header "%PDF-" is
 * checked, never the Content-Type), bytes that do not hash to the address, and files over the limit are
 * refused and nothing is stored. An operator reads a document only when a record of one of their rides
 * refers to it, so a file nobody refers to is staff-only. PDFs are real ones written by pdfkit.
 */
import { MAX_DOCUMENT_BYTES } from '@/features/documents/schema';
import { findDocument } from '@/server/documents/store';

import { expectApiError, makeTestServer, type TestServer } from './helpers';
import { demoClients, type Clients } from './registry-helpers';
import { asBytes, pdfBytes, sha256Hex } from '@/tests/support/pdf-files';

let server: TestServer;
let api: Clients;

beforeAll(async () => {
  server = await makeTestServer();
  api = await demoClients(server.app);
});
afterAll(() => server.close());

const put = (as: Clients['admin'], bytes: Buffer, type?: string, hash = sha256Hex(bytes)) =>
  as.putBytes(`/api/documents/${hash}`, bytes, type);

test('a PDF is stored once by its SHA-256 and read back byte for byte by staff', async () => {
  const pdf = await pdfBytes('Design report, revision C: main arm and gondola hangers.');
  const hash = sha256Hex(pdf);
  expect((await put(api.admin, pdf)).status).toBe(201);
  const again = await put(api.supervisor, pdf);
  expect(again.status).toBe(200);
  expect(again.body).toEqual({ stored: false, sha256: hash });
  expect(findDocument(server.db, hash)?.bytes).toBe(pdf.length);

  for (const as of [api.admin, api.supervisor, api.inspector]) {
    const got = await asBytes(as.get(`/api/documents/${hash}`));
    expect(got.status).toBe(200);
    expect(got.headers['content-type']).toBe('application/pdf');
    expect(sha256Hex(got.body as Buffer)).toBe(hash);
  }
  // No record of the operator's rides refers to it.
  expectApiError(await api.operator.get(`/api/documents/${hash}`), 403, 'forbidden');
  expectApiError(await api.anonymous.get(`/api/documents/${hash}`), 401, 'unauthorized');
});

test('operators may upload (a certificate for a part they fitted) but not read it back on their own', async () => {
  const pdf = await pdfBytes('Certificate of conformity, pin 60 mm, batch 4411.');
  expect((await put(api.operator, pdf)).status).toBe(201);
  expectApiError(await api.operator.get(`/api/documents/${sha256Hex(pdf)}`), 403, 'forbidden');
});

test('what is not a PDF, a cut or changed upload and an oversized file are refused, and nothing is kept', async () => {
  const png = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 0]);
  expectApiError(await put(api.admin, png), 415, 'not_a_pdf');
  expect(findDocument(server.db, sha256Hex(png))).toBeNull();
  const text = Buffer.from('%PDF- but sent as text');
  expectApiError(await put(api.admin, text, 'text/plain'), 415, 'unsupported_media_type');
  expectApiError(await put(api.admin, Buffer.alloc(0)), 415, 'not_a_pdf');

  const pdf = await pdfBytes('Maker’s manual, chapter 7');
  const mismatch = expectApiError(await put(api.admin, pdf, undefined, 'c'.repeat(64)), 400, 'hash_mismatch');
  expect(mismatch.issues?.[0].path).toBe('params.sha256');
  expect(findDocument(server.db, 'c'.repeat(64))).toBeNull();

  const big = Buffer.concat([Buffer.from('%PDF-1.7\n'), Buffer.alloc(MAX_DOCUMENT_BYTES)]);
  const tooBig = expectApiError(await put(api.admin, big), 413, 'payload_too_large');
  expect(tooBig.message).toMatch(/40\.0 MB/);
  expect(findDocument(server.db, sha256Hex(big))).toBeNull();

  const badHash = expectApiError(await api.admin.get('/api/documents/not-a-hash'), 400, 'validation_failed');
  expect(badHash.issues?.[0].path).toMatch(/sha256/);
  expectApiError(await api.admin.get(`/api/documents/${'d'.repeat(64)}`), 404, 'not_found');
});
