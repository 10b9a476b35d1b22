/**
 * Keeps the review queue's read model (`review_queue`) in step with what decides it. The queue is read far
 * more often than it changes, so its rows are computed on write, and reading a page is one indexed query.
 *
 * Call `refreshQueue(db, today, rideIds)` in the same transaction as any change to what decides a ride's
 * rows: an inspection arriving, analysed or decided; findings added, changed or closed; schedules; an
 * incident report made or reviewed; the ride's name, class, status, site or operator. A rename of a site, company or person refreshes their
 * rides. A change to some inspections alone may use the cheaper `refreshQueueInspections`. `ensureQueueFresh` rebuilds everything once per calendar day, since "overdue" and "past due"
 * change with the date alone.
 */
import type Database from 'better-sqlite3';
import { sql, type SQL } from 'drizzle-orm';
import { SQLiteSyncDialect } from 'drizzle-orm/sqlite-core';

import { findings, reviewQueue, rideStatusChanges } from '@/db/server/review';
import { incidents } from '@/db/server/incidents';
import { inspections } from '@/db/server/inspections';
import { runningLog } from '@/db/server/life';
import { rideLifeFlags } from '@/db/server/ndt';
import { companies, inspectionSchedules, rides, sites, users } from '@/db/server/schema';
import type { Db } from '@/server/db';
import { urgencies, type Urgency } from '@/lib/vocabulary';
import { nextDueSql, rideTodaySql, zoneDays } from '@/server/schedule-due';
import { sqliteOf } from '@/server/sqlite-client';

type Tx = Pick<Db, 'run'> | Pick<Db, 'run' | 'select'>;

/**
 * The queue's clock: the instant it judges "overdue" and "past due" at. Each ride's day is that instant's
 * date on its site's clock (`zoneDays`, server/schedule-due.ts); a plain YYYY-MM-DD instead pins one day
 * for every ride.
 */
export const queueToday = (now: Date = new Date()) => now.toISOString();

let generation = 0;

/**
 * Bumped by every refresh (even one whose transaction then rolls back: a needless bump only costs a
 * recount), so readers may keep figures derived from the queue for as long as it stays the same.
 */
export const queueGeneration = (): number => generation;

/** An urgency as the number the queue stores and sorts by (its place in `urgencies`). */
const U = (u: Urgency) => sql.raw(String(urgencies.indexOf(u)));

/** Where the statements take each zone's day (`zoneDays`' JSON) and the rides' ids (a JSON array), bound at run time. */
const TODAY = sql.raw('@today');
const IDS = sql.raw('@ids');

/**
 * What a refresh recomputes: every row; the rows of some rides (`@ids` = ride ids); or the rows some
 * inspections decide (`@ids` = inspection ids): their own, their originals' (an amendment supersedes its
 * original) and their rides' own rows. The last is for changes that touch those inspections alone (one
 * arriving, being analysed), and costs the same however many others wait on the ride.
 */
type Scope = 'all' | 'rides' | 'inspections';

const inIds = (column: SQL) => sql`${column} IN (SELECT value FROM json_each(${IDS}))`;

type OnlyRides = (column: SQL) => SQL;

/**
 * What decides a ride's rows, for the rides in scope: its earliest overdue schedule, its findings past
 * due, the returned inspection that keeps it flagged, the inspections waiting for a decision, and its
 * pivot-life flags (server/pivot-life/flags.ts keeps `ride_life_flags`): an NDT past its due date counts
 * as overdue like an inspection, and a wear limit projected before the next inspection as near a limit.
 */
