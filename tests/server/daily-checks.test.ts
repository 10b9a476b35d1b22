/**
 * Operators' daily pre-opening checks and checklist templates per inspection type, over HTTP: templates
 * made and listed with their type and picked by class and type with the general one as fallback; a daily
 * check pushed by an operator's phone through the same signed push as an inspection, scoped to their
 * company's rides and to the daily type; what inspectors and supervisors see of it; a failed check in the
 * review queue; and the missed days worked out against dates worked by hand.
 */
import fs from 'node:fs';
import path from 'node:path';

import Database from 'better-sqlite3';
import { eq } from 'drizzle-orm';
import { drizzle } from 'drizzle-orm/better-sqlite3';
import { migrate } from 'drizzle-orm/better-sqlite3/migrator';
import request from 'supertest';

import { runningLog } from '@/db/server/life';
import { inspections } from '@/db/server/inspections';
import { ledgerEntries } from '@/db/server/ledger';
import {
  dailyOverviewResponseSchema,
  missedDays,
  rideDailyChecksResponseSchema,
} from '@/features/daily-checks/schema';
import { recordHashOf } from '@/features/ledger';
import type { InspectionRecord } from '@/features/records/schema';
import {
  checklistTemplateListResponseSchema,
  checklistTemplateResponseSchema,
  pickChecklistTemplate,
  rideListPageSchema,
} from '@/features/registry/schema';
import { queueResponseSchema } from '@/features/review/schema';
import { rides as ridesTable } from '@/db/server/schema';
import { loadConfig } from '@/server/config';
import { databaseFileName, openDb } from '@/server/db';
import { serverMigrationsDir } from '@/server/paths';
import { dailyChecksOfRide, rideDailyChecks } from '@/server/daily-checks/daily-checks';
import { addDemoDailyChecks } from '@/server/seed/demo-daily-checks';
import { seedDemoData } from '@/server/seed/demo';
import { queueDay, refreshQueue } from '@/server/queue/queue-refresh';

import type { PhoneKey } from '../support/phone-keys';
import {
  expectApiError,
  makeTempDir,
  pushSigned,
  registerPhoneKey,
  signInAs,
  userIdOf,
  type TestServer,
} from './helpers';
import { demoClients, makePinnedServer, type Clients } from './registry-helpers';
import { makeRecord } from './sync-fixtures';

// Pinned to a summer day, 10:00 UTC (11:00 on the pier's London clock): the morning's checks are done.
const today = '2026-06-15';
const now = new Date(`${today}T10:00:00Z`);
let server: TestServer;
let api: Clients;
let rideIds: Map<string, string>;
const operator = { email: 'operator@pivotwatch.test', token: '', key: null as PhoneKey | null };

beforeAll(async () => {
  server = await makePinnedServer(now);
  // The demo seeds a running log (and, with its history, daily checks); these tests start from none.
  server.db.delete(runningLog).run();
  server.db.delete(inspections).where(eq(inspections.type, 'daily_pre_opening')).run();
  refreshQueue(server.db, queueDay(server.db, now));
  api = await demoClients(server.app);
  operator.token = await signInAs(server.app, operator.email);
  operator.key = await registerPhoneKey(server.app, operator.token);
  const rides = rideListPageSchema.parse((await api.admin.get('/api/rides?pageSize=50')).body).rides;
  rideIds = new Map(rides.map((r) => [r.name, r.id]));
}, 60_000);
afterAll(() => server.close());

// Tamsworth Pier Leisure (operator@) runs Twin Comet and Lantern Wheel; Corvane (operator2@) runs Tidebreaker.
const ride = (name: string) => {
  const id = rideIds.get(name);
  if (!id) throw new Error(`no ride ${name}`);
  return id;
};

const content = (text: string) => ({ areas: [{ title: 'Before opening', items: [{ text }] }] });

function dailyCheck(rideId: string, patch: Partial<InspectionRecord> = {}): InspectionRecord {
  return makeRecord(
    { id: rideId, designVersionId: null },
    {
      type: 'daily_pre_opening',
      authorId: userIdOf(server.db, operator.email),
      readings: [],
      checklist: [
        { itemId: 'restraints', area: 'Before opening', text: 'Every restraint locks', result: 'pass' },
        { itemId: 'fence', area: 'Before opening', text: 'Queue fence and gates closed', result: 'pass' },
      ],
      testRuns: [{ cycles: 2, result: 'pass' }],
      submittedAt: '2026-06-15T07:30:00.000Z',
      declaration: {
        text: 'I made these checks before opening and recorded what I found.',
        declaredAt: '2026-06-15T07:30:00.000Z',
        declaredBy: userIdOf(server.db, operator.email),
        declaredByName: 'Priya Castellan',
      },
      ...patch,
    },
  );
}

