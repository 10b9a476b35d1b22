/**
 * The review-queue bench's database: the demo, then 10,000 rides with two inspections each (with their
 * readings and analyses), schedules and findings, written with prepared inserts in one transaction; then
 * the queue is built and one ride's refresh is timed.
 */
import { createHash, randomUUID } from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';

import type Database from 'better-sqlite3';
import { eq } from 'drizzle-orm';

import {
  companyWords,
  familyNames,
  givenNames,
  placeWords,
  rideFirst,
  rideSecond,
  siteWords,
} from '@/bench/invented-names';
import { DESIGN_ID, READINGS_PER, templates, type Template } from '@/bench/queue-templates';
import { benchReadings } from '@/bench/readings';
import { users } from '@/db/server/schema';
import type { InspectionRecord } from '@/features/records/schema';
import { inspectionTypes } from '@/features/registry/schema';
import { rideClasses, type RideClass } from '@/features/rides/schema';
import { addDays, isoDay } from '@/lib/dates';
import type { Db } from '@/server/db';
import { loadConfig } from '@/server/config';
import { openDb } from '@/server/db';
import { refreshQueue } from '@/server/queue/queue-refresh';
import { seedDemoData } from '@/server/seed/demo';
import { sqliteOf } from '@/server/sqlite-client';

export const RIDES = 10_000;
export const INSPECTIONS_PER_RIDE = 2;
const OPERATORS = 40;
const SITES = 250;
const INSPECTORS = 60;

/** A small seeded generator (mulberry32), so every run seeds the same mix (ids aside). */
function random(seed: number) {
  let a = seed >>> 0;
  const next = () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  return {
    next,
    int: (n: number) => Math.floor(next() * n),
    pick: <T>(items: readonly T[]) => items[Math.floor(next() * items.length)],
    chance: (p: number) => next() < p,
  };
}

type Random = ReturnType<typeof random>;

// ——— the seed ———

export type Seeded = {
  dataDir: string;
  today: string;
  siteIds: string[];
  siteNames: string[];
  operatorIds: string[];
  inspectorIds: string[];
  serials: string[];
  queueItems: number;
  counts: Record<string, number>;
  buildMs: number;
  seedMs: number;
  refreshOneMs: number;
};

function prepareInserts(sqlite: Database.Database) {
  return {
    company: sqlite.prepare(
      `INSERT INTO companies (id, kind, name, notice_emails, phone, address, contacts, created_at)
       VALUES (?, 'operator', ?, ?, NULL, NULL, '[]', ?)`,
    ),
    site: sqlite.prepare(
      `INSERT INTO sites (id, name, kind, address, locality, operator_company_id, created_at)
       VALUES (?, ?, ?, NULL, ?, ?, ?)`,
    ),
    user: sqlite.prepare(
      `INSERT INTO users (id, email, name, role, password_hash, company_id, created_at)
       VALUES (?, ?, ?, 'inspector', ?, NULL, ?)`,
    ),
    ride: sqlite.prepare(
      `INSERT INTO rides (id, name, ride_class, description, maker, model, serial, year, site_id,
         operator_company_id, status, status_reason, status_since, created_at)
       VALUES (?, ?, ?, NULL, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`,
    ),
    design: sqlite.prepare(
      `INSERT INTO design_versions (id, ride_id, version, data, reason, origin, created_by, created_at)
       VALUES (?, ?, 1, ?, 'Bench seed', 'seed', ?, ?)`,
    ),
    inspection: sqlite.prepare(
      `INSERT INTO inspections (id, ride_id, inspector_id, type, started_at, submitted_at, received_at, batch_id,
         design_version_id, template_id, template_version, amends_id, record, content_sha256, failed_items,
         analysis, analysis_note, analysis_status, analysed_at, review_state, reviewed_at, reviewed_by, review_note)
       VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, NULL, NULL, ?, ?, ?, ?, ?, NULL, ?, ?, ?, ?, ?, ?)`,
    ),
    reading: sqlite.prepare(
      `INSERT INTO inspection_readings (inspection_id, id, ride_id, kind, joint, label, value_si, unit, method,
         spread_si, taken_at, note) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, NULL)`,
    ),
    schedule: sqlite.prepare(
      `INSERT INTO inspection_schedules (id, ride_id, inspection_type, interval_days, last_done_on, due_on,
         assigned_to, assigned_at, notes, created_at) VALUES (?, ?, ?, ?, ?, ?, ?, ?, NULL, ?)`,
    ),
    finding: sqlite.prepare(
      `INSERT INTO findings (id, inspection_id, ride_id, number, severity, description, rule_ref,
         required_action, due_on, photo_shas, state, state_note, created_at, created_by, updated_at, updated_by,
         closed_at, closed_by)
       VALUES (?, ?, ?, 1, ?, ?, NULL, ?, ?, '[]', ?, NULL, ?, ?, ?, ?, ?, ?)`,
    ),
  };
}