function rideFacts(onlyRides: OnlyRides, pendingScope: SQL): SQL {
  return sql`
      ride_due AS (
        SELECT ${inspectionSchedules.rideId} AS ride_id, MIN(${nextDueSql}) AS overdue_since
        FROM ${inspectionSchedules}
        WHERE ${nextDueSql} < ${rideTodaySql(TODAY, inspectionSchedules.rideId)}
          AND ${onlyRides(sql`${inspectionSchedules.rideId}`)}
        GROUP BY ${inspectionSchedules.rideId}
      ),
      ride_past AS (
        SELECT f.ride_id AS ride_id, COUNT(*) AS n, MIN(f.due_on) AS first_due
        FROM ${findings} f
        WHERE f.state <> 'closed' AND f.due_on IS NOT NULL AND f.due_on < ${rideTodaySql(TODAY, sql`f.ride_id`)}
          AND ${onlyRides(sql`f.ride_id`)}
        GROUP BY f.ride_id
      ),
      -- A returned inspection that was over a limit or failed items keeps its ride flagged until a decision
      -- resolves it: an amendment (which carries the alarm on), a later approved follow-up, or an override.
      ride_alarm AS (
        SELECT * FROM (
          SELECT x.ride_id AS ride_id, x.id AS inspection_id, x.type AS type, x.inspector_id AS inspector_id,
            x.analysis_status AS analysis_status, x.failed_items AS failed_items, x.submitted_at AS submitted_at,
            ROW_NUMBER() OVER (
              PARTITION BY x.ride_id
              ORDER BY CASE WHEN x.analysis_status = 'over' THEN 0 ELSE 1 END, x.submitted_at DESC, x.id
            ) AS k
          FROM ${inspections} x
          WHERE x.review_state = 'returned' AND (x.analysis_status = 'over' OR x.failed_items > 0)
            AND ${onlyRides(sql`x.ride_id`)}
            AND NOT EXISTS (SELECT 1 FROM ${inspections} a WHERE a.amends_id = x.id)
            AND NOT EXISTS (
              SELECT 1 FROM ${inspections} y
              WHERE y.ride_id = x.ride_id AND y.type = 'follow_up' AND y.review_state = 'approved'
                AND y.reviewed_at >= x.reviewed_at
            )
            AND NOT EXISTS (
              SELECT 1 FROM ${rideStatusChanges} c
              WHERE c.ride_id = x.ride_id AND c.override = 1 AND c.at >= x.reviewed_at
            )
        ) WHERE k = 1
      ),
      -- Daily pre-opening checks (features/daily-checks/schema.ts): the latest one when it failed, and the
      -- latest day of the last 14 (before today, on the site's calendar, from its first check) the running
      -- log shows the ride ran with no daily check that day.
      ride_daily_last AS (
        SELECT * FROM (
          SELECT x.ride_id AS ride_id, x.submitted_at AS submitted_at, x.failed_items AS failed_items,
            ROW_NUMBER() OVER (PARTITION BY x.ride_id ORDER BY x.submitted_at DESC, x.id) AS k
          FROM ${inspections} x
          WHERE x.type = 'daily_pre_opening' AND ${onlyRides(sql`x.ride_id`)}
        ) WHERE k = 1 AND failed_items > 0
      ),
      ride_daily_missed AS (
        SELECT rl.ride_id AS ride_id, MAX(rl.day) AS missed_on
        FROM ${runningLog} rl
          JOIN ${rides} rr ON rr.id = rl.ride_id
          LEFT JOIN ${sites} ss ON ss.id = rr.site_id
        WHERE (COALESCE(rl.cycles, 0) > 0 OR COALESCE(rl.hours, 0) > 0)
          AND rl.day < ${rideTodaySql(TODAY, sql`rl.ride_id`)}
          AND rl.day >= date(${rideTodaySql(TODAY, sql`rl.ride_id`)}, '-14 days')
          AND ${onlyRides(sql`rl.ride_id`)}
          AND NOT EXISTS (
            SELECT 1 FROM ${inspections} dc
            WHERE dc.ride_id = rl.ride_id AND dc.type = 'daily_pre_opening'
              AND ${siteDayOf(sql`dc.submitted_at`, sql`ss.time_zone`)} = rl.day
          )
          -- Only from the ride's first daily check kept here (features/daily-checks missedDays).
          AND EXISTS (
            SELECT 1 FROM ${inspections} fc
            WHERE fc.ride_id = rl.ride_id AND fc.type = 'daily_pre_opening'
              AND ${siteDayOf(sql`fc.submitted_at`, sql`ss.time_zone`)} <= rl.day
          )
        GROUP BY rl.ride_id
      ),
      ride_daily AS (
        SELECT r.id AS ride_id, dl.submitted_at AS failed_at, dm.missed_on AS missed_on
        FROM ${rides} r
          LEFT JOIN ride_daily_last dl ON dl.ride_id = r.id
          LEFT JOIN ride_daily_missed dm ON dm.ride_id = r.id
        WHERE (dl.ride_id IS NOT NULL OR dm.ride_id IS NOT NULL) AND ${onlyRides(sql`r.id`)}
      ),
      ride_life AS (
        SELECT lf.ride_id AS ride_id,
          CASE WHEN lf.ndt_due_on < ${rideTodaySql(TODAY, sql`lf.ride_id`)} THEN lf.ndt_due_on END AS ndt_overdue_since,
          CASE WHEN lf.wear_suggested_on IS NOT NULL THEN lf.wear_limit_on END AS wear_limit_on,
          lf.wear_suggested_on AS wear_suggested_on
        FROM ${rideLifeFlags} lf
        WHERE (lf.ndt_due_on < ${rideTodaySql(TODAY, sql`lf.ride_id`)} OR lf.wear_suggested_on IS NOT NULL)
          AND ${onlyRides(sql`lf.ride_id`)}
      ),
      -- An operator's daily pre-opening check is never decided (its facts are ride_daily's).
      pending AS (
        SELECT i.* FROM ${inspections} i
        WHERE ${pendingScope} AND i.type <> 'daily_pre_opening'
          AND NOT EXISTS (SELECT 1 FROM ${inspections} a WHERE a.amends_id = i.id)
      )`;
}

