/**
 * Notice PDFs are drawn in a worker thread once per notice, paper size and content, then served from the
 * cache in the storage (server/notices/pdf/cache.ts), on both drivers (the disk, and S3 through s3rver):
 * the second GET renders nothing and answers the very same bytes; the other paper size is its own file; a
 * photo the notice names, uploaded after the first render, makes a new PDF.
 */
import fs from 'node:fs';

import { eq, sql } from 'drizzle-orm';
import request from 'supertest';

import { notices } from '@/db/server/notices';
import { noticePdf } from '@/server/notices/deliveries';
import { noticePdfCacheDirOf } from '@/server/notices/pdf/cache';
import * as offThread from '@/server/notices/pdf/render-off-thread';
import { storageOf } from '@/server/storage';

import { signInAs } from './helpers';
import {
  approveAndIssue,
  inspectWithFindings,
  makeNoticeServer,
  pdfText,
  photoPng,
  type NoticeServer,
} from './notices-fixtures';
import { startFakeS3, type FakeS3 } from './s3-fake';
import { sha256Hex } from './sync-fixtures';

let s3: FakeS3;
beforeAll(async () => {
  s3 = await startFakeS3();
});
afterAll(() => s3.stop());

describe.each(['disk', 's3'] as const)('on the %s storage', (driver) => {
  let s: NoticeServer;
  let token: string;
  beforeAll(async () => {
    s = await makeNoticeServer(
      new Date('2026-05-04T08:00:00Z'),
      driver === 's3' ? { STORAGE_URL: s3.url() } : {},
    );
    token = await signInAs(s.app, 'supervisor@pivotwatch.test');
  });
  afterAll(() => s.close());

  const getPdf = (id: string, size = 'A4') =>
    request(s.app)
      .get(`/api/notices/${id}/pdf?size=${size}`)
      .set('Authorization', `Bearer ${token}`)
      .buffer(true)
      .parse((res, done) => {
        const chunks: Buffer[] = [];
        res.on('data', (c: Buffer) => chunks.push(c));
        res.on('end', () => done(null, Buffer.concat(chunks)));
      });
  const cached = () => storageOf(s.config).list('cache/notice-pdfs');
  /** On S3 nothing is cached on the disk; on the disk, in DATA_DIR/cache/notice-pdfs as before. */
  const onDisk = () => {
    const dir = noticePdfCacheDirOf(s.config.dataDir);
    return fs.existsSync(dir) ? fs.readdirSync(dir).sort() : [];
  };

  test('the second GET is served from the cache, byte for byte; sizes and new photos get their own', async () => {
    const inspected = await inspectWithFindings(
      s,
      'Skylark',
      [{ severity: 'fix_by_date', description: 'Step edge worn', dueOn: '2026-05-30', photos: [0] }],
      1,
    );
    const notice = approveAndIssue(s, inspected.inspectionId);
    // The notice also names a photo the server does not hold yet (its upload still on the way).
    const late = photoPng(301);
    const lateSha = sha256Hex(late);
    s.db.run(
      sql`UPDATE ${notices} SET document = json_insert(document, '$.findings[0].photos[#]', json_object('sha256', ${lateSha}, 'caption', 'Late photo')) WHERE id = ${notice.id}`,
    );
    const renders = jest.spyOn(offThread, 'renderNoticePdfOffThread');

    const first = await getPdf(notice.id);
    expect(first.status).toBe(200);
    expect(first.headers['content-type']).toBe('application/pdf');
    expect(renders).toHaveBeenCalledTimes(1);
    // Drawn in the worker thread: the same bytes as drawn in this process.
    const document = s.db.select().from(notices).where(eq(notices.id, notice.id)).get()!.document;
    const here = await noticePdf(s.db, storageOf(s.config), document, 'A4');
    expect(Buffer.compare(first.body as Buffer, here)).toBe(0);
    const second = await getPdf(notice.id);
    expect(renders).toHaveBeenCalledTimes(1);
    expect(Buffer.compare(second.body as Buffer, first.body as Buffer)).toBe(0);
    expect(await cached()).toHaveLength(1);
    expect(onDisk()).toEqual(driver === 'disk' ? await cached() : []);
    // An independent reader (pdf-parse) finds the notice in the cached copy.
    expect(await pdfText(second.body as Buffer)).toContain(notice.reference);

    const letter = await getPdf(notice.id, 'LETTER');
    expect(letter.status).toBe(200);
    expect(renders).toHaveBeenCalledTimes(2);
    expect(Buffer.compare(letter.body as Buffer, first.body as Buffer)).not.toBe(0);
    expect(await cached()).toHaveLength(2);

    // The late photo arrives: the next A4 PDF is drawn again with it, and replaces the older file.
    expect((await s.putPhoto('inspector@pivotwatch.test', late, lateSha)).status).toBe(201);
    const withPhoto = await getPdf(notice.id);
    expect(renders).toHaveBeenCalledTimes(3);
    expect((withPhoto.body as Buffer).length).toBeGreaterThan((first.body as Buffer).length);
    expect(await cached()).toHaveLength(2);
    const again = await getPdf(notice.id);
    expect(renders).toHaveBeenCalledTimes(3);
    expect(Buffer.compare(again.body as Buffer, withPhoto.body as Buffer)).toBe(0);
    renders.mockRestore();
  }, 60_000);

  test('the e-mail attachment is drawn into the same cache: the GET that follows renders nothing', async () => {
    const inspected = await inspectWithFindings(
      s,
      'Tidebreaker',
      [
        {
          severity: 'fix_by_date',
          description: 'Handrail paint chipped at the exit ramp',
          dueOn: '2026-05-30',
        },
      ],
      0,
    );
    const notice = approveAndIssue(s, inspected.inspectionId);
    const renders = jest.spyOn(offThread, 'renderNoticePdfOffThread');
    const run = await s.deliver();
    expect(run.sent).toBeGreaterThan(0);
    const mails = s.fake.list().filter((m) => m.subject.includes(notice.reference));
    expect(mails.length).toBeGreaterThan(0);
    const message = await s.fake.get(mails[0].id);
    const attachment = message!.attachments[0].content;
    // Drawn once for the e-mail, at the paper size the server sends (A4 unless set), and kept.
    expect((await cached()).filter((name) => name.startsWith(`${notice.id}.A4.`))).toHaveLength(1);

    const served = await getPdf(notice.id);
    expect(served.status).toBe(200);
    expect(renders).not.toHaveBeenCalled();
    expect(Buffer.compare(served.body as Buffer, attachment)).toBe(0);
    expect(await pdfText(served.body as Buffer)).toContain(notice.reference);
    renders.mockRestore();
  }, 60_000);
});