const pushAsOperator = (records: InspectionRecord[]) =>
  pushSigned(server.app, operator.token, operator.key as PhoneKey, records);

describe('checklist templates per inspection type', () => {
  test('made with a type, listed with it, one per class and type, the general one kept', async () => {
    const afterRepair = await api.admin.post('/api/checklist-templates', {
      name: 'Wheel — after repair',
      rideClass: 'wheel',
      inspectionType: 'after_repair',
      content: content('The repaired part is as the repair report says'),
    });
    expect(afterRepair.status).toBe(201);
    expect(checklistTemplateResponseSchema.parse(afterRepair.body).template.inspectionType).toBe(
      'after_repair',
    );

    // A second checklist for the same class and type would leave the phone guessing: refused, nothing stored.
    const second = await api.supervisor.post('/api/checklist-templates', {
      name: 'Wheel — another daily list',
      rideClass: 'wheel',
      inspectionType: 'daily_pre_opening',
      content: content('Anything'),
    });
    expectApiError(second, 409, 'template_exists');

    // Inspectors read; only supervisors and admins make templates.
    expectApiError(
      await api.inspector.post('/api/checklist-templates', {
        name: 'x',
        rideClass: 'wheel',
        inspectionType: 'periodic',
        content: content('x'),
      }),
      403,
      'forbidden',
    );

    const list = checklistTemplateListResponseSchema.parse(
      (await api.inspector.get('/api/checklist-templates?rideClass=wheel')).body,
    ).templates;
    expect(list.map((t) => [t.name, t.inspectionType])).toEqual([
      ['Wheel — after repair', 'after_repair'],
      // The demo's template from before types existed stays the class's general one.
      ['Wheel — periodic inspection', null],
      ['Wheel — pre-opening daily check', 'daily_pre_opening'],
    ]);
    const general = checklistTemplateListResponseSchema.parse(
      (await api.inspector.get('/api/checklist-templates?rideClass=wheel&inspectionType=general')).body,
    ).templates;
    expect(general.map((t) => t.name)).toEqual(['Wheel — periodic inspection']);

    // Picking: the type's own checklist, else the general one (said so), never the general one for a daily check.
    expect(pickChecklistTemplate(list, 'wheel', 'after_repair')).toMatchObject({
      template: { name: 'Wheel — after repair' },
      fallback: false,
    });
    expect(pickChecklistTemplate(list, 'wheel', 'annual')).toMatchObject({
      template: { name: 'Wheel — periodic inspection' },
      fallback: true,
    });
    expect(pickChecklistTemplate(list, 'wheel', 'daily_pre_opening').template?.name).toBe(
      'Wheel — pre-opening daily check',
    );
    const withoutDaily = list.filter((t) => t.inspectionType !== 'daily_pre_opening');
    expect(pickChecklistTemplate(withoutDaily, 'wheel', 'daily_pre_opening')).toEqual({
      template: null,
      fallback: false,
    });
  });

  test("a template's type is changed by the editors, the one-per-type rule still holding", async () => {
    const list = checklistTemplateListResponseSchema.parse(
      (await api.admin.get('/api/checklist-templates?rideClass=wheel')).body,
    ).templates;
    const afterRepair = list.find((t) => t.inspectionType === 'after_repair')!;
    const body = { content: content('The repaired part is as the repair report says'), reason: 'Retyped' };
    expectApiError(
      await api.supervisor.put(`/api/checklist-templates/${afterRepair.id}`, {
        ...body,
        inspectionType: 'daily_pre_opening',
      }),
      409,
      'template_exists',
    );
    const moved = await api.supervisor.put(`/api/checklist-templates/${afterRepair.id}`, {
      ...body,
      inspectionType: 'annual',
    });
    expect(moved.status).toBe(200);
    expect(checklistTemplateResponseSchema.parse(moved.body).template.inspectionType).toBe('annual');
  });

  test("an operator's phone pulls the daily checklists of its rides' classes and no inspector's", async () => {
    const res = await request(server.app)
      .get('/api/sync/pull')
      .set('Authorization', `Bearer ${operator.token}`);
    expect(res.status).toBe(200);
    const templates = res.body.templates as { name: string; inspectionType: string | null }[];
    expect(templates.map((t) => t.name)).toContain('Wheel — pre-opening daily check');
    expect(templates.every((t) => t.inspectionType === 'daily_pre_opening')).toBe(true);
    // Their own company's rides only.
    const names = (res.body.rides as { name: string }[]).map((r) => r.name).sort();
    expect(names).toEqual(['Lantern Wheel', 'Skylark', 'Twin Comet']);
  });
});