/**
 * The item's day on its site's clock (`day_in_zone`, registered by server/sql-functions.ts): the site is
 * joined as `s`; a ride with no site, or a site with no zone, takes the inspection body's default.
 */
const siteDayOf = (at: SQL, zone: SQL) =>
  sql`day_in_zone(${at}, ${zone}, (SELECT json_extract(st."value", '$.zone') FROM "settings" st WHERE st."key" = 'time_zone'))`;
const siteDay = (at: SQL) => siteDayOf(at, sql`s.time_zone`);

const inspectionAt = sql`COALESCE(strftime('%Y-%m-%dT%H:%M:%fZ', i.submitted_at), i.submitted_at)`;

/** One row per inspection waiting for a decision (an amendment stands in for its original). */
const inspectionRows: SQL = sql`
    SELECT
      'i:' || i.id, 'inspection', i.id, i.type, r.id, r.name, r.ride_class, r.status, r.site_id,
      s.name, r.operator_company_id, c.name, i.inspector_id, u.name,
      CASE
        WHEN i.analysis_status = 'over' THEN ${U('over')}
        WHEN i.failed_items > 0 THEN ${U('failed')}
        WHEN i.analysis_status = 'near' OR lf.wear_suggested_on IS NOT NULL THEN ${U('near')}
        WHEN d.overdue_since IS NOT NULL OR lf.ndt_overdue_since IS NOT NULL THEN ${U('overdue')}
        WHEN p.n > 0 THEN ${U('past_due')}
        ELSE ${U('awaiting')}
      END,
      -- Phones may send a local offset; in UTC every item's date sorts and compares as text.
      ${inspectionAt},
      i.analysis_status, i.failed_items, d.overdue_since, COALESCE(p.n, 0),
      lf.ndt_overdue_since, lf.wear_limit_on, lf.wear_suggested_on, NULL, NULL,
      lower(r.name || ' ' || COALESCE(r.serial, '') || ' ' || COALESCE(s.name, '') || ' ' || c.name || ' ' || u.name),
      ${siteDay(inspectionAt)}, NULL, NULL
    FROM pending i
      JOIN ${rides} r ON r.id = i.ride_id
      JOIN ${companies} c ON c.id = r.operator_company_id
      JOIN ${users} u ON u.id = i.inspector_id
      LEFT JOIN ${sites} s ON s.id = r.site_id
      LEFT JOIN ride_due d ON d.ride_id = r.id
      LEFT JOIN ride_past p ON p.ride_id = r.id
      LEFT JOIN ride_life lf ON lf.ride_id = r.id`;

/**
 * A ride row's date: its returned inspection's submission, else the earliest missed date (a schedule's or
 * an NDT's), else the first finding past due, else the suggested inspection date of a wear flag.
 */
const rideAt = sql`COALESCE(
        strftime('%Y-%m-%dT%H:%M:%fZ', al.submitted_at), al.submitted_at,
        strftime('%Y-%m-%dT%H:%M:%fZ', dy.failed_at), dy.failed_at,
        CASE
          WHEN d.overdue_since IS NULL THEN lf.ndt_overdue_since
          WHEN lf.ndt_overdue_since IS NULL THEN d.overdue_since
          ELSE min(d.overdue_since, lf.ndt_overdue_since)
        END,
        p.first_due, lf.wear_suggested_on, dy.missed_on
      )`;

