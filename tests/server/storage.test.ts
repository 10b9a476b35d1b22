/**
 * The storage behind photos, NDT reports and notice PDFs (server/storage): STORAGE_URL parsing, the two
 * drivers keeping the same promises (the S3 one against s3rver, a local implementation of the S3 REST
 * API, through the real AWS SDK client), the NDT report path on S3, backups and restores whose files live
 * in S3, the start-up refusals, and `storage:move`. Bytes are checked with Node's SHA-256 (FIPS 180-4),
 * independently of the code under test; bucket-name rules are the ones S3's documentation states
 * (3–63 characters of a-z, 0-9, dots and hyphens, a letter or digit at each end).
 */
import { createHash } from 'node:crypto';
import { execFile } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { promisify } from 'node:util';

import Database from 'better-sqlite3';
import PDFDocument from 'pdfkit';
import request from 'supertest';

import { photos } from '@/db/server/inspections';
import { ndtReports } from '@/db/server/ndt';
import { createBackup, restoreBackup } from '@/server/backup';
import { ConfigError, loadConfig, parseEnv } from '@/server/config';
import { databaseFileName, openDb } from '@/server/db';
import { startServer } from '@/server/main';
import { repoRoot } from '@/server/paths';
import { findNdtReport, ndtReportKeyOf, storeNdtReport } from '@/server/pivot-life/ndt-report-store';
import { documentKeyOf } from '@/server/documents/store';
import { demoPassword, seedDemoData } from '@/server/seed/demo';
import {
  diskStorage,
  openStorage,
  parseStorageUrl,
  StorageError,
  storageOf,
  type ObjectStorage,
} from '@/server/storage';
import { moveStorage } from '@/server/storage/move';
import { photoKeyOf, storePhoto } from '@/server/sync/photo-store';

import { makeTempDir, makeTestServer, signInAs } from './helpers';
import { startFakeS3, type FakeS3 } from './s3-fake';
import { imageBytes } from './sync-fixtures';

jest.setTimeout(60_000);

const sha256 = (bytes: Uint8Array) => createHash('sha256').update(bytes).digest('hex');
const dirs: string[] = [];
const tempDir = () => {
  const dir = makeTempDir('pivotwatch-storage-');
  dirs.push(dir);
  return dir;
};

let s3: FakeS3;
beforeAll(async () => {
  s3 = await startFakeS3();
});
afterAll(async () => {
  await s3.stop();
  for (const dir of dirs) fs.rmSync(dir, { recursive: true, force: true });
});

const s3Storage = () => openStorage(parseStorageUrl(s3.url()), '/unused');

