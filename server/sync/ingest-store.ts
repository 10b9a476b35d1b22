/**
 * The push's writes: prepared statements made once per connection, and the two ways a batch's accepted
 * records go in. Normally all of them at once after every record was checked (`storeAll`: multi-row
 * INSERTs in one savepoint); if the database refuses any row of that, nothing of it is kept and the batch
 * goes again one record per savepoint (`storeOne`), so a record the database refuses costs only itself.
 *
 * Why multi-row: better-sqlite3 pays a fixed price per statement run (the call, resetting and stepping the
 * statement) that is larger than binding a row's values, so a reading per run cost more than the reading's
 * insert itself, and a savepoint per record doubled the statements again (see bench/ingest.ts).
 */
import type Database from 'better-sqlite3';

import type { InspectionRecord } from '@/features/records/schema';
import type { Db } from '@/server/db';
import { sqliteOf } from '@/server/sqlite-client';

type RideRow = { id: string; operatorCompanyId: string; currentDesignId: string | null };
type ExistingRow = { contentSha256: string; rideId: string; inspectorId: string };
export type PhoneKey = { keyId: string; publicKey: string; revokedAt: string | null };

/** An inspection's row, in the INSERT's column order. */
export type InspectionParams = [
  id: string,
  rideId: string,
  inspectorId: string,
  type: string,
  startedAt: string,
  submittedAt: string,
  receivedAt: string,
  batchId: string,
  designVersionId: string | null,
  templateId: string | null,
  templateVersion: number | null,
  amendsId: string | null,
  record: string,
  contentSha256: string,
  failedItems: number,
];
export type StoredRecord = { inspection: InspectionParams; record: InspectionRecord };

const inspectionColumns = `(id, ride_id, inspector_id, type, started_at, submitted_at, received_at, batch_id,
  design_version_id, template_id, template_version, amends_id, record, content_sha256, failed_items)`;
const readingColumns = `(inspection_id, id, ride_id, kind, joint, label, value_si, unit, method, spread_si,
  taken_at, note)`;
const photoColumns = '(inspection_id, id, sha256, mime, bytes, caption, joint, checklist_item_id, taken_at)';

/**
 * Rows per multi-row statement. Larger chunks gain little once the per-run cost is spread, while a
 * statement's text and its bound values grow with them (SQLite allows 32,766 values per statement).
 */
const INSPECTIONS_PER_RUN = 25;
const READINGS_PER_RUN = 100;
const PHOTOS_PER_RUN = 50;

type Table = { sql: string; width: number; perRun: number; byCount: Map<number, Database.Statement> };

const table = (sql: string, width: number, perRun: number): Table => ({
  sql,
  width,
  perRun,
  byCount: new Map(),
});

export type Statements = {
  sqlite: Database.Database;
  findBatch: Database.Statement<[string, string], { result: string }>;
  insertBatch: Database.Statement<[string, string, string, number, string]>;
  findRide: Database.Statement<[string], RideRow>;
  designRide: Database.Statement<[string], { rideId: string }>;
  /** The batch's ids already stored, in one query per batch rather than one per record. */
  findInspections: Database.Statement<[string], ExistingRow & { id: string }>;
  /** The sending person's phone keys, once per batch; revoked ones too, to say why a record is refused. */
  personKeys: Database.Statement<[string], PhoneKey>;
  /** Whose a key is, asked only for a record signed with a key that is not the sender's. */
  keyOwner: Database.Statement<[string], { userId: string }>;
  inspections: Table;
  readings: Table;
  photos: Table;
  /** Every record given, in one savepoint when called inside the batch transaction. */
  storeAll: Database.Transaction<(rows: readonly StoredRecord[]) => void>;
  /** One record, in a savepoint of its own. */
  storeOne: Database.Transaction<(row: StoredRecord) => void>;
};

/** `INSERT … VALUES (…), (…)` for `count` rows of `t`, prepared once per connection and count. */
function insertOf(sqlite: Database.Database, t: Table, count: number): Database.Statement {
  let statement = t.byCount.get(count);
  if (!statement) {
    const row = `(${Array.from({ length: t.width }, () => '?').join(', ')})`;
    statement = sqlite.prepare(`${t.sql} VALUES ${Array.from({ length: count }, () => row).join(', ')}`);
    t.byCount.set(count, statement);
  }
  return statement;
}

