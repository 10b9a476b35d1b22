/**
 * Reading the supervisors' queue from its read model (`review_queue`, kept by ./queue-refresh.ts): one
 * indexed page query per request, plus the counts per urgency, which are kept in memory per filter until
 * the queue changes.
 *
 * This is the desk's busiest read, so it talks to better-sqlite3 directly with statements prepared once
 * per query shape (as the push service does): building a drizzle query per request would cost more than
 * running it.
 */
import type Database from 'better-sqlite3';
import { getTableColumns } from 'drizzle-orm';

import { reviewQueue } from '@/db/server/review';
import {
  urgencies,
  type QueueItem,
  type QueueQuery,
  type QueueResponse,
  type Urgency,
} from '@/features/review/schema';
import type { Db } from '@/server/db';
import { addDays } from '@/lib/dates';
import { ensureQueueFresh, queueGeneration, readDataVersion } from '@/server/queue/queue-refresh';
import { sqliteOf } from '@/server/sqlite-client';

/** The table's column names, quoted, by their schema keys: the SQL below follows db/server/review.ts. */
const c = Object.fromEntries(
  Object.entries(getTableColumns(reviewQueue)).map(([k, v]) => [k, `"${v.name}"`]),
) as Record<keyof typeof reviewQueue.$inferSelect, string>;

/** Every item field, in the API's shape (urgency by name), as SQLite's json_object arguments. */
const itemFields = (
  [
    'key',
    'kind',
    'inspectionId',
    'inspectionType',
    'rideId',
    'rideName',
    'rideClass',
    'rideStatus',
    'siteId',
    'siteName',
    'operatorId',
    'operatorName',
    'inspectorId',
    'inspectorName',
    'urgency',
    'at',
    'day',
    'analysisStatus',
    'failedItems',
    'overdueSince',
    'findingsPastDue',
    'ndtDueOn',
    'wearLimitOn',
    'wearSuggestedOn',
    'incidentId',
    'incidentKind',
    'dailyFailedAt',
    'dailyMissedOn',
  ] as const satisfies readonly (keyof QueueItem)[]
)
  .map((k) =>
    k === 'urgency'
      ? `'urgency', CASE ${c.urgency} ${urgencies.map((u, i) => `WHEN ${i} THEN '${u}'`).join(' ')} END`
      : `'${k}', ${c[k]}`,
  )
  .join(', ');

/**
 * Each sort names its index's columns, so the page is read in index order: `urgency` is the queue's own
 * order (most urgent, then longest waiting), `ride` is by name.
 */
const orders: Record<QueueQuery['sort'], string> = {
  urgency: `${c.urgency}, ${c.at}, ${c.key}`,
  newest: `${c.at} DESC, ${c.key} DESC`,
  oldest: `${c.at}, ${c.key}`,
  ride: `${c.rideName}, ${c.key}`,
};

/**
 * Lower-cases A–Z only, as SQLite's lower() did when it wrote the `search` column, so both sides of the
 * comparison are folded the same way (other letters then match only as typed).
 */
const foldAscii = (s: string) => s.replace(/[A-Z]/g, (ch) => ch.toLowerCase());

type Where = { sql: string[]; params: (string | number)[] };

/** The conditions of every filter except urgency: the counts are taken over these. */
function filterConditions(query: QueueQuery): Where {
  const where: Where = { sql: [], params: [] };
  const add = (sql: string, ...params: (string | number)[]) => {
    where.sql.push(sql);
    where.params.push(...params);
  };
  const anyOf = (column: string, values: readonly string[]) =>
    add(`${column} IN (${values.map(() => '?').join(', ')})`, ...values);
  if (query.siteId) add(`${c.siteId} = ?`, query.siteId);
  if (query.operatorId) add(`${c.operatorId} = ?`, query.operatorId);
  if (query.inspectorId) add(`${c.inspectorId} = ?`, query.inspectorId);
  if (query.rideClass?.length) anyOf(c.rideClass, [...new Set(query.rideClass)]);
  if (query.rideStatus?.length) anyOf(c.rideStatus, [...new Set(query.rideStatus)]);
  // From and To are days on each item's site clock (`day`). `at` (a UTC instant, or a date) is bounded a
  // day wider on each side too, which no zone's offset (at most 14 hours) can cross, so the page is still
  // read through its index.
  if (query.from) {
    add(`${c.at} >= ?`, addDays(query.from, -1));
    add(`${c.day} >= ?`, query.from);
  }
  if (query.to) {
    add(`${c.at} < ?`, addDays(query.to, 2));
    add(`${c.day} <= ?`, query.to);
  }
  if (query.q) add(`instr(${c.search}, ?) > 0`, foldAscii(query.q));
  return where;
}

