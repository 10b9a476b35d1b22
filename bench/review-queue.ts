import { type ChildProcess, execFileSync, spawn } from 'node:child_process';
import { createHash, randomUUID } from 'node:crypto';
import fs from 'node:fs';
import net from 'node:net';
import os from 'node:os';
import path from 'node:path';

import autocannon from 'autocannon';
import { eq } from 'drizzle-orm';

import { benchReadings } from '@/bench/readings';
import { users } from '@/db/server/schema';
import { analyseInspection, previewOf } from '@/features/records/analysis';
import type { InspectionRecord } from '@/features/records/schema';
import type { DesignData } from '@/features/loads/design-schema';
import { inspectionTypes } from '@/features/registry/schema';
import { rideClasses, type RideClass } from '@/features/rides/schema';
import { loadConfig } from '@/server/config';
import { openDb } from '@/server/db';
import { addDays } from '@/server/schedule-due';
import { queueToday, refreshQueue } from '@/server/queue/queue-refresh';
import { demoDesigns } from '@/server/seed/demo-design';
import { demoPassword, demoRides, seedDemoData } from '@/server/seed/demo';
import { ANALYSIS_SAMPLES, summariseAnalysis } from '@/server/sync/analysis';
import { sqliteOf } from '@/server/sqlite-client';

/**
 * The supervisors' queue under load (issue 6): 10,000 rides and 200,000 readings (20,000 inspections of
 * 10 readings, with their analyses), schedules and findings, seeded into a temporary database with
 * prepared inserts in one transaction; the queue is built, then the real server runs in a child process
 * (so the load generator does not share its event loop) and autocannon drives GET /api/review/queue with
 * 50 connections over loopback, rotating through first pages, later pages, every filter, searches and
 * every sort. GET /api/health, measured the same way in the same run, is the baseline: what this machine
 * and Express give for a request that does nothing. The server's CPU time per request (from /proc) is
 * printed too: it changes far less than the rates when other work shares the machine.
 * Targets (2 cores): p95 < 25 ms and ≥ 1,500 requests/s. REVIEW_QUEUE_BENCH_SECONDS sets the duration.
 */

const RIDES = 10_000;
const INSPECTIONS_PER_RIDE = 2;
const READINGS_PER = 10;
const OPERATORS = 40;
const SITES = 250;
const INSPECTORS = 60;
const CONNECTIONS = 50;
const SECONDS = Number(process.env.REVIEW_QUEUE_BENCH_SECONDS ?? 10);
const WARMUP_SECONDS = Math.min(3, Math.max(1, Math.round(SECONDS / 4)));
const TARGET_P95_MS = 25;
const TARGET_RPS = 1500;

const fmt = (v: number, digits = 0) => v.toLocaleString('en', { maximumFractionDigits: digits });
const percentile = (sorted: number[], p: number) =>
  sorted.length ? sorted[Math.min(sorted.length - 1, Math.floor(p * sorted.length))] : NaN;

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

// ——— invented names ———