describe('daily checks pushed from an operator’s phone', () => {
  test('accepted for their own ride through the signed push, and joined to its record chain', async () => {
    const check = dailyCheck(ride('Lantern Wheel'));
    const res = await pushAsOperator([check]);
    expect(res.status).toBe(200);
    expect(res.body.results).toEqual([{ id: check.id, status: 'accepted' }]);
    const row = server.db.select().from(inspections).where(eq(inspections.id, check.id)).get();
    expect(row).toMatchObject({ type: 'daily_pre_opening', failedItems: 0, reviewState: 'submitted' });
    // The chain's entry carries the phone's signature over the record's RFC 8785 hash (features/ledger).
    const entry = server.db.select().from(ledgerEntries).where(eq(ledgerEntries.refId, check.id)).get();
    expect(entry?.recordHash).toBe(recordHashOf(row!.record));
    expect(entry?.deviceKeyId).toBe(operator.key?.keyId);
  });

  test("another company's ride is refused as unknown, and nothing is stored", async () => {
    const check = dailyCheck(ride('Tidebreaker'));
    const res = await pushAsOperator([check]);
    expect(res.body.results[0]).toMatchObject({ status: 'rejected', issues: [{ path: 'rideId' }] });
    expect(server.db.select().from(inspections).where(eq(inspections.id, check.id)).get()).toBeUndefined();
  });

  test('an operator sends no other type, and test runs belong to daily checks only', async () => {
    const periodic = dailyCheck(ride('Twin Comet'), { type: 'periodic', testRuns: undefined });
    const res = await pushAsOperator([periodic]);
    expect(res.body.results[0]).toMatchObject({ status: 'rejected', issues: [{ path: 'type' }] });

    const inspectorRecord = makeRecord(
      { id: ride('Twin Comet'), designVersionId: null },
      { readings: [], testRuns: [{ cycles: 1, result: 'pass' }] },
    );
    const byInspector = await api.inspector.push([inspectorRecord]);
    expect(byInspector.body.results[0]).toMatchObject({ status: 'rejected', issues: [{ path: 'testRuns' }] });
    expect(server.db.select().from(inspections).where(eq(inspections.id, periodic.id)).get()).toBeUndefined();
  });

  test('inspectors and supervisors see the check; the other operator does not', async () => {
    for (const who of [api.inspector, api.supervisor, api.operator]) {
      const res = await who.get(`/api/rides/${ride('Lantern Wheel')}/daily-checks`);
      expect(res.status).toBe(200);
      const body = rideDailyChecksResponseSchema.parse(res.body);
      expect(body.checks).toHaveLength(1);
      expect(body.checks[0]).toMatchObject({
        day: today,
        result: 'pass',
        testCycles: 2,
        byName: 'Priya Castellan',
      });
      expect(body.todayState).toBe('done');
    }
    expectApiError(
      await api.operator2.get(`/api/rides/${ride('Lantern Wheel')}/daily-checks`),
      404,
      'not_found',
    );
    const overview = dailyOverviewResponseSchema.parse(
      (await api.operator2.get('/api/daily-checks/overview')).body,
    );
    expect(overview.rides.map((r) => r.rideName)).not.toContain('Lantern Wheel');
    // The logbook's read: day, result and who.
    expect(dailyChecksOfRide(server.db, ride('Lantern Wheel'))).toEqual([
      expect.objectContaining({ day: today, result: 'pass', byName: 'Priya Castellan' }),
    ]);
  });

  test('a failed check is shown to the inspection body in the queue, and is not an inspection to decide', async () => {
    const failed = dailyCheck(ride('Twin Comet'), {
      checklist: [
        {
          itemId: 'restraints',
          area: 'Before opening',
          text: 'Every restraint locks',
          result: 'fail',
          note: 'Seat 4 lap bar does not lock',
        },
      ],
      submittedAt: '2026-06-15T07:45:00.000Z',
    });
    expect((await pushAsOperator([failed])).body.results[0].status).toBe('accepted');

    const queue = queueResponseSchema.parse(
      (await api.supervisor.get('/api/review/queue?pageSize=100')).body,
    );
    const rows = queue.items.filter((i) => i.rideId === ride('Twin Comet'));
    // No row asks for a decision on the check; the ride's row says it failed, below "over limit".
    expect(rows.some((r) => r.inspectionId === failed.id)).toBe(false);
    const rideRow = rows.find((r) => r.kind === 'ride');
    expect(rideRow).toMatchObject({ urgency: 'failed', dailyFailedAt: '2026-06-15T07:45:00.000Z' });

    expectApiError(
      await api.supervisor.post(`/api/inspections/${failed.id}/decision`, { decision: 'approve' }),
      409,
      'daily_check',
    );
    const checks = rideDailyChecksResponseSchema.parse(
      (await api.operator.get(`/api/rides/${ride('Twin Comet')}/daily-checks`)).body,
    ).checks;
    expect(checks[0]).toMatchObject({ id: failed.id, result: 'fail', failedItems: 1 });

    // A later check that passes clears the queue's flag.
    const passed = dailyCheck(ride('Twin Comet'), { submittedAt: '2026-06-15T08:30:00.000Z' });
    expect((await pushAsOperator([passed])).body.results[0].status).toBe('accepted');
    const after = queueResponseSchema.parse(
      (await api.supervisor.get('/api/review/queue?pageSize=100')).body,
    );
    expect(after.items.find((i) => i.rideId === ride('Twin Comet') && i.dailyFailedAt)).toBeUndefined();
  });
});