/** One row per ride flagged by a returned inspection, or overdue / past due with nothing waiting. */
function rideRows(onlyRides: OnlyRides): SQL {
  return sql`
    SELECT
      'r:' || r.id, 'ride', al.inspection_id, al.type, r.id, r.name, r.ride_class, r.status, r.site_id,
      s.name, r.operator_company_id, c.name, al.inspector_id, au.name,
      CASE
        WHEN al.analysis_status = 'over' THEN ${U('over')}
        WHEN al.failed_items > 0 OR dy.failed_at IS NOT NULL THEN ${U('failed')}
        WHEN lf.wear_suggested_on IS NOT NULL THEN ${U('near')}
        WHEN d.overdue_since IS NOT NULL OR lf.ndt_overdue_since IS NOT NULL OR dy.missed_on IS NOT NULL THEN ${U('overdue')}
        ELSE ${U('past_due')}
      END,
      ${rideAt},
      al.analysis_status, COALESCE(al.failed_items, 0), d.overdue_since, COALESCE(p.n, 0),
      lf.ndt_overdue_since, lf.wear_limit_on, lf.wear_suggested_on, dy.failed_at, dy.missed_on,
      lower(r.name || ' ' || COALESCE(r.serial, '') || ' ' || COALESCE(s.name, '') || ' ' || c.name ||
        COALESCE(' ' || au.name, '')),
      ${siteDay(rideAt)}, NULL, NULL
    FROM ${rides} r
      JOIN ${companies} c ON c.id = r.operator_company_id
      LEFT JOIN ${sites} s ON s.id = r.site_id
      LEFT JOIN ride_due d ON d.ride_id = r.id
      LEFT JOIN ride_past p ON p.ride_id = r.id
      LEFT JOIN ride_alarm al ON al.ride_id = r.id
      LEFT JOIN ride_life lf ON lf.ride_id = r.id
      LEFT JOIN ${users} au ON au.id = al.inspector_id
      LEFT JOIN ride_daily dy ON dy.ride_id = r.id
    WHERE (
        al.inspection_id IS NOT NULL
        OR dy.ride_id IS NOT NULL
        OR (
          (d.overdue_since IS NOT NULL OR p.n > 0 OR lf.ride_id IS NOT NULL)
          AND NOT EXISTS (
            SELECT 1 FROM ${inspections} i
            WHERE i.ride_id = r.id AND i.review_state = 'submitted' AND i.type <> 'daily_pre_opening'
              AND NOT EXISTS (SELECT 1 FROM ${inspections} a WHERE a.amends_id = i.id)
          )
        )
      )
      AND ${onlyRides(sql`r.id`)}`;
}

const incidentAt = sql`n.occurred_at`;

/**
 * One row per incident report not yet reviewed (server/incidents): at the top of the queue when it took
 * the ride out of service or someone was hurt, else after the values near their limits. Its date is when
 * it happened; the inspector's columns stay empty (the reporter is in the search text).
 */
function incidentRows(onlyRides: OnlyRides): SQL {
  return sql`
    SELECT
      'n:' || n.id, 'incident', NULL, NULL, r.id, r.name, r.ride_class, r.status, r.site_id,
      s.name, r.operator_company_id, c.name, NULL, NULL,
      CASE WHEN n.stopped_ride = 1 OR n.anyone_hurt = 1 THEN ${U('incident_serious')} ELSE ${U('incident')} END,
      ${incidentAt}, NULL, 0, NULL, 0, NULL, NULL, NULL, NULL, NULL,
      lower(r.name || ' ' || COALESCE(r.serial, '') || ' ' || COALESCE(s.name, '') || ' ' || c.name || ' ' || u.name),
      ${siteDay(incidentAt)}, n.id, n.kind
    FROM ${incidents} n
      JOIN ${rides} r ON r.id = n.ride_id
      JOIN ${companies} c ON c.id = r.operator_company_id
      JOIN ${users} u ON u.id = n.reported_by
      LEFT JOIN ${sites} s ON s.id = r.site_id
    WHERE n.reviewed_at IS NULL AND ${onlyRides(sql`n.ride_id`)}`;
}