const whereClause = (conditions: string[]) => (conditions.length ? ` WHERE ${conditions.join(' AND ')}` : '');

/** The urgency filter as indices, in order, without repeats; null when every urgency is wanted. */
function urgencyIndices(query: QueueQuery): number[] | null {
  if (!query.urgency?.length) return null;
  return [...new Set(query.urgency.map((u) => urgencies.indexOf(u)))].sort((a, b) => a - b);
}

/**
 * The page query for `query`: SQL and parameters. The page comes back as one JSON array built by SQLite,
 * which costs a quarter of making a JavaScript object per row and serialising them again. Exported for
 * the query-plan check in the tests.
 */
export function queuePageSql(query: QueueQuery): { sql: string; params: (string | number)[] } {
  const where = filterConditions(query);
  const wanted = urgencyIndices(query);
  const conditions = [...where.sql];
  if (wanted) conditions.push(`${c.urgency} IN (${wanted.join(', ')})`);
  const order = orders[query.sort];
  return {
    sql:
      `SELECT json_group_array(json_object(${itemFields}) ORDER BY ${order}) FROM ` +
      `(SELECT * FROM review_queue${whereClause(conditions)} ORDER BY ${order} LIMIT ? OFFSET ?)`,
    params: [...where.params, query.pageSize, (query.page - 1) * query.pageSize],
  };
}

function countsSql(where: Where): string {
  return `SELECT ${c.urgency} AS urgency, count(*) AS n FROM review_queue${whereClause(where.sql)} GROUP BY ${c.urgency}`;
}

/** At most this many filters' counts (and query shapes) are kept; a flood of distinct ones starts over. */
const MAX_REMEMBERED = 2000;

type Cache = {
  sqlite: Database.Database;
  statements: Map<string, Database.Statement>;
  /** Counts per urgency by filter, valid while the queue's generation and the file's version stand. */
  counts: Map<string, number[]>;
  /** Pages (their items as JSON text), remembered under the same rule as the counts. */
  pages: Map<string, string>;
  generation: number;
  version: number;
};

const caches = new WeakMap<Database.Database, Cache>();

function cacheOf(db: Db): Cache {
  const sqlite = sqliteOf(db);
  let cache = caches.get(sqlite);
  if (!cache) {
    cache = {
      sqlite,
      statements: new Map(),
      counts: new Map(),
      pages: new Map(),
      generation: -1,
      version: -1,
    };
    caches.set(sqlite, cache);
  }
  return cache;
}

function statement(cache: Cache, sql: string): Database.Statement {
  let st = cache.statements.get(sql);
  if (!st) {
    if (cache.statements.size >= MAX_REMEMBERED) cache.statements.clear();
    st = cache.sqlite.prepare(sql);
    cache.statements.set(sql, st);
  }
  return st;
}

/**
 * Counts per urgency (index = urgency) over the filters. Remembered until the queue changes: any refresh
 * in this process bumps the queue's generation, and a commit by another connection changes the file's
 * `data_version`. Inside a transaction nothing is remembered, since it may yet roll back.
 */