type SeedContext = {
  ins: ReturnType<typeof prepareInserts>;
  rnd: Random;
  byClass: Map<RideClass, Template[]>;
  staff: { hash: string; id: string };
  today: string;
  now: string;
  operatorIds: string[];
  siteIds: string[];
  siteNames: string[];
  siteOperator: string[];
  inspectorIds: string[];
  serials: string[];
};

const stamp = (date: string, hour: number) => `${date}T${String(hour).padStart(2, '0')}:15:00.000Z`;

/** The operator companies, their sites and the inspectors. */
function seedPeople({
  ins,
  rnd,
  staff,
  now,
  operatorIds,
  siteIds,
  siteNames,
  siteOperator,
  inspectorIds,
}: SeedContext) {
  for (let i = 0; i < OPERATORS; i++) {
    const id = randomUUID();
    const name = `${placeWords[i % placeWords.length]} ${companyWords[i % companyWords.length]}${i >= placeWords.length ? ` ${Math.floor(i / placeWords.length) + 1}` : ''}`;
    ins.company.run(id, name, JSON.stringify([`notices${i}@bench-operator.test`]), now);
    operatorIds.push(id);
  }
  for (let i = 0; i < SITES; i++) {
    const id = randomUUID();
    const place = placeWords[(i * 7) % placeWords.length];
    const name = `${place} ${siteWords[i % siteWords.length]} ${i + 1}`;
    const operator = operatorIds[i % OPERATORS];
    ins.site.run(id, name, rnd.pick(['park', 'fairground', 'travelling_setup']), place, operator, now);
    siteIds.push(id);
    siteNames.push(name);
    siteOperator.push(operator);
  }
  for (let i = 0; i < INSPECTORS; i++) {
    const id = randomUUID();
    const name = `${givenNames[i % givenNames.length]} ${familyNames[Math.floor(i / givenNames.length) % familyNames.length]}`;
    ins.user.run(id, `inspector${i}@bench.test`, name, staff.hash, now);
    inspectorIds.push(id);
  }
}

type RideSeed = {
  rideId: string;
  designId: string;
  template: Template;
  k: number;
  olderOn: string;
  latestOn: string;
  latestState: 'submitted' | 'returned' | 'approved';
  amends: boolean;
  previousId: string | null;
};