/** The two statements of a refresh of `scope`: delete the rows it covers, insert them afresh. */
function refreshStatements(scope: Scope): SQL[] {
  // The inspections' rides are found once per statement (a materialised CTE, a handful of rows) rather
  // than by a lookup of every inspection in each of the five places that keep to them.
  const scopeRides =
    scope === 'inspections'
      ? sql`
      scope_rides AS MATERIALIZED (
        SELECT DISTINCT x.ride_id AS ride_id FROM ${inspections} x WHERE ${inIds(sql`x.id`)}
      ),`
      : sql``;
  const onlyRides = (column: SQL): SQL =>
    scope === 'all'
      ? sql`1`
      : scope === 'rides'
        ? inIds(column)
        : sql`${column} IN (SELECT ride_id FROM scope_rides)`;
  // Scoped, the inspections are found through the ride or primary-key index; the unary + keeps SQLite
  // from preferring the review-state index, which would walk every submitted inspection (ms per write).
  const pendingScope =
    scope === 'all'
      ? sql`i.review_state = 'submitted'`
      : sql`+i.review_state = 'submitted' AND ${scope === 'rides' ? inIds(sql`i.ride_id`) : inIds(sql`i.id`)}`;
  const covered =
    scope === 'all'
      ? sql`1`
      : scope === 'rides'
        ? inIds(sql`${reviewQueue.rideId}`)
        : sql`${reviewQueue.key} IN (
            SELECT 'i:' || value FROM json_each(${IDS})
            UNION ALL SELECT 'i:' || x.amends_id FROM ${inspections} x
              WHERE ${inIds(sql`x.id`)} AND x.amends_id IS NOT NULL
            UNION ALL SELECT 'r:' || x.ride_id FROM ${inspections} x WHERE ${inIds(sql`x.id`)}
          )`;
  // A refresh of some inspections leaves the rides' incident rows alone (it does not delete them either).
  const incidentRides: OnlyRides = scope === 'inspections' ? () => sql`0` : onlyRides;
  return [
    sql`DELETE FROM ${reviewQueue} WHERE ${covered}`,
    sql`
    WITH${scopeRides}
${rideFacts(onlyRides, pendingScope)}
    INSERT INTO ${reviewQueue} (
      key, kind, inspection_id, inspection_type, ride_id, ride_name, ride_class, ride_status, site_id,
      site_name, operator_id, operator_name, inspector_id, inspector_name, urgency, at, analysis_status,
      failed_items, overdue_since, findings_past_due, ndt_due_on, wear_limit_on, wear_suggested_on,
      daily_failed_at, daily_missed_on, search, day, incident_id, incident_kind
    )
${inspectionRows}
    UNION ALL
${rideRows(onlyRides)}
    UNION ALL
${incidentRows(incidentRides)}
  `,
  ];
}

const dialect = new SQLiteSyncDialect();
const compiled = new Map<Scope, string[]>();

/** The statements as SQL text with named parameters, compiled once. */
function refreshTexts(scope: Scope): string[] {
  let texts = compiled.get(scope);
  if (!texts) {
    texts = refreshStatements(scope).map((statement) => {
      const query = dialect.sqlToQuery(statement);
      if (query.params.length) throw new Error('queue refresh: every value must be a named parameter');
      return query.sql;
    });
    compiled.set(scope, texts);
  }
  return texts;
}

type Params = { today: string; ids: string | null };
type Connection = Pick<Database.Database, 'prepare'>;

/**
 * The better-sqlite3 connection under a drizzle database or transaction. Drizzle keeps it on the root
 * database (`$client`) and, for a transaction, on its session; read by shape, null when not found.
 */
function connectionOf(db: object): Connection | null {
  const session =
    'session' in db && typeof db.session === 'object' && db.session !== null ? db.session : null;
  const candidate: unknown =
    '$client' in db ? db.$client : session && 'client' in session ? session.client : null;
  return isConnection(candidate) ? candidate : null;
}

const isConnection = (value: unknown): value is Connection =>
  typeof value === 'object' && value !== null && 'prepare' in value && typeof value.prepare === 'function';

const prepared = new WeakMap<Connection, Map<string, Database.Statement>>();

/**
 * Runs one statement. Preparing these statements costs more than running them for a few rides, so each
 * connection keeps them prepared; without a connection to hand, drizzle runs the same text.
 */
function execute(db: Tx, text: string, params: Params): void {
  const connection = connectionOf(db);
  if (!connection) {
    const parts = text
      .split(/(@today|@ids)\b/)
      .map((part) =>
        part === '@today' ? sql`${params.today}` : part === '@ids' ? sql`${params.ids}` : sql.raw(part),
      );
    db.run(sql.join(parts));
    return;
  }
  let statements = prepared.get(connection);
  if (!statements) {
    statements = new Map();
    prepared.set(connection, statements);
  }
  let statement = statements.get(text);
  if (!statement) {
    statement = connection.prepare(text);
    statements.set(text, statement);
  }
  statement.run(params);
}