describe('STORAGE_URL', () => {
  test.each([
    [undefined, { driver: 'disk', root: null }],
    ['', { driver: 'disk', root: null }],
    ['file:', { driver: 'disk', root: null }],
    ['file:///srv/pivotwatch-files', { driver: 'disk', root: '/srv/pivotwatch-files' }],
    [
      's3://pivotwatch-files',
      {
        driver: 's3',
        bucket: 'pivotwatch-files',
        prefix: '',
        region: null,
        endpoint: null,
        forcePathStyle: false,
      },
    ],
    [
      's3://files.example-park/prod/eu?endpoint=http://127.0.0.1:9000/&region=eu-central-1&forcePathStyle=true',
      {
        driver: 's3',
        bucket: 'files.example-park',
        prefix: 'prod/eu/',
        region: 'eu-central-1',
        endpoint: 'http://127.0.0.1:9000',
        forcePathStyle: true,
      },
    ],
  ])('%j is read as %j', (value, settings) => {
    expect(parseStorageUrl(value)).toEqual(settings);
  });

  test.each([
    ['disk', 'not a URL'],
    ['ftp://files.example.net/x', 'not a storage this server knows'],
    ['s3://ab', 'not a bucket name'],
    ['s3://Pivotwatch-Files', 'not a bucket name'],
    ['s3://-pivotwatch', 'not a bucket name'],
    ['s3://key:secret@pivotwatch-files', 'must not hold credentials'],
    ['s3://pivotwatch-files:9000', 'takes no port'],
    ['s3://pivotwatch-files/a b', 'prefix part'],
    ['s3://pivotwatch-files/../x', 'prefix part'],
    ['s3://pivotwatch-files?endpont=http://x', 'unknown option "endpont"'],
    ['s3://pivotwatch-files?endpoint=localhost:9000', 'must be an http:// or https:// URL'],
    ['s3://pivotwatch-files?forcePathStyle=yes', 'true or false'],
    ['s3://pivotwatch-files?region=EU%20West', 'not a region name'],
    ['file://server/share', 'takes only a folder'],
  ])('%j is refused, saying it is %s', (value, words) => {
    expect(() => parseStorageUrl(value)).toThrow(words);
  });

  test('a bad STORAGE_URL is a configuration error naming the variable', () => {
    expect(() => loadConfig({ STORAGE_URL: 's3://X', DATA_DIR: tempDir() })).toThrow(ConfigError);
    expect(() => parseEnv({ STORAGE_URL: 's3://X' })).toThrow(/STORAGE_URL: "X" is not a bucket name/);
    expect(parseEnv({ STORAGE_URL: '' }).storage).toEqual({ driver: 'disk', root: null });
  });

  test('a bad STORAGE_URL stops the server at start, before anything is written', async () => {
    const dataDir = tempDir();
    await expect(
      startServer({ env: { PORT: '0', DATA_DIR: dataDir, STORAGE_URL: 'nfs://x' }, handleSignals: false }),
    ).rejects.toThrow(/STORAGE_URL: nfs:\/\/ is not a storage/);
    expect(fs.readdirSync(dataDir)).toEqual([]);
  });

  test('a bucket that does not exist stops the server at start with a plain message', async () => {
    const dataDir = tempDir();
    const url = s3.url().replace(`s3://${s3.bucket}/`, 's3://no-such-bucket-here/');
    const started = startServer({
      env: { PORT: '0', DATA_DIR: dataDir, NODE_ENV: 'test', STORAGE_URL: url },
      handleSignals: false,
    });
    await expect(started).rejects.toThrow(StorageError);
    await expect(started).rejects.toThrow(/s3:\/\/no-such-bucket-here\/.* the bucket does not exist/);
  });
});

test('a server started on S3 stores an upload in the bucket and serves it back', async () => {
  const dataDir = tempDir();
  const url = s3.url();
  const server = await startServer({
    env: { PORT: '0', DATA_DIR: dataDir, NODE_ENV: 'test', WEB_DIR: `${dataDir}/web`, STORAGE_URL: url },
    handleSignals: false,
  });
  try {
    const signIn = await fetch(`${server.url}/api/auth/sign-in`, {
      method: 'POST',
      headers: { 'Content-Type': 'application/json' },
      body: JSON.stringify({ email: 'inspector@pivotwatch.test', password: demoPassword }),
    });
    const auth = { Authorization: `Bearer ${(await signIn.json()).token}` };
    const bytes = imageBytes(90, 'jpeg', 4_000);
    const hash = sha256(bytes);
    const put = await fetch(`${server.url}/api/photos/${hash}`, {
      method: 'PUT',
      headers: { ...auth, 'Content-Type': 'image/jpeg' },
      body: Buffer.from(bytes),
    });
    expect(put.status).toBe(201);
    expect(await openStorage(parseStorageUrl(url), '/unused').list('photos')).toEqual([hash]);
    expect(fs.existsSync(path.join(dataDir, 'photos'))).toBe(false);
    const got = await fetch(`${server.url}/api/photos/${hash}`, { headers: auth });
    expect(got.status).toBe(200);
    expect(sha256(new Uint8Array(await got.arrayBuffer()))).toBe(hash);
  } finally {
    await server.close();
  }
});