describe('missed days', () => {
  // Worked by hand: today is Monday 15 June 2026; the window is the 14 days before it (1–14 June).
  test('the rule, against dates worked by hand', () => {
    const ran = [
      { day: '2026-06-15', cycles: 40, hours: null }, // today: "not done yet", never missed
      { day: '2026-06-14', cycles: 120, hours: null }, // ran, checked
      { day: '2026-06-13', cycles: 95, hours: null }, // ran, no check → missed
      { day: '2026-06-12', cycles: 0, hours: null }, // logged but did not run
      { day: '2026-06-11', cycles: null, hours: 3.5 }, // ran by the hour, no check → missed
      { day: '2026-05-31', cycles: 80, hours: null }, // before the window (15 days ago)
      { day: '2026-06-01', cycles: 80, hours: null }, // first day of the window, no check → missed
    ];
    const checkedDays = new Set(['2026-06-14']);
    expect(missedDays({ ran, checkedDays, firstCheckDay: '2026-05-20', today })).toEqual([
      '2026-06-13',
      '2026-06-11',
      '2026-06-01',
    ]);
    // Only from the ride's first daily check kept here; none at all, nothing to miss.
    expect(missedDays({ ran, checkedDays, firstCheckDay: '2026-06-11', today })).toEqual([
      '2026-06-13',
      '2026-06-11',
    ]);
    expect(missedDays({ ran, checkedDays: new Set(), firstCheckDay: null, today })).toEqual([]);
  });

  test('from the running log and the checks, shown on the ride, the overview and in the queue', async () => {
    const skylark = ride('Skylark');
    const entries = [
      ['2026-06-12', 150],
      ['2026-06-13', 210],
      ['2026-06-14', 0],
      ['2026-06-15', 60],
    ] as const;
    for (const [day, cycles] of entries) {
      const res = await api.operator.post(`/api/rides/${skylark}/running-log`, { day, cycles });
      expect([200, 201]).toContain(res.status);
    }
    // The check of the 12th, made at 23:30 UTC on the 11th — 00:30 on the 12th on the pier's London clock.
    const early = dailyCheck(skylark, { submittedAt: '2026-06-11T23:30:00.000Z' });
    expect((await pushAsOperator([early])).body.results[0].status).toBe('accepted');

    const body = rideDailyChecksResponseSchema.parse(
      (await api.supervisor.get(`/api/rides/${skylark}/daily-checks`)).body,
    );
    expect(body.checks.map((c) => c.day)).toEqual(['2026-06-12']);
    // The 13th ran with no check; the 14th did not run; today has none yet.
    expect(body.missedDays).toEqual(['2026-06-13']);
    expect(body.todayState).toBe('not_done_yet');

    const overview = dailyOverviewResponseSchema.parse(
      (await api.operator.get('/api/daily-checks/overview')).body,
    );
    expect(overview.rides.find((r) => r.rideId === skylark)).toMatchObject({
      todayState: 'not_done_yet',
      missedDays: ['2026-06-13'],
    });

    refreshQueue(server.db, queueDay(server.db, now), [skylark]);
    const queue = queueResponseSchema.parse(
      (await api.supervisor.get('/api/review/queue?pageSize=100')).body,
    );
    expect(queue.items.find((i) => i.rideId === skylark && i.kind === 'ride')).toMatchObject({
      dailyMissedOn: '2026-06-13',
    });
  });
});