function countsFor(cache: Cache, where: Where): number[] {
  const sql = countsSql(where);
  const remember = !cache.sqlite.inTransaction;
  if (remember) {
    const generation = queueGeneration();
    const version = readDataVersion(cache.sqlite);
    if (generation !== cache.generation || version !== cache.version || cache.counts.size >= MAX_REMEMBERED) {
      cache.counts.clear();
      cache.pages.clear();
      cache.generation = generation;
      cache.version = version;
    }
    const key = `${sql}\u0000${where.params.join('\u0000')}`;
    const known = cache.counts.get(key);
    if (known) return known;
    const counts = countRows(cache, sql, where.params);
    cache.counts.set(key, counts);
    return counts;
  }
  return countRows(cache, sql, where.params);
}

function countRows(cache: Cache, sql: string, params: (string | number)[]): number[] {
  const counts = urgencies.map(() => 0);
  for (const row of statement(cache, sql).all(...params) as { urgency: number; n: number }[])
    counts[row.urgency] = row.n;
  return counts;
}

/**
 * What the queue's pages stand on, as of `today` (the queue is rebuilt first if it was built for another
 * day): equal stamps mean equal pages for equal queries, so a caller may keep whatever it derived from a
 * page (its JSON text, compressed bytes, an ETag) for as long as the stamp stays the same. The stamp moves
 * with any refresh in this process (the queue's generation) and any commit by another connection
 * (`PRAGMA data_version`). Null inside a transaction, whose reads may yet roll back.
 */
export function queueStamp(db: Db, today: string): string | null {
  // One read of the file's version serves the freshness check and the stamp (a commit in this process
  // leaves it as it was, so it still holds after a rebuild here).
  const sqlite = sqliteOf(db);
  const version = readDataVersion(sqlite);
  ensureQueueFresh(db, today, version);
  if (sqlite.inTransaction) return null;
  return `${queueGeneration()}:${version}`;
}

type Page = Omit<QueueResponse, 'items'> & {
  /** The items as a JSON array, ready to send. */
  itemsJson: string;
};

/**
 * One page of the queue for `query` as it stands on `today` (YYYY-MM-DD; the queue is rebuilt first if it
 * was last built for another day), with the counts per urgency over every filter except `urgency` (so
 * the tiles at the top can switch it) and the total over every filter.
 */
function readPage(db: Db, query: QueueQuery, today: string): Page {
  ensureQueueFresh(db, today);
  const cache = cacheOf(db);
  const counts = countsFor(cache, filterConditions(query));
  const wanted = urgencyIndices(query);
  const total = (wanted ?? urgencies.map((_, i) => i)).reduce((sum, i) => sum + counts[i], 0);
  let itemsJson = '[]';
  if ((query.page - 1) * query.pageSize < total) {
    const page = queuePageSql(query);
    // `countsFor` above has just dropped whatever the queue's latest change made stale.
    const remember = !cache.sqlite.inTransaction;
    const key = `${page.sql}\u0000${page.params.join('\u0000')}`;
    const known = remember ? cache.pages.get(key) : undefined;
    itemsJson =
      known ??
      (statement(cache, page.sql)
        .pluck()
        .get(...page.params) as string | undefined) ??
      '[]';
    if (remember && known === undefined) {
      if (cache.pages.size >= MAX_REMEMBERED) cache.pages.clear();
      cache.pages.set(key, itemsJson);
    }
  }
  return {
    itemsJson,
    total,
    page: query.page,
    pageSize: query.pageSize,
    counts: Object.fromEntries(urgencies.map((u, i) => [u, counts[i]])) as Record<Urgency, number>,
  };
}

/** The page as `queueResponseSchema` describes it. */
export function readQueue(db: Db, query: QueueQuery, today: string): QueueResponse {
  const { itemsJson, ...rest } = readPage(db, query, today);
  return { items: JSON.parse(itemsJson) as QueueItem[], ...rest };
}

/** The same page as the JSON text of a `QueueResponse`, for the route to send as it is. */
export function readQueueJson(db: Db, query: QueueQuery, today: string): string {
  const { itemsJson, ...rest } = readPage(db, query, today);
  return `{"items":${itemsJson},${JSON.stringify(rest).slice(1)}`;
}