describe.each(['disk', 's3'] as const)('the %s driver', (driver) => {
  let storage: ObjectStorage;
  beforeAll(async () => {
    storage = driver === 'disk' ? diskStorage(tempDir()) : s3Storage();
    await storage.check();
  });

  test('stores bytes whole, reads them back, lists, tells what it has, and removes', async () => {
    const bytes = imageBytes(1, 'jpeg', 50_000);
    const key = photoKeyOf(sha256(bytes));
    expect(await storage.get(key)).toBeNull();
    expect(await storage.has(key)).toBe(false);
    await storage.put(key, bytes);
    expect(await storage.has(key)).toBe(true);
    expect(sha256((await storage.get(key))!)).toBe(sha256(bytes));
    await storage.put('photos/second', new Uint8Array([1, 2, 3]));
    await storage.put('cache/notice-pdfs/n.A4.k.pdf', new Uint8Array([4]));
    expect(await storage.list('photos')).toEqual([sha256(bytes), 'second'].sort());
    expect(await storage.list('cache/notice-pdfs')).toEqual(['n.A4.k.pdf']);
    expect(await storage.list('ndt-reports')).toEqual([]);
    await storage.remove(key);
    await storage.remove(key); // already gone: no error
    expect(await storage.get(key)).toBeNull();
    expect(await storage.list('photos')).toEqual(['second']);
  });

  test('a key that could leave its folder is refused', async () => {
    for (const key of ['../outside', 'photos/../../x', '.hidden', 'photos/.part', '/abs', 'photos/']) {
      await expect(storage.put(key, new Uint8Array([1]))).rejects.toThrow(/not a storage key/);
    }
  });
});