describe('the demo', () => {
  test('its history holds daily checks on every day run in the fortnight but one of Tidebreaker', async () => {
    const dataDir = makeTempDir();
    const config = loadConfig({ NODE_ENV: 'test', DATA_DIR: dataDir, WEB_DIR: path.join(dataDir, 'web') });
    const database = openDb(config.dataDir);
    try {
      await seedDemoData(database.db, config, { now, activity: true });
      const rides = database.db
        .select({ id: ridesTable.id, name: ridesTable.name, status: ridesTable.status })
        .from(ridesTable)
        .all();
      const missed = Object.fromEntries(
        rides.map((r) => [r.name, rideDailyChecks(database.db, r, now).missedDays.length]),
      );
      expect(missed).toEqual({
        Skylark: 0,
        'Twin Comet': 0,
        'Lantern Wheel': 0,
        Tidebreaker: 1,
        'Whirligig Chairs': 0,
        'Little Kite': 0,
      });
      // Seeding again adds nothing (fixed ids).
      const count = () =>
        database.db
          .select({ id: inspections.id })
          .from(inspections)
          .where(eq(inspections.type, 'daily_pre_opening'))
          .all().length;
      const before = count();
      expect(before).toBeGreaterThan(0);
      expect(addDemoDailyChecks(database.db, now)).toBe(0);
      expect(count()).toBe(before);
    } finally {
      database.close();
      fs.rmSync(dataDir, { recursive: true, force: true });
    }
  }, 120_000);
});

describe('the migration that adds after-repair', () => {
  // It rebuilds `inspections` (its type CHECK), which findings refer to. SQLite's procedure for that
  // (https://sqlite.org/lang_altertable.html, section 7) turns foreign keys off around it: with them on,
  // dropping the old table fails on any database holding a finding.
  test('an existing database with inspections and findings migrates, keeps them, and still enforces keys', () => {
    const folder = path.join(makeTempDir(), 'migrations');
    fs.cpSync(serverMigrationsDir, folder, { recursive: true });
    const journalFile = path.join(folder, 'meta', '_journal.json');
    const journal = JSON.parse(fs.readFileSync(journalFile, 'utf8')) as { entries: { tag: string }[] };
    const rebuilds = (tag: string) =>
      fs.readFileSync(path.join(folder, `${tag}.sql`), 'utf8').includes('DROP TABLE `inspections`');
    const at = journal.entries.map((e) => e.tag).findLastIndex(rebuilds);
    expect(at).toBeGreaterThan(0);
    journal.entries = journal.entries.slice(0, at);
    fs.writeFileSync(journalFile, JSON.stringify(journal));

    const dataDir = makeTempDir();
    const old = new Database(path.join(dataDir, databaseFileName));
    old.pragma('foreign_keys = ON');
    migrate(drizzle(old), { migrationsFolder: folder });
    old.exec(`
      INSERT INTO users (id, email, name, role, password_hash, created_at)
        VALUES ('u', 'i@example.test', 'I', 'inspector', 'x', '2026-01-01');
      INSERT INTO companies (id, kind, name, notice_emails, created_at, contacts, notice_units, notice_paper)
        VALUES ('c', 'operator', 'C', '[]', '2026-01-01', '[]', 'si', 'A4');
      INSERT INTO rides (id, name, ride_class, operator_company_id, status, status_since, created_at)
        VALUES ('r', 'R', 'wheel', 'c', 'in_service', '2026-01-01', '2026-01-01');
      INSERT INTO inspections (id, ride_id, inspector_id, type, started_at, submitted_at, received_at,
          batch_id, record, content_sha256)
        VALUES ('i', 'r', 'u', 'periodic', 'a', 'b', 'c', 'd', '{}', 'x');
      INSERT INTO findings (id, inspection_id, ride_id, number, severity, description, photo_shas, state,
          created_at, created_by, updated_at, updated_by)
        VALUES ('f', 'i', 'r', 1, 'note', 'd', '[]', 'open', 'a', 'u', 'a', 'u');`);
    old.close();

    const database = openDb(dataDir, { backupDir: path.join(dataDir, 'backups') });
    try {
      const { sqlite } = database;
      expect(sqlite.prepare("SELECT id FROM findings WHERE inspection_id = 'i'").all()).toEqual([
        { id: 'f' },
      ]);
      expect(sqlite.pragma('foreign_keys', { simple: true })).toBe(1);
      expect(() => sqlite.exec("DELETE FROM inspections WHERE id = 'i'")).toThrow(/FOREIGN KEY/);
      sqlite.exec("UPDATE inspections SET type = 'after_repair' WHERE id = 'i'");
      expect(() => sqlite.exec("UPDATE inspections SET type = 'weekly' WHERE id = 'i'")).toThrow(/CHECK/);
    } finally {
      database.close();
    }
  });
});