const placeWords = [
  'Ashcombe',
  'Brackwater',
  'Cindervale',
  'Dunmere',
  'Eastwold',
  'Fallowmere',
  'Gorsebridge',
  'Hollin',
  'Ivelstone',
  'Jessamy',
  'Kestle',
  'Larkmoor',
  'Marlow Sands',
  'Nethercott',
  'Oakhythe',
  'Pellworth',
  'Quarrington',
  'Rushmere',
  'Saltcote',
  'Thornby',
  'Upwick',
  'Vellacott',
  'Wrenfold',
  'Yarrowdale',
];
const companyWords = ['Leisure', 'Amusements', 'Travelling Shows', 'Pleasure Grounds', 'Family Parks'];
const siteWords = ['Pier', 'Promenade', 'Common', 'Fairfield', 'Gardens', 'Showground', 'Sands', 'Green'];
const rideFirst = [
  'Silver',
  'Copper',
  'Midnight',
  'Harbour',
  'Tumbling',
  'Rolling',
  'Lantern',
  'Saffron',
  'Gull',
  'Thistle',
  'Corsair',
  'Meadow',
  'Cobalt',
  'Ember',
  'Marigold',
  'Stormy',
  'Juniper',
  'Velvet',
];
const rideSecond: Record<RideClass, string[]> = {
  pendulum_swing: ['Swing', 'Pendulum', 'Rocker', 'Galleon'],
  rotating_arm: ['Flyer', 'Spinner', 'Comet', 'Arm'],
  wheel: ['Wheel', 'Ring', 'Halo'],
  swing_carousel: ['Chairs', 'Carousel', 'Whirl'],
  other: ['Kite', 'Twister', 'Drum'],
};
const givenNames = ['Alda', 'Bram', 'Cosima', 'Derwent', 'Elsa', 'Fenn', 'Greer', 'Hollis', 'Isolde', 'Jory'];
const familyNames = ['Ashdown', 'Brightwell', 'Caddick', 'Dunstan', 'Eversley', 'Farrant', 'Gilchrist'];

// ——— one real analysis per demo design ———

type Template = {
  design: DesignData;
  designJson: string;
  preview: InspectionRecord['preview'];
  /** The stored analysis as JSON per status, with DESIGN_ID where the inspection's design version goes. */
  analysis: Record<'within' | 'near' | 'over', string>;
};
const DESIGN_ID = '@@design-version@@';

function templates(): Map<RideClass, Template[]> {
  const byClass = new Map<RideClass, Template[]>();
  for (const ride of demoRides) {
    const design = demoDesigns[ride.serial];
    if (!design) continue;
    const readings = benchReadings(design, '2026-01-01T08:00:00.000Z', 0, READINGS_PER);
    const result = analyseInspection(design, readings, ANALYSIS_SAMPLES);
    const preview = previewOf(result);
    const stored = summariseAnalysis(result, { id: DESIGN_ID, version: 1 }, preview);
    // The engine's real result for the design; the worst status is relabelled to give the queue its mix.
    const as = (status: 'within' | 'near' | 'over') =>
      JSON.stringify({ ...stored, status, server: { ...stored.server, status } });
    const t: Template = {
      design,
      designJson: JSON.stringify(design),
      preview,
      analysis: { within: as('within'), near: as('near'), over: as('over') },
    };
    byClass.set(ride.rideClass, [...(byClass.get(ride.rideClass) ?? []), t]);
  }
  const all = [...byClass.values()].flat();
  for (const c of rideClasses) if (!byClass.has(c)) byClass.set(c, all);
  return byClass;
}

// ——— the seed ———

type Seeded = {
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

async function seed(): Promise<Seeded> {
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
  const today = queueToday();
  const now = new Date().toISOString();
  const byClass = templates();
  const staff = db
    .select({ hash: users.passwordHash, id: users.id })
    .from(users)
    .where(eq(users.role, 'supervisor'))
    .get();
  if (!staff) throw new Error('no demo supervisor');

  const ins = {
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

  const operatorIds: string[] = [];
  const siteIds: string[] = [];
  const siteNames: string[] = [];
  const siteOperator: string[] = [];
  const inspectorIds: string[] = [];
  const serials: string[] = [];
  const stamp = (date: string, hour: number) => `${date}T${String(hour).padStart(2, '0')}:15:00.000Z`;

  sqlite.transaction(() => {
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

    let inspectionNo = 0;
    for (let k = 0; k < RIDES; k++) {
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
        previousId = id;
        inspectionNo++;
      }

      // Every ride has a periodic schedule; about half an annual one. Some periodic ones have slipped.
      const periodicLast = rnd.chance(0.06)
        ? addDays(today, -(31 + rnd.int(40)))
        : addDays(today, -rnd.int(29));
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
    }
  })();
  const seedMs = performance.now() - t0;

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
  sqlite.pragma('wal_checkpoint(TRUNCATE)');
  opened.close();
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

// ——— the server and the load ———

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = net.createServer();
    s.once('error', reject);
    s.listen(0, '127.0.0.1', () => {
      const { port } = s.address() as net.AddressInfo;
      s.close(() => resolve(port));
    });
  });
}