describe('on S3', () => {
  test('NDT reports: stored once by SHA-256, read back through the route with the scope checks', async () => {
    const url = s3.url();
    const server = await makeTestServer({ env: { STORAGE_URL: url } });
    try {
      const doc = new PDFDocument();
      const chunks: Buffer[] = [];
      doc.on('data', (c: Buffer) => chunks.push(c));
      const done = new Promise((resolve) => doc.on('end', resolve));
      doc.text('UT report: no indications at the pivot lugs (invented).');
      doc.end();
      await done;
      const pdf = Buffer.concat(chunks);
      const hash = sha256(pdf);
      const inspector = await signInAs(server.app, 'inspector@pivotwatch.test');
      const put = () =>
        request(server.app)
          .put(`/api/ndt-reports/${hash}`)
          .set('Authorization', `Bearer ${inspector}`)
          .set('Content-Type', 'application/pdf')
          .send(pdf);
      expect((await put()).status).toBe(201);
      expect((await put()).body).toEqual({ stored: false, sha256: hash });
      expect(findNdtReport(server.db, hash)?.bytes).toBe(pdf.length);
      // In the bucket, under the prefix, as its SHA-256.
      const bucket = openStorage(parseStorageUrl(url), '/unused');
      expect(await bucket.list('ndt-reports')).toEqual([hash]);
      expect(fs.existsSync(path.join(server.dataDir, 'ndt-reports'))).toBe(false);

      const supervisor = await signInAs(server.app, 'supervisor@pivotwatch.test');
      const got = await request(server.app)
        .get(`/api/ndt-reports/${hash}`)
        .set('Authorization', `Bearer ${supervisor}`)
        .buffer(true)
        .parse((r, cb) => {
          const parts: Buffer[] = [];
          r.on('data', (c: Buffer) => parts.push(c));
          r.on('end', () => cb(null, Buffer.concat(parts)));
        });
      expect(got.status).toBe(200);
      expect(got.headers['content-type']).toBe('application/pdf');
      expect(sha256(got.body as Buffer)).toBe(hash);
      // On no record of their rides: an operator may not read it.
      const operator = await signInAs(server.app, 'operator@pivotwatch.test');
      const refused = await request(server.app)
        .get(`/api/ndt-reports/${hash}`)
        .set('Authorization', `Bearer ${operator}`);
      expect(refused.status).toBe(403);
    } finally {
      server.close();
    }
  });

  describe('backups', () => {
    let dataDir: string;
    let backupDir: string;
    let storage: ObjectStorage;
    let database: ReturnType<typeof openDb>;
    const stored = new Map<string, Buffer>();

    beforeAll(async () => {
      dataDir = tempDir();
      backupDir = path.join(tempDir(), 'backups');
      const config = loadConfig({ NODE_ENV: 'test', DATA_DIR: dataDir, STORAGE_URL: s3.url() });
      storage = storageOf(config);
      database = openDb(dataDir);
      await seedDemoData(database.db, config);
      const userId = (database.sqlite.prepare('SELECT id FROM users LIMIT 1').get() as { id: string }).id;
      for (let i = 0; i < 3; i++) {
        const bytes = imageBytes(40 + i, 'jpeg', 2_000 + i);
        await storePhoto(database.db, storage, { sha256: sha256(bytes), mime: 'image/jpeg', bytes, userId });
        stored.set(photoKeyOf(sha256(bytes)), Buffer.from(bytes));
      }
      const pdf = Buffer.from('%PDF-1.4\n% an invented NDT report\n%%EOF\n');
      await storeNdtReport(database.db, storage, { sha256: sha256(pdf), bytes: pdf, userId }, new Date());
      stored.set(ndtReportKeyOf(sha256(pdf)), pdf);
    });
    afterAll(() => {
      if (database.sqlite.open) database.close();
    });

    test('a backup reads the objects from S3; a restore into an emptied bucket and data folder brings all back', async () => {
      const made = await createBackup({
        sqlite: database.sqlite,
        storage,
        backupDir,
        kind: 'manual',
        keep: 5,
      });
      expect(made.copied).toBe(4);
      for (const [key, bytes] of stored) {
        const entry = made.manifest.files.find((f) => f.path === key);
        expect(entry).toEqual({ path: key, bytes: bytes.length, sha256: sha256(bytes) });
        expect(sha256(fs.readFileSync(path.join(made.dir, key)))).toBe(sha256(bytes));
      }
      // The next backup links the unchanged files from this one instead of reading them again.
      const next = await createBackup({
        sqlite: database.sqlite,
        storage,
        backupDir,
        kind: 'manual',
        keep: 5,
        now: new Date(Date.now() + 1000),
      });
      expect({ linked: next.linked, copied: next.copied }).toEqual({ linked: 4, copied: 0 });

      // Everything lost: the bucket's objects and the data folder.
      database.close();
      for (const key of stored.keys()) await storage.remove(key);
      fs.rmSync(dataDir, { recursive: true, force: true });

      const result = await restoreBackup({ dataDir, storage, backupDir, which: made.name });
      expect(result.filesRestored).toBe(4);
      for (const [key, bytes] of stored) expect(sha256((await storage.get(key))!)).toBe(sha256(bytes));
      // Every row of the restored database names bytes the storage holds.
      const restored = openDb(dataDir);
      try {
        const rows = [
          ...restored.db
            .select({ sha256: photos.sha256 })
            .from(photos)
            .all()
            .map((r) => photoKeyOf(r.sha256)),
          ...restored.db
            .select({ sha256: ndtReports.sha256 })
            .from(ndtReports)
            .all()
            .map((r) => ndtReportKeyOf(r.sha256)),
        ];
        expect(rows.sort()).toEqual([...stored.keys()].sort());
        for (const key of rows) expect(await storage.has(key)).toBe(true);
      } finally {
        restored.close();
      }
      // Restoring again writes nothing: every object is already there with the same bytes.
      expect((await restoreBackup({ dataDir, storage, backupDir, which: made.name })).filesRestored).toBe(0);
    });

    test('when the files cannot be put back, the database is not replaced', async () => {
      const live = path.join(dataDir, databaseFileName);
      const before = fs.readFileSync(live);
      const setAside = () => fs.readdirSync(path.join(dataDir, 'replaced'));
      const asideBefore = setAside();
      const broken = openStorage(
        parseStorageUrl(s3.url().replace(`s3://${s3.bucket}/`, 's3://no-such-bucket-here/')),
        dataDir,
      );
      const backup = fs.readdirSync(backupDir).sort()[0];
      await expect(restoreBackup({ dataDir, storage: broken, backupDir, which: backup })).rejects.toThrow();
      expect(fs.readFileSync(live).equals(before)).toBe(true);
      expect(setAside()).toEqual(asideBefore);
      // The database file is still a whole database.
      const check = new Database(live, { readonly: true });
      expect(check.pragma('integrity_check', { simple: true })).toBe('ok');
      check.close();
    });
  });
});