/** One inspection of a ride (the older one when `j` is 0), with its readings and, on a few, a finding. */
function seedInspection(ctx: SeedContext, ride: RideSeed, j: number, inspectionNo: number): string {
  const { ins, rnd, staff, inspectorIds } = ctx;
  const { rideId, designId, template, k, olderOn, latestOn, latestState, amends, previousId } = ride;
  const latest = j === INSPECTIONS_PER_RIDE - 1;
  const id = randomUUID();
  const on = latest ? latestOn : olderOn;
  const state = latest ? latestState : amends ? 'submitted' : 'approved';
  const submittedAt = stamp(on, 7 + (inspectionNo % 10));
  const taken = stamp(on, 6 + (inspectionNo % 10));
  const inspector = inspectorIds[(k + j) % INSPECTORS];
  const readings = benchReadings(template.design, taken, inspectionNo, READINGS_PER);
  const failed = rnd.chance(0.08) ? 1 + rnd.int(3) : 0;
  const record: InspectionRecord = {
    id,
    rideId,
    designVersionId: designId,
    templateId: null,
    templateVersion: null,
    type: latest ? rnd.pick(inspectionTypes) : 'periodic',
    startedAt: stamp(on, 6 + (inspectionNo % 10)),
    submittedAt,
    checklist: Array.from({ length: 8 }, (_, n) => ({
      itemId: `item-${n}`,
      area: n < 4 ? 'Main pivot' : 'Gondolas',
      text: `Check ${n + 1}`,
      result: n < failed ? ('fail' as const) : ('pass' as const),
      ...(n < failed && { note: 'Worn beyond the mark' }),
    })),
    readings,
    photos: [],
    notes: 'Bench inspection.',
    preview: template.preview,
    amendsId: latest && amends ? previousId : null,
  };
  const json = JSON.stringify(record);
  const statusRoll = rnd.next();
  const analysisStatus = statusRoll < 0.03 ? 'over' : statusRoll < 0.13 ? 'near' : 'within';
  const decided = state !== 'submitted';
  ins.inspection.run(
    id,
    rideId,
    inspector,
    record.type,
    record.startedAt,
    submittedAt,
    submittedAt,
    randomUUID(),
    designId,
    record.amendsId,
    json,
    createHash('sha256').update(json).digest('hex'),
    failed,
    template.analysis[analysisStatus].replace(DESIGN_ID, designId),
    analysisStatus,
    submittedAt,
    state,
    decided ? stamp(addDays(on, 1), 10) : null,
    decided ? staff.id : null,
    state === 'returned' ? 'Photograph the main pin again, the first set is blurred.' : null,
  );
  for (const r of readings)
    ins.reading.run(
      id,
      r.id,
      rideId,
      r.kind,
      r.joint,
      r.label,
      r.valueSI,
      r.unit,
      r.method,
      r.spreadSI ?? null,
      r.takenAt,
    );
  // Findings on about one signed-off inspection in seven: most closed, some open, some past due.
  if (state === 'approved' && rnd.chance(1 / 7)) {
    const f = rnd.next();
    const findingState = f < 0.6 ? 'closed' : f < 0.8 ? 'action_reported' : 'open';
    const due = addDays(on, 14 + rnd.int(60));
    ins.finding.run(
      randomUUID(),
      id,
      rideId,
      rnd.pick(['fix_by_date', 'fix_by_date', 'fix_before_operation', 'note']),
      'Bushing clearance growing on the drive side',
      'Replace the bushing and record the new clearance',
      due,
      findingState,
      stamp(addDays(on, 1), 11),
      staff.id,
      stamp(addDays(on, 1), 11),
      staff.id,
      findingState === 'closed' ? stamp(addDays(on, 10), 9) : null,
      findingState === 'closed' ? staff.id : null,
    );
  }
  return id;
}

/** One ride with its design, its two inspections and its schedules; returns the next inspection number. */
function seedRide(ctx: SeedContext, k: number, inspectionNo: number): number {
  const { ins, rnd, byClass, staff, today, now, operatorIds, siteIds, siteOperator, inspectorIds, serials } =
    ctx;
  const rideId = randomUUID();
  const rideClass = rideClasses[k % rideClasses.length];
  const template = rnd.pick(byClass.get(rideClass) ?? []);
  // About one ride in twelve is in store, without a site.
  const site = rnd.chance(1 / 12) ? null : rnd.int(SITES);
  const operator = site === null ? rnd.pick(operatorIds) : siteOperator[site];
  const roll = rnd.next();
  const status = roll < 0.85 ? 'in_service' : roll < 0.95 ? 'restricted' : 'out_of_service';
  const serial = `BX-${rideClass.slice(0, 2).toUpperCase()}-${String(k).padStart(5, '0')}`;
  serials.push(serial);
  ins.ride.run(
    rideId,
    `${rnd.pick(rideFirst)} ${rnd.pick(rideSecond[rideClass])} ${k + 1}`,
    rideClass,
    'Bench Ride Makers',
    `M-${k % 17}`,
    serial,
    1995 + (k % 30),
    site === null ? null : siteIds[site],
    operator,
    status,
    status === 'in_service' ? null : 'Bench: waiting for a part',
    now,
    now,
  );
  const designId = randomUUID();
  ins.design.run(designId, rideId, template.designJson, staff.id, now);

  // Two inspections per ride: an older one, signed off, and the latest, which is waiting for a
  // decision on about a quarter of the rides, sent back on a few, signed off on the rest.
  const olderOn = addDays(today, -(60 + rnd.int(340)));
  const latestOn = addDays(today, -rnd.int(45));
  const latestRoll = rnd.next();
  const latestState = latestRoll < 0.24 ? 'submitted' : latestRoll < 0.27 ? 'returned' : 'approved';
  // One in twenty waiting inspections is an amendment of a still-undecided original.
  const amends = latestState === 'submitted' && rnd.chance(0.05);
  let previousId: string | null = null;
  for (let j = 0; j < INSPECTIONS_PER_RIDE; j++) {
    const ride = {
      rideId,
      designId,
      template,
      k,
      olderOn,
      latestOn,
      latestState,
      amends,
      previousId,
    } as const;
    previousId = seedInspection(ctx, ride, j, inspectionNo);
    inspectionNo++;
  }

  // Every ride has a periodic schedule; about half an annual one. Some periodic ones have slipped.
  const periodicLast = rnd.chance(0.06) ? addDays(today, -(31 + rnd.int(40))) : addDays(today, -rnd.int(29));
  ins.schedule.run(
    randomUUID(),
    rideId,
    'periodic',
    30,
    periodicLast,
    null,
    rnd.chance(0.3) ? rnd.pick(inspectorIds) : null,
    null,
    now,
  );
  if (rnd.chance(0.5))
    ins.schedule.run(
      randomUUID(),
      rideId,
      'annual',
      365,
      addDays(today, -rnd.int(360)),
      null,
      null,
      null,
      now,
    );
  return inspectionNo;
}