async function startServerProcess(dataDir: string): Promise<{ child: ChildProcess; base: string }> {
  const port = await freePort();
  const child = spawn(process.execPath, ['--import', 'tsx', path.join(process.cwd(), 'server/main.ts')], {
    env: {
      ...process.env,
      PORT: String(port),
      DATA_DIR: dataDir,
      WEB_DIR: path.join(dataDir, 'none'),
      NODE_ENV: 'development',
      SEED_DEMO: '0',
      // One log line per request is written in production; the bench measures the queue, not the log.
      LOG_LEVEL: 'warn',
    },
    stdio: ['ignore', 'ignore', 'pipe'],
  });
  let stderr = '';
  child.stderr?.on('data', (chunk: Buffer) => (stderr += chunk.toString()));
  const base = `http://127.0.0.1:${port}`;
  const deadline = Date.now() + 120_000;
  for (;;) {
    if (child.exitCode !== null) throw new Error(`the server stopped at start:\n${stderr}`);
    try {
      if ((await fetch(`${base}/api/health`)).ok) return { child, base };
    } catch {
      // not listening yet
    }
    if (Date.now() > deadline) throw new Error(`the server did not start in time:\n${stderr}`);
    await new Promise((resolve) => setTimeout(resolve, 200));
  }
}

const clockTicks = (() => {
  try {
    return Number(execFileSync('getconf', ['CLK_TCK'], { encoding: 'utf8' }).trim()) || 100;
  } catch {
    return 100;
  }
})();

/** CPU time (user + system, ms) the process has used so far, from /proc; null where there is none. */
function cpuMsOf(pid: number | undefined): number | null {
  try {
    const stat = fs.readFileSync(`/proc/${pid}/stat`, 'utf8');
    const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
    // utime and stime are the 14th and 15th fields of the line, the 12th and 13th after the name.
    return ((Number(fields[11]) + Number(fields[12])) / clockTicks) * 1000;
  } catch {
    return null;
  }
}

type Figures = {
  p50: number;
  p95: number;
  p99: number;
  rps: number;
  requests: number;
  bad: number;
  bytes: number;
  /** The server process's CPU time per request (µs), null where it cannot be read. */
  serverCpuUs: number | null;
};

async function drive(
  base: string,
  paths: string[],
  headers: Record<string, string>,
  seconds: number,
  serverPid?: number,
): Promise<Figures> {
  const cpuBefore = cpuMsOf(serverPid);
  const times: number[] = [];
  let bad = 0;
  let bytes = 0;
  let next = 0;
  const result = await new Promise<autocannon.Result>((resolve, reject) => {
    const instance = autocannon(
      {
        url: base,
        connections: CONNECTIONS,
        duration: seconds,
        headers,
        requests: [
          {
            method: 'GET',
            setupRequest: (request) => ({ ...request, path: paths[next++ % paths.length] }),
          },
        ],
      },
      (error: unknown, done) => (error ? reject(error) : resolve(done)),
    );
    instance.on('response', (_client, statusCode, resBytes, responseTime) => {
      times.push(responseTime);
      bytes += resBytes;
      if (statusCode !== 200) bad++;
    });
  });
  const cpuAfter = cpuMsOf(serverPid);
  times.sort((a, b) => a - b);
  return {
    p50: percentile(times, 0.5),
    p95: percentile(times, 0.95),
    p99: percentile(times, 0.99),
    rps: times.length / result.duration,
    requests: times.length,
    bad: bad + result.errors + result.timeouts,
    bytes: times.length ? bytes / times.length : 0,
    serverCpuUs:
      cpuBefore === null || cpuAfter === null || !times.length
        ? null
        : ((cpuAfter - cpuBefore) * 1000) / times.length,
  };
}

