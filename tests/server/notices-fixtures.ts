/**
 * A server for the notice tests: the demo scenario on a pinned clock, a real loopback SMTP server (the
 * mail layer's fake) behind a real nodemailer mailer, and helpers to put an inspection with findings
 * through approval the way the review desk does. Data is the invented demo scenario.
 */
import { execFile } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { randomUUID } from 'node:crypto';

import { eq } from 'drizzle-orm';
import type { Express } from 'express';
import request from 'supertest';

import { inspections } from '@/db/server/inspections';
import { findings } from '@/db/server/review';
import { companies, rides } from '@/db/server/schema';
import type { FindingSeverity } from '@/features/review/schema';
import { createApp } from '@/server/app';
import { loadConfig, type Config, type Env } from '@/server/config';
import { openDb, type Db } from '@/server/db';
import { createLogger } from '@/server/logger';
import { repoRoot } from '@/server/paths';
import { startFakeSmtp, type FakeSmtp } from '@/server/mail/fake-smtp';
import { createMailer, type Mailer } from '@/server/mail/mailer';
import { processDeliveries } from '@/server/notices/deliveries';
import { issueInspectionNotice } from '@/server/notices/issue';
import { seedDemoData } from '@/server/seed/demo';
import { storageOf } from '@/server/storage';
import { analysePending } from '@/server/sync/analysis';

import { makeTempDir, signInAs, userIdOf } from './helpers';
import { demoClients, type Clients } from './registry-helpers';
import { demoRide, makeRecord, photoRefFor, speedReading } from './sync-fixtures';
import { encodePng } from '@/scripts/sample-notice';

export const appUrl = 'https://pivotwatch.example.test';

export type NoticeServer = {
  app: Express;
  db: Db;
  config: Config;
  api: Clients;
  fake: FakeSmtp;
  mailer: Mailer;
  /** The pinned clock; tests move it with `setNow`. */
  now: () => Date;
  setNow: (d: Date) => void;
  /** Sends whatever is due at the pinned time. */
  deliver: () => ReturnType<typeof processDeliveries>;
  /** PUT /api/photos/:sha256 as the given demo user. */
  putPhoto: (email: string, bytes: Buffer, sha256: string) => Promise<request.Response>;
  close: () => Promise<void>;
};

/** `env` adds settings, e.g. STORAGE_URL to keep the stored files in S3. */
export async function makeNoticeServer(start: Date, env: Env = {}): Promise<NoticeServer> {
  const dataDir = makeTempDir('pivotwatch-notices-');
  const config = loadConfig({
    NODE_ENV: 'test',
    DATA_DIR: dataDir,
    WEB_DIR: path.join(dataDir, 'no-web-build'),
    APP_URL: appUrl,
    ...env,
  });
  const database = openDb(config.dataDir);
  await seedDemoData(database.db, config, { now: start });
  const fake = await startFakeSmtp({ dir: path.join(dataDir, 'mailbox') });
  const mailer = createMailer({ smtpUrl: fake.url, from: config.mailFrom });
  let now = start;
  const app = createApp({
    db: database.db,
    config,
    logger: createLogger(config),
    signInLimit: { windowMs: 60_000, max: 10_000 },
    now: () => now,
    mail: { mailer, fake },
  });
  const api = await demoClients(app);
  return {
    app,
    db: database.db,
    config,
    api,
    fake,
    mailer,
    now: () => now,
    setNow: (d) => {
      now = d;
    },
    deliver: () => processDeliveries({ db: database.db, mailer, storage: storageOf(config) }, now),
    putPhoto: async (email, bytes, sha256) =>
      request(app)
        .put(`/api/photos/${sha256}`)
        .set('Authorization', `Bearer ${await signInAs(app, email)}`)
        .set('Content-Type', 'image/png')
        .send(bytes),
    close: async () => {
      mailer.close();
      await fake.close();
      database.close();
      fs.rmSync(dataDir, { recursive: true, force: true });
    },
  };
}

/** Real PNG photos (so the PDF embeds them), different per seed. */
export function photoPng(seed: number): Buffer {
  return encodePng(64, 48, (x, y) => [
    (x * 4 + seed * 37) % 256,
    (y * 5 + seed * 11) % 256,
    (seed * 53) % 256,
  ]);
}

export type FindingSpec = {
  severity: FindingSeverity;
  description: string;
  requiredAction?: string | null;
  dueOn?: string | null;
  /** Indexes into the inspection's photos. */
  photos?: number[];
};

export type Inspected = { inspectionId: string; rideId: string; findingIds: string[]; photoShas: string[] };

/**
 * An inspection of `rideName` pushed by the demo inspector with `photoCount` photos uploaded, analysed by
 * the server, with findings written on it (as the review desk stores them).
 */