/** Builds the whole queue, then times one ride's refresh, as a write path does. */
function measureQueue(db: Db, sqlite: Database.Database, today: string) {
  let t1 = performance.now();
  db.transaction((tx) => refreshQueue(tx, today));
  const buildMs = performance.now() - t1;

  // A write path's share: refreshing one ride, as a push, a decision or a rename does.
  const sample = sqlite.prepare<[], string>('SELECT id FROM rides ORDER BY id LIMIT 200').pluck().all();
  t1 = performance.now();
  for (const id of sample) db.transaction((tx) => refreshQueue(tx, today, [id]));
  const refreshOneMs = (performance.now() - t1) / sample.length;

  const counts = Object.fromEntries(
    sqlite
      .prepare<[], { urgency: number; n: number }>(
        'SELECT urgency, count(*) AS n FROM review_queue GROUP BY urgency',
      )
      .all()
      .map((r) => [r.urgency, r.n]),
  );
  const queueItems = Object.values(counts).reduce((a, b) => a + b, 0);
  return { buildMs, refreshOneMs, counts, queueItems };
}

export async function seed(): Promise<Seeded> {
  const t0 = performance.now();
  const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'pivotwatch-bench-queue-'));
  const config = loadConfig({
    NODE_ENV: 'development',
    DATA_DIR: dataDir,
    WEB_DIR: path.join(dataDir, 'none'),
  });
  const opened = openDb(dataDir);
  const db = opened.db;
  await seedDemoData(db, config);
  const sqlite = sqliteOf(db);
  const rnd = random(6);
  // A calendar date (the queue's clock is now an instant; the seed counts its dates in days from this one).
  const today = isoDay(new Date());
  const now = new Date().toISOString();
  const byClass = templates();
  const staff = db
    .select({ hash: users.passwordHash, id: users.id })
    .from(users)
    .where(eq(users.role, 'supervisor'))
    .get();
  if (!staff) throw new Error('no demo supervisor');

  const ctx: SeedContext = {
    ins: prepareInserts(sqlite),
    rnd,
    byClass,
    staff,
    today,
    now,
    operatorIds: [],
    siteIds: [],
    siteNames: [],
    siteOperator: [],
    inspectorIds: [],
    serials: [],
  };
  sqlite.transaction(() => {
    seedPeople(ctx);
    let inspectionNo = 0;
    for (let k = 0; k < RIDES; k++) inspectionNo = seedRide(ctx, k, inspectionNo);
  })();
  const seedMs = performance.now() - t0;

  const { buildMs, refreshOneMs, counts, queueItems } = measureQueue(db, sqlite, today);
  sqlite.pragma('wal_checkpoint(TRUNCATE)');
  opened.close();
  const { siteIds, siteNames, operatorIds, inspectorIds, serials } = ctx;
  return {
    dataDir,
    today,
    siteIds,
    siteNames,
    operatorIds,
    inspectorIds,
    serials,
    queueItems,
    counts,
    buildMs,
    seedMs,
    refreshOneMs,
  };
}