function queuePaths(s: Seeded): string[] {
  const q = '/api/review/queue';
  const days = (n: number) => addDays(s.today, -n);
  const site = (i: number) => s.siteIds[(i * 37) % s.siteIds.length];
  const operator = (i: number) => s.operatorIds[(i * 11) % s.operatorIds.length];
  const inspector = (i: number) => s.inspectorIds[(i * 13) % s.inspectorIds.length];
  const paths = [
    // what a supervisor opens most: the first page, most urgent first
    q,
    q,
    q,
    `${q}?page=2`,
    `${q}?page=5`,
    `${q}?page=40&pageSize=50`,
    `${q}?pageSize=100`,
    `${q}?sort=newest`,
    `${q}?sort=oldest`,
    `${q}?sort=ride`,
    `${q}?sort=ride&page=12`,
    `${q}?sort=newest&page=3`,
    `${q}?urgency=over`,
    `${q}?urgency=over,failed,near`,
    `${q}?urgency=overdue`,
    `${q}?urgency=past_due&sort=oldest`,
    `${q}?urgency=awaiting&page=2`,
    `${q}?rideClass=wheel`,
    `${q}?rideClass=pendulum_swing,rotating_arm`,
    `${q}?rideStatus=restricted`,
    `${q}?rideStatus=out_of_service,restricted&sort=newest`,
    `${q}?from=${days(7)}`,
    `${q}?from=${days(30)}&to=${days(14)}`,
    `${q}?from=${days(90)}&to=${days(60)}&sort=oldest`,
    `${q}?q=wheel`,
    `${q}?q=${encodeURIComponent(s.siteNames[3].split(' ')[0].toLowerCase())}`,
    `${q}?q=${s.serials[4321].slice(0, 8).toLowerCase()}`,
    `${q}?q=${encodeURIComponent(s.siteNames[17])}`,
    `${q}?q=ashdown`,
    `${q}?operatorId=${operator(1)}&urgency=over,failed`,
    `${q}?operatorId=${operator(2)}&sort=newest`,
  ];
  for (let i = 0; i < 8; i++) paths.push(`${q}?siteId=${site(i)}`);
  for (let i = 0; i < 6; i++) paths.push(`${q}?operatorId=${operator(i)}`);
  for (let i = 0; i < 6; i++) paths.push(`${q}?inspectorId=${inspector(i)}`);
  paths.push(`${q}?siteId=${site(1)}&rideStatus=in_service&sort=ride`);
  paths.push(`${q}?inspectorId=${inspector(2)}&from=${days(30)}`);
  return paths;
}

/**
 * Pages no one has asked for since the last change: every sort × page × page size once, more than the
 * server remembers, so each answer comes from the database rather than from the remembered pages.
 */
function unseenPaths(): string[] {
  const sorts = ['urgency', 'newest', 'oldest', 'ride'];
  const paths: string[] = [];
  for (let size = 10; size < 27; size++)
    for (let page = 1; page <= 130; page++)
      for (const sort of sorts) paths.push(`/api/review/queue?sort=${sort}&page=${page}&pageSize=${size}`);
  // A fixed shuffle, so consecutive requests do not walk the same index range.
  for (let i = paths.length - 1; i > 0; i--) {
    const j = (i * 7919) % (i + 1);
    [paths[i], paths[j]] = [paths[j], paths[i]];
  }
  return paths;
}

function print(label: string, f: Figures) {
  console.log(
    `${label.padEnd(22)} p50 ${fmt(f.p50, 2)} ms  p95 ${fmt(f.p95, 2)} ms  p99 ${fmt(f.p99, 2)} ms  ${fmt(f.rps)} req/s  (${fmt(f.requests)} requests, ${f.bad} not 200, ${fmt(f.bytes / 1024, 1)} kB each)`,
  );
  if (f.serverCpuUs !== null)
    console.log(
      `${''.padEnd(22)} server CPU ${fmt(f.serverCpuUs)} µs per request: about ${fmt(1e6 / f.serverCpuUs)} req/s from one free core`,
    );
}