export async function inspectWithFindings(
  s: NoticeServer,
  rideName: string,
  specs: FindingSpec[],
  photoCount = 1,
): Promise<Inspected> {
  const ride = demoRide(s.db, rideName);
  const photoBytes = Array.from({ length: photoCount }, (_, i) => photoPng(i + 1 + specs.length * 7));
  const refs = photoBytes.map((bytes, i) =>
    photoRefFor(bytes, { mime: 'image/png', caption: `Pivot photo ${i + 1}` }),
  );
  const record = makeRecord(ride, { readings: [speedReading(11.5)], photos: refs });
  const pushed = await s.api.inspector.push([record]);
  if (pushed.body.results?.[0]?.status !== 'accepted') throw new Error(`push failed: ${pushed.text}`);
  for (const [i, bytes] of photoBytes.entries()) {
    const res = await s.putPhoto('inspector@pivotwatch.test', bytes, refs[i].sha256);
    if (res.status !== 201 && res.status !== 200) throw new Error(`photo upload failed: ${res.text}`);
  }
  await analysePending(s.db);

  const supervisor = userIdOf(s.db, 'supervisor@pivotwatch.test');
  const at = s.now().toISOString();
  const findingIds = specs.map((spec, i) => {
    const id = randomUUID();
    s.db
      .insert(findings)
      .values({
        id,
        inspectionId: record.id,
        rideId: ride.id,
        number: i + 1,
        severity: spec.severity,
        description: spec.description,
        requiredAction: spec.requiredAction ?? (spec.severity === 'note' ? null : 'Correct and report.'),
        dueOn: spec.dueOn ?? null,
        photoShas: (spec.photos ?? []).map((p) => refs[p].sha256),
        createdAt: at,
        createdBy: supervisor,
        updatedAt: at,
        updatedBy: supervisor,
      })
      .run();
    return id;
  });
  return { inspectionId: record.id, rideId: ride.id, findingIds, photoShas: refs.map((r) => r.sha256) };
}

/**
 * Approves the inspection and issues its notice in one transaction, as the review desk's approval does,
 * optionally setting the ride's status first (a supervisor stopping the ride with the decision).
 */
export function approveAndIssue(
  s: NoticeServer,
  inspectionId: string,
  opts: { note?: string; rideStatus?: { status: 'restricted' | 'out_of_service'; reason: string } } = {},
) {
  const supervisor = userIdOf(s.db, 'supervisor@pivotwatch.test');
  const now = s.now();
  return s.db.transaction((tx) => {
    const row = tx
      .update(inspections)
      .set({
        reviewState: 'approved',
        reviewedAt: now.toISOString(),
        reviewedBy: supervisor,
        reviewNote: opts.note ?? null,
      })
      .where(eq(inspections.id, inspectionId))
      .returning({ rideId: inspections.rideId })
      .get();
    if (opts.rideStatus)
      tx.update(rides)
        .set({
          status: opts.rideStatus.status,
          statusReason: opts.rideStatus.reason,
          statusSince: now.toISOString(),
        })
        .where(eq(rides.id, row.rideId))
        .run();
    const issued = issueInspectionNotice(tx, { inspectionId, userId: supervisor, now, appUrl });
    if (!issued) throw new Error('no notice issued');
    return issued;
  });
}

export function companyOfRide(db: Db, rideName: string) {
  const row = db
    .select({ id: companies.id, name: companies.name, noticeEmails: companies.noticeEmails })
    .from(rides)
    .innerJoin(companies, eq(companies.id, rides.operatorCompanyId))
    .where(eq(rides.name, rideName))
    .get();
  if (!row) throw new Error(`no ride ${rideName}`);
  return row;
}

export function rideRow(db: Db, rideName: string) {
  const row = db.select().from(rides).where(eq(rides.name, rideName)).get();
  if (!row) throw new Error(`no ride ${rideName}`);
  return row;
}

/**
 * pdf-parse (on Mozilla's pdf.js) loads its worker with a dynamic import, which jest's module system
 * refuses; it runs in a plain Node process instead, reading the PDF on stdin.
 */
const pdfTextScript = `
import { PDFParse } from 'pdf-parse';
const chunks = [];
for await (const chunk of process.stdin) chunks.push(chunk);
const parser = new PDFParse({ data: new Uint8Array(Buffer.concat(chunks)) });
const result = await parser.getText();
await parser.destroy();
process.stdout.write(result.text);
`;

/** The text of a PDF as an independent reader (pdf-parse) extracts it, whitespace-flattened. */
export function pdfText(pdf: Buffer): Promise<string> {
  return new Promise((resolve, reject) => {
    const child = execFile(
      process.execPath,
      ['--input-type=module', '-e', pdfTextScript],
      { cwd: repoRoot, maxBuffer: 16 * 1024 * 1024 },
      (error, stdout) => (error ? reject(error) : resolve(stdout.replace(/\s+/g, ' '))),
    );
    child.stdin?.end(pdf);
  });
}