/** Inserts rows of `t` (each `t.width` values long), `t.perRun` to a statement. */
function insertRows(sqlite: Database.Database, t: Table, rows: readonly (readonly unknown[])[]): void {
  for (let start = 0; start < rows.length; start += t.perRun) {
    const chunk = rows.slice(start, start + t.perRun);
    const values: unknown[] = [];
    for (const row of chunk) for (const value of row) values.push(value);
    insertOf(sqlite, t, chunk.length).run(values);
  }
}

const readingRows = (record: InspectionRecord): unknown[][] =>
  record.readings.map((r) => [
    record.id,
    r.id,
    record.rideId,
    r.kind,
    r.joint,
    r.label,
    r.valueSI,
    r.unit,
    r.method,
    r.spreadSI ?? null,
    r.takenAt,
    r.note ?? null,
  ]);

const photoRows = (record: InspectionRecord): unknown[][] =>
  record.photos.map((p) => [
    record.id,
    p.id,
    p.sha256,
    p.mime,
    p.bytes,
    p.caption,
    p.joint,
    p.checklistItemId,
    p.takenAt,
  ]);

function store(sqlite: Database.Database, st: Statements, rows: readonly StoredRecord[]): void {
  // Inspections first: every reading and photo row refers to its inspection.
  insertRows(
    sqlite,
    st.inspections,
    rows.map((r) => r.inspection),
  );
  insertRows(
    sqlite,
    st.readings,
    rows.flatMap((r) => readingRows(r.record)),
  );
  insertRows(
    sqlite,
    st.photos,
    rows.flatMap((r) => photoRows(r.record)),
  );
}

const cache = new WeakMap<Database.Database, Statements>();

export function statementsFor(db: Db): Statements {
  const sqlite = sqliteOf(db);
  const found = cache.get(sqlite);
  if (found) return found;
  // A savepoint keeps, in a side journal, each page's first change inside it; in memory rather than a
  // temporary file that costs a copy instead of a write (bench/ingest.ts applies the same setting to its
  // raw baseline).
  sqlite.pragma('temp_store = MEMORY');
  const statements: Statements = {
    sqlite,
    findBatch: sqlite.prepare('SELECT result FROM sync_batches WHERE user_id = ? AND batch_id = ?'),
    insertBatch: sqlite.prepare(
      'INSERT INTO sync_batches (user_id, batch_id, received_at, record_count, result) VALUES (?, ?, ?, ?, ?)',
    ),
    findRide: sqlite.prepare(
      `SELECT r.id AS id, r.operator_company_id AS operatorCompanyId,
         (SELECT d.id FROM design_versions d WHERE d.ride_id = r.id AND d.approval_state = 'in_force'
           ORDER BY d.version DESC LIMIT 1)
           AS currentDesignId
       FROM rides r WHERE r.id = ?`,
    ),
    // Only versions that were in force: a revision waiting for approval (or rejected) is never analysed.
    designRide: sqlite.prepare(
      "SELECT ride_id AS rideId FROM design_versions WHERE id = ? AND approval_state = 'in_force'",
    ),
    findInspections: sqlite.prepare(
      `SELECT id, content_sha256 AS contentSha256, ride_id AS rideId, inspector_id AS inspectorId
       FROM inspections WHERE id IN (SELECT value FROM json_each(?))`,
    ),
    personKeys: sqlite.prepare(
      'SELECT key_id AS keyId, public_key AS publicKey, revoked_at AS revokedAt FROM device_keys WHERE user_id = ?',
    ),
    keyOwner: sqlite.prepare('SELECT user_id AS userId FROM device_keys WHERE key_id = ?'),
    inspections: table(`INSERT INTO inspections ${inspectionColumns}`, 15, INSPECTIONS_PER_RUN),
    readings: table(`INSERT INTO inspection_readings ${readingColumns}`, 12, READINGS_PER_RUN),
    photos: table(`INSERT INTO inspection_photos ${photoColumns}`, 9, PHOTOS_PER_RUN),
    storeAll: sqlite.transaction((rows: readonly StoredRecord[]) => store(sqlite, statements, rows)),
    storeOne: sqlite.transaction((row: StoredRecord) => store(sqlite, statements, [row])),
  };
  cache.set(sqlite, statements);
  return statements;
}