describe('storage:move', () => {
  async function filledDisk() {
    const root = tempDir();
    const disk = diskStorage(root);
    const keys: string[] = [];
    for (let i = 0; i < 3; i++) {
      const bytes = imageBytes(60 + i, 'png', 1_500);
      await disk.put(photoKeyOf(sha256(bytes)), bytes);
      keys.push(photoKeyOf(sha256(bytes)));
    }
    const pdf = Buffer.from('%PDF-1.4\n% invented\n%%EOF\n');
    await disk.put(ndtReportKeyOf(sha256(pdf)), pdf);
    const manual = Buffer.from('%PDF-1.7\n% invented manual\n%%EOF\n');
    await disk.put(documentKeyOf(sha256(manual)), manual);
    await disk.put('cache/notice-pdfs/n1.A4.0123.pdf', Buffer.from('%PDF-1.7 cached'));
    keys.push(ndtReportKeyOf(sha256(pdf)), documentKeyOf(sha256(manual)), 'cache/notice-pdfs/n1.A4.0123.pdf');
    return { root, disk, keys };
  }
  /** Every file under a folder with its SHA-256, to show the source is left as it was. */
  const snapshot = (root: string) =>
    (fs.readdirSync(root, { recursive: true, withFileTypes: true }) as fs.Dirent[])
      .filter((d) => d.isFile())
      .map((d) => {
        const file = path.join(d.parentPath, d.name);
        return [path.relative(root, file), sha256(fs.readFileSync(file)), fs.statSync(file).mtimeMs];
      })
      .sort();

  test('copies disk → S3 → disk, checking each object by SHA-256; the source is unchanged', async () => {
    const { root, disk, keys } = await filledDisk();
    const before = snapshot(root);
    const bucket = s3Storage();

    const first = await moveStorage(disk, bucket);
    expect(first.problems).toEqual([]);
    expect(first.folders).toEqual({
      photos: { copied: 3, already: 0, vanished: 0 },
      'ndt-reports': { copied: 1, already: 0, vanished: 0 },
      documents: { copied: 1, already: 0, vanished: 0 },
      'cache/notice-pdfs': { copied: 1, already: 0, vanished: 0 },
    });
    expect(snapshot(root)).toEqual(before);
    // Run again: nothing to copy.
    const again = await moveStorage(disk, bucket);
    expect(Object.values(again.folders).map((c) => c.copied)).toEqual([0, 0, 0, 0]);
    expect(Object.values(again.folders).map((c) => c.already)).toEqual([3, 1, 1, 1]);

    const back = diskStorage(tempDir());
    expect((await moveStorage(bucket, back)).problems).toEqual([]);
    for (const key of keys) expect(sha256((await back.get(key))!)).toBe(sha256((await disk.get(key))!));
  });

  test('a photo whose bytes do not match its name is reported and not copied', async () => {
    const { disk } = await filledDisk();
    const name = sha256(new Uint8Array([9, 9, 9]));
    await disk.put(photoKeyOf(name), new Uint8Array([1, 2, 3]));
    const to = diskStorage(tempDir());
    const result = await moveStorage(disk, to);
    expect(result.problems).toEqual([
      expect.stringContaining(`photos/${name}: the source bytes do not hash`),
    ]);
    expect(await to.has(photoKeyOf(name))).toBe(false);
    expect(result.folders.photos.copied).toBe(3);
  });

  test('the script prints the counts, and refuses a bad URL in plain words', async () => {
    const { root } = await filledDisk();
    const run = (...args: string[]) =>
      promisify(execFile)(
        path.join(repoRoot, 'node_modules/.bin/tsx'),
        ['scripts/move-storage.ts', ...args],
        {
          cwd: repoRoot,
          env: { ...process.env, DATA_DIR: root },
        },
      );
    const out = await run('--from', 'file:', '--to', s3.url());
    expect(out.stdout).toMatch(/^photos: 3 copied, 0 already there/m);
    expect(out.stdout).toMatch(/^ndt-reports: 1 copied/m);
    expect(out.stdout).toMatch(/Every object is at the destination with the same SHA-256/);

    const bad = await run('--from', 'file:', '--to', 's3://X').catch(
      (e: { code: number; stderr: string }) => e,
    );
    expect(bad).toMatchObject({ code: 1 });
    expect((bad as { stderr: string }).stderr).toMatch(/--to s3:\/\/X: "X" is not a bucket name/);
  }, 120_000);
});