function refresh(db: Tx, today: string, scope: Scope, ids: readonly string[] | null): void {
  generation++;
  const params: Params = {
    today: zoneDays('select' in db ? db : null, today),
    ids: ids ? JSON.stringify([...new Set(ids)]) : null,
  };
  for (const text of refreshTexts(scope)) execute(db, text, params);
}

/**
 * Recomputes the queue rows of the given rides (all rides when `rideIds` is omitted) for `today`
 * (YYYY-MM-DD). Idempotent; under a millisecond for a few rides, about half a second for 10,000.
 */
export function refreshQueue(db: Tx, today: string, rideIds?: readonly string[]): void {
  if (rideIds && rideIds.length === 0) return;
  refresh(db, today, rideIds ? 'rides' : 'all', rideIds ?? null);
}

/**
 * Recomputes only what the given inspections decide: their rows, their originals' and their rides' own.
 * Enough when the change touches nothing of the ride beyond these inspections (one arriving, amending
 * another, being analysed or decided); a change to the ride, its schedules or findings needs
 * `refreshQueue` for the ride.
 */
export function refreshQueueInspections(db: Tx, today: string, inspectionIds: readonly string[]): void {
  if (inspectionIds.length === 0) return;
  refresh(db, today, 'inspections', inspectionIds);
}

/**
 * Per database: the clock the whole queue was last rebuilt at, the zones' days it gave, and when those
 * days were last found unchanged (see `unchangedSince`).
 */
type Swept = { clock: string; days: string; checked: Check | null };
const sweptOn = new WeakMap<object, Swept>();

/**
 * Every zone's midnight falls on a quarter hour of UTC (offsets are whole quarter hours), so within one
 * quarter hour no site's date can change: the zones' days found for one instant hold for the rest of it,
 * as long as nothing was written that could change which zones there are (a refresh in this process, a
 * commit by another connection).
 */
const QUARTER_HOUR_MS = 15 * 60 * 1000;
type Check = { slot: number; generation: number; version: number };
const dataVersions = new WeakMap<Database.Database, Database.Statement<[], number>>();

/**
 * The check for `clock`: its quarter hour, this process's queue generation and the file's
 * `data_version` (pass it when the caller has just read it: each read of it opens a read transaction,
 * a few microseconds of file locks).
 */
function checkOf(db: Db, clock: string, dataVersion?: number): Check | null {
  // A pinned YYYY-MM-DD costs nothing to compare; only instants are worth remembering.
  if (clock.length === 10) return null;
  const at = Date.parse(clock);
  if (Number.isNaN(at)) return null;
  return {
    slot: Math.floor(at / QUARTER_HOUR_MS),
    generation,
    version: dataVersion ?? readDataVersion(sqliteOf(db)),
  };
}

/** The file's `PRAGMA data_version`: it moves with every commit by another connection. */
export function readDataVersion(sqlite: Database.Database): number {
  let version = dataVersions.get(sqlite);
  if (!version) {
    version = sqlite.prepare<[], number>('PRAGMA data_version').pluck();
    dataVersions.set(sqlite, version);
  }
  return version.get() ?? 0;
}

const sameCheck = (a: Check | null, b: Check | null) =>
  a !== null && b !== null && a.slot === b.slot && a.generation === b.generation && a.version === b.version;

/**
 * The clock to refresh a few rides at, from a write path: the one the whole queue was last rebuilt at, so
 * every row is judged against the same days (a pinned test clock included); before any rebuild, now.
 */
export const queueDay = (db: Db, now: Date = new Date()): string => sweptOn.get(db)?.clock ?? queueToday(now);

/**
 * Rebuilds the whole queue the first time it is read after a new day begins at any site (and after
 * start-up): its overdue rows move with each site's date alone. It is asked on every read of the queue,
 * so the zones' days (two queries and a date per zone) are worked out again only in a new quarter hour
 * or after a write. A caller that has just read the file's `data_version` (`readDataVersion`) passes it.
 */
export function ensureQueueFresh(db: Db, today: string, dataVersion?: number): void {
  const swept = sweptOn.get(db);
  const check = swept ? checkOf(db, today, dataVersion) : null;
  if (swept && sameCheck(swept.checked, check)) return;
  const days = zoneDays(db, today);
  if (swept?.days === days) {
    swept.checked = check;
    return;
  }
  db.transaction((tx) => refreshQueue(tx, today));
  sweptOn.set(db, { clock: today, days, checked: checkOf(db, today) });
}