export async function run() {
  const s = await seed();
  let server: { child: ChildProcess; base: string } | undefined;
  try {
    const urgencyLine = ['over', 'failed', 'near', 'overdue', 'past due', 'awaiting']
      .map((u, i) => `${fmt(s.counts[i] ?? 0)} ${u}`)
      .join(', ');
    console.log(
      `${fmt(RIDES)} rides, ${fmt(RIDES * INSPECTIONS_PER_RIDE)} inspections with analyses, ${fmt(RIDES * INSPECTIONS_PER_RIDE * READINGS_PER)} readings, schedules and findings; seeded in ${fmt(s.seedMs / 1000, 1)} s`,
    );
    console.log(`queue: ${fmt(s.queueItems)} items (${urgencyLine})`);
    console.log(
      `queue build:           ${fmt(s.buildMs)} ms for every ride; ${fmt(s.refreshOneMs, 2)} ms to refresh one ride (a write's share)`,
    );

    server = await startServerProcess(s.dataDir);
    const signIn = await fetch(`${server.base}/api/auth/sign-in`, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ email: 'supervisor@pivotwatch.test', password: demoPassword }),
    });
    if (!signIn.ok) throw new Error(`sign-in failed: ${signIn.status}`);
    const { token } = (await signIn.json()) as { token: string };
    const auth = { authorization: `Bearer ${token}` };

    const paths = queuePaths(s);
    for (const p of paths) {
      const res = await fetch(`${server.base}${p}`, { headers: auth });
      if (res.status !== 200) throw new Error(`${p} answered ${res.status}: ${await res.text()}`);
    }
    console.log(
      `autocannon: ${CONNECTIONS} connections over loopback, ${SECONDS} s each after a ${WARMUP_SECONDS} s warm-up; server in its own process (LOG_LEVEL=warn); ${paths.length} queue URLs in rotation`,
    );

    const pid = server.child.pid;
    await drive(server.base, ['/api/health'], {}, WARMUP_SECONDS);
    const health = await drive(server.base, ['/api/health'], {}, SECONDS, pid);
    await drive(server.base, paths, auth, WARMUP_SECONDS);
    const queue = await drive(server.base, paths, auth, SECONDS, pid);
    const unseen = await drive(server.base, unseenPaths(), auth, SECONDS, pid);

    const load = os
      .loadavg()
      .map((l) => fmt(l, 1))
      .join(' / ');
    print('GET /api/health:', health);
    print('GET /api/review/queue:', queue);
    print('  pages not remembered:', unseen);
    console.log(
      `queue / health:        ${fmt((queue.rps / health.rps) * 100)} % of the baseline's requests/s (signed in: token check and user lookup on every request)`,
    );
    const met = (ok: boolean) => (ok ? 'met' : 'NOT met');
    console.log(
      `targets:               p95 < ${TARGET_P95_MS} ms ${met(queue.p95 < TARGET_P95_MS)} (${fmt(queue.p95, 2)} ms); ≥ ${fmt(TARGET_RPS)} req/s ${met(queue.rps >= TARGET_RPS)} (${fmt(queue.rps)})`,
    );
    console.log(
      `load average (1/5/15 min): ${load} on ${os.cpus().length} cores at the end; other work on the machine slows both figures`,
    );
    console.log(
      `                       (the server remembers pages and counts until the queue changes; the second line is the cost without that)`,
    );
    if (queue.bad > 0 || unseen.bad > 0 || health.bad > 0)
      throw new Error('some requests did not answer 200');
  } finally {
    if (server) {
      const { child } = server;
      const exited = new Promise((resolve) => child.once('exit', resolve));
      child.kill('SIGTERM');
      await exited;
    }
    fs.rmSync(s.dataDir, { recursive: true, force: true });
  }
}

if (require.main === module) {
  run().catch((error: unknown) => {
    console.error(error);
    process.exitCode = 1;
  });
}
