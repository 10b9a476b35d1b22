/**
 * POST /api/sync/push, the service: stores a phone's batch of inspection records, record by record, and
 * answers per record. The whole batch and its answer are one transaction and each record is a savepoint
 * inside it, so a record is stored whole or not at all, and the batch's answer exists exactly when its
 * records do — a re-sent batch (same user, same batch id) gets that answer back and writes nothing.
 *
 * The write path talks to better-sqlite3 with prepared statements made once per connection: it is the
 * server's hottest path (a phone back from a day without signal sends everything at once), and building
 * a drizzle query per row costs more than the insert itself (see bench/ingest.ts).
 */
import { createHash } from 'node:crypto';

import type Database from 'better-sqlite3';

import type { SessionUser } from '@/features/session/schema';
import {
  inspectionRecordSchema,
  type InspectionRecord,
  type PushResult,
  type Reading,
} from '@/features/records/schema';
import { zodIssues } from '@/lib/api-errors';
import type { DesignData } from '@/features/loads/design-schema';
import { companyScope } from '@/server/auth/scope';
import { instrumentLookup, recordTruthIssues } from '@/server/instruments/record-checks';
import type { Db } from '@/server/db';
import { queueDay, refreshQueueInspections } from '@/server/queue/queue-refresh';
import { checklistLimitIssues, checklistLimitLookup } from '@/server/sync/checklist-check';
import { enteredIssues } from '@/server/sync/entered-check';
import {
  acceptedReadingsLookup,
  designDataLookup,
  plausibilityIssues,
} from '@/server/sync/plausibility-check';
import { sqliteOf } from '@/server/sqlite-client';

type PushBatch = { batchId: string; records: unknown[] };
type RecordResult = PushResult['results'][number];
type Issue = { path: string; message: string };

/** Better-sqlite3 reports constraint failures with codes like SQLITE_CONSTRAINT_PRIMARYKEY. */
const isConstraintError = (err: unknown): boolean =>
  typeof err === 'object' &&
  err !== null &&
  'code' in err &&
  typeof err.code === 'string' &&
  err.code.startsWith('SQLITE_CONSTRAINT');

type RideRow = { id: string; operatorCompanyId: string; currentDesignId: string | null };
type ExistingRow = { contentSha256: string; rideId: string; inspectorId: string };

type Statements = {
  sqlite: Database.Database;
  findBatch: Database.Statement<[string, string], { result: string }>;
  insertBatch: Database.Statement<[string, string, string, number, string]>;
  findRide: Database.Statement<[string], RideRow>;
  designRide: Database.Statement<[string], { rideId: string }>;
  /** The batch's ids already stored, in one query per batch rather than one per record. */
  findInspections: Database.Statement<[string], ExistingRow & { id: string }>;
  insertInspection: Database.Statement<[InspectionParams]>;
  insertReading: Database.Statement<ReadingRow>;
  insertPhoto: Database.Statement<[PhotoParams]>;
  /** Runs its function as a savepoint when called inside the batch transaction. */
  storeRecord: Database.Transaction<(row: StoredRecord) => void>;
};

type InspectionParams = {
  id: string;
  rideId: string;
  inspectorId: string;
  type: string;
  startedAt: string;
  submittedAt: string;
  receivedAt: string;
  batchId: string;
  designVersionId: string | null;
  templateId: string | null;
  templateVersion: number | null;
  amendsId: string | null;
  record: string;
  contentSha256: string;
  failedItems: number;
};
/** Positional, in the INSERT's column order: the one statement run for every reading. */
type ReadingRow = [
  inspectionId: string,
  id: string,
  rideId: string,
  kind: string,
  joint: number | null,
  label: string,
  valueSi: number,
  unit: string,
  method: string,
  spreadSi: number | null,
  takenAt: string,
  note: string | null,
];
type PhotoParams = {
  inspectionId: string;
  id: string;
  sha256: string;
  mime: string;
  bytes: number;
  caption: string;
  joint: number | null;
  checklistItemId: string | null;
  takenAt: string;
};
type StoredRecord = { inspection: InspectionParams; record: InspectionRecord };

const cache = new WeakMap<Database.Database, Statements>();

function statementsFor(db: Db): Statements {
  const sqlite = sqliteOf(db);
  const found = cache.get(sqlite);
  if (found) return found;
  // A savepoint keeps, in a side journal, each page's first change inside it; with a savepoint per record
  // that journal is rewritten hundreds of times per batch, and in memory rather than a temporary file it
  // costs a copy instead of a write (bench/ingest.ts applies the same setting to its raw baseline).
  sqlite.pragma('temp_store = MEMORY');
  const insertInspection = sqlite.prepare<[InspectionParams]>(
    `INSERT INTO inspections (id, ride_id, inspector_id, type, started_at, submitted_at, received_at, batch_id,
       design_version_id, template_id, template_version, amends_id, record, content_sha256, failed_items)
     VALUES (@id, @rideId, @inspectorId, @type, @startedAt, @submittedAt, @receivedAt, @batchId,
       @designVersionId, @templateId, @templateVersion, @amendsId, @record, @contentSha256, @failedItems)`,
  );
  const insertReading = sqlite.prepare<ReadingRow>(
    `INSERT INTO inspection_readings (inspection_id, id, ride_id, kind, joint, label, value_si, unit, method,
       spread_si, taken_at, note)
     VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`,
  );
  const insertPhoto = sqlite.prepare<[PhotoParams]>(
    `INSERT INTO inspection_photos (inspection_id, id, sha256, mime, bytes, caption, joint, checklist_item_id,
       taken_at)
     VALUES (@inspectionId, @id, @sha256, @mime, @bytes, @caption, @joint, @checklistItemId, @takenAt)`,
  );
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
    insertInspection,
    insertReading,
    insertPhoto,
    storeRecord: sqlite.transaction(({ inspection, record }: StoredRecord) => {
      insertInspection.run(inspection);
      for (const r of record.readings)
        insertReading.run(
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
        );
      for (const p of record.photos)
        insertPhoto.run({
          inspectionId: record.id,
          id: p.id,
          sha256: p.sha256,
          mime: p.mime,
          bytes: p.bytes,
          caption: p.caption,
          joint: p.joint,
          checklistItemId: p.checklistItemId,
          takenAt: p.takenAt,
        });
    }),
  };
  cache.set(sqlite, statements);
  return statements;
}

/** Ids that must be unique within a record (they key its rows), reported at the second occurrence. */
function duplicateIds(record: InspectionRecord): Issue[] {
  const issues: Issue[] = [];
  for (const list of ['readings', 'photos'] as const) {
    const seen = new Set<string>();
    record[list].forEach((item, i) => {
      if (seen.has(item.id))
        issues.push({ path: `${list}.${i}.id`, message: 'Appears twice in this record' });
      seen.add(item.id);
    });
  }
  return issues;
}

/** How far a phone's clock may run ahead of the server's before its submission time is refused. */
export const CLOCK_SKEW_MS = 5 * 60 * 1000;

/**
 * The phone's times must be possible: submitted no later than the server received it (give or take the
 * skew), and started no later than submitted. A record dated in the future would otherwise move the
 * ride's schedule on approval.
 */
function timeOfRecordIssues(record: InspectionRecord, receivedAt: string): Issue[] {
  const submitted = Date.parse(record.submittedAt);
  const issues: Issue[] = [];
  if (submitted > Date.parse(receivedAt) + CLOCK_SKEW_MS)
    issues.push({
      path: 'submittedAt',
      message:
        `Later than the server received it (${receivedAt}); check the phone's date and time, then send ` +
        'it again',
    });
  if (Date.parse(record.startedAt) > submitted)
    issues.push({ path: 'startedAt', message: 'Later than the submission time; an inspection starts first' });
  return issues;
}

const rejected = (id: string | null, issues: Issue[]): RecordResult => ({ id, status: 'rejected', issues });

/** The id the phone will look for in the answer, even when the rest of the record is unusable. */
function idOf(raw: unknown): string | null {
  if (typeof raw !== 'object' || raw === null || !('id' in raw)) return null;
  return typeof raw.id === 'string' && raw.id.length > 0 && raw.id.length <= 200 ? raw.id : null;
}

type BatchContext = {
  st: Statements;
  user: SessionUser;
  scope: string | null;
  batchId: string;
  receivedAt: string;
  rides: Map<string, RideRow | null>;
  designs: Map<string, string | null>;
  /** Stored inspections the batch refers to (its ids and amendsIds), kept up to date as records go in. */
  known: Map<string, ExistingRow>;
  /** Design data by version id, for the plausibility of motion readings. */
  design: (designVersionId: string) => DesignData | null;
  /** The readings of an accepted inspection, for what an amendment carries over. */
  acceptedReadings: (inspectionId: string) => readonly Reading[];
  /** Register entries by id, for the calibration check. */
  instrument: ReturnType<typeof instrumentLookup>;
  /** Template and design versions by id, for the checklist limits. */
  limits: ReturnType<typeof checklistLimitLookup>;
};

function rideOf(ctx: BatchContext, id: string): RideRow | null {
  let ride = ctx.rides.get(id);
  if (ride === undefined) {
    ride = ctx.st.findRide.get(id) ?? null;
    ctx.rides.set(id, ride);
  }
  // Staff see every ride; the scope check stays so a future role with a company can't reach past it.
  if (ride && ctx.scope !== null && ride.operatorCompanyId !== ctx.scope) return null;
  return ride;
}

function designRideOf(ctx: BatchContext, designVersionId: string): string | null {
  let rideId = ctx.designs.get(designVersionId);
  if (rideId === undefined) {
    rideId = ctx.st.designRide.get(designVersionId)?.rideId ?? null;
    ctx.designs.set(designVersionId, rideId);
  }
  return rideId;
}

function ingestRecord(ctx: BatchContext, raw: unknown): RecordResult {
  const parsed = inspectionRecordSchema.safeParse(raw);
  if (!parsed.success) return rejected(idOf(raw), zodIssues(parsed.error));
  const record = parsed.data;
  // The token says who is sending; a record written on the phone by someone else (a shared phone) is
  // theirs to send, never this person's.
  if (record.authorId !== undefined && record.authorId !== ctx.user.id)
    return rejected(record.id, [
      {
        path: 'authorId',
        message:
          'This inspection was recorded by another person; it can only be sent when they are signed in',
      },
    ]);
  const sameIds = duplicateIds(record);
  if (sameIds.length) return rejected(record.id, sameIds);

  // The schema's output has its keys in schema order whatever order the phone sent, so equal content
  // always serialises (and hashes) the same.
  const json = JSON.stringify(record);
  const contentSha256 = createHash('sha256').update(json).digest('hex');

  const existing = ctx.known.get(record.id);
  if (existing) {
    if (existing.contentSha256 === contentSha256) return { id: record.id, status: 'duplicate' };
    return rejected(record.id, [
      {
        path: 'id',
        message:
          'An inspection with this id was already accepted with different content; send corrections as an ' +
          'amendment (a new record with amendsId set to this id)',
      },
    ]);
  }

  // After the duplicate check: a record stored before these rules may still be re-sent unchanged.
  const untrue = recordTruthIssues(record, ctx.instrument);
  if (untrue.length) return rejected(record.id, untrue);
  const mistyped = enteredIssues(record);
  if (mistyped.length) return rejected(record.id, mistyped);
  const untimely = timeOfRecordIssues(record, ctx.receivedAt);
  if (untimely.length) return rejected(record.id, untimely);

  const ride = rideOf(ctx, record.rideId);
  if (!ride)
    return rejected(record.id, [{ path: 'rideId', message: 'No ride with this id is in the register' }]);

  let designVersionId = record.designVersionId;
  if (designVersionId === null) {
    designVersionId = ride.currentDesignId;
  } else if (designRideOf(ctx, designVersionId) !== ride.id) {
    return rejected(record.id, [
      { path: 'designVersionId', message: "Not a design-data version in force for this inspection's ride" },
    ]);
  }

  const amendsId = record.amendsId ?? null;
  if (amendsId !== null) {
    const original = ctx.known.get(amendsId);
    const problem = !original
      ? 'No accepted inspection has this id; the original must reach the server first'
      : original.rideId !== ride.id
        ? 'The inspection amended is of another ride'
        : ctx.user.role === 'inspector' && original.inspectorId !== ctx.user.id
          ? "An inspector may amend only their own inspections; ask a supervisor to amend another's"
          : null;
    if (problem) return rejected(record.id, [{ path: 'amendsId', message: problem }]);
  }

  // Checked against the design data the analysis will use, so what was confirmed is what is analysed.
  const implausible = plausibilityIssues(
    designVersionId ? ctx.design(designVersionId) : null,
    record.readings,
    amendsId !== null ? ctx.acceptedReadings(amendsId) : [],
  );
  if (implausible.length) return rejected(record.id, implausible);

  // A value over its checklist limit is passed only with the inspector's reason (same rule as the phone).
  const passedOver = checklistLimitIssues(
    designVersionId ? ctx.limits.design(designVersionId) : null,
    ctx.limits.template(record.templateId, record.templateVersion),
    record.checklist,
  );
  if (passedOver.length) return rejected(record.id, passedOver);

  const inspection: InspectionParams = {
    id: record.id,
    rideId: ride.id,
    inspectorId: ctx.user.id,
    type: record.type,
    startedAt: record.startedAt,
    submittedAt: record.submittedAt,
    receivedAt: ctx.receivedAt,
    batchId: ctx.batchId,
    designVersionId,
    templateId: record.templateId,
    templateVersion: record.templateVersion,
    amendsId,
    record: json,
    contentSha256,
    failedItems: record.checklist.reduce((n, a) => n + (a.result === 'fail' ? 1 : 0), 0),
  };
  try {
    ctx.st.storeRecord({ inspection, record });
  } catch (err) {
    // A record the database itself refuses can never be stored, so it is answered like any invalid one;
    // anything else (disk, lock) fails the whole batch, which the phone then sends again unchanged.
    if (!isConstraintError(err)) throw err;
    return rejected(record.id, [
      { path: '', message: 'The server could not store this record as it is; it was not kept' },
    ]);
  }
  ctx.known.set(record.id, { contentSha256, rideId: ride.id, inspectorId: ctx.user.id });
  return { id: record.id, status: 'accepted' };
}

type IngestOutcome = { result: PushResult; replayed: boolean; accepted: number };

/**
 * Stores a batch (already checked against pushBatchSchema) for `user`. A batch id this user has sent
 * before gets its stored answer and changes nothing.
 */
export function ingestBatch(
  db: Db,
  user: SessionUser,
  batch: PushBatch,
  now: Date = new Date(),
): IngestOutcome {
  const st = statementsFor(db);
  const scope = companyScope(user);
  // IMMEDIATE takes the write lock up front, so two pushes can't both read "batch unknown" and then race.
  const run = st.sqlite.transaction((): IngestOutcome => {
    const stored = st.findBatch.get(user.id, batch.batchId);
    if (stored) {
      const result: PushResult = JSON.parse(stored.result);
      return { result, replayed: true, accepted: 0 };
    }
    const ctx: BatchContext = {
      st,
      user,
      scope,
      batchId: batch.batchId,
      receivedAt: now.toISOString(),
      rides: new Map(),
      designs: new Map(),
      known: new Map(),
      design: designDataLookup(st.sqlite),
      acceptedReadings: acceptedReadingsLookup(st.sqlite),
      instrument: instrumentLookup(db),
      limits: checklistLimitLookup(st.sqlite),
    };
    const referred = new Set<string>();
    for (const raw of batch.records) {
      const id = idOf(raw);
      if (id) referred.add(id);
      if (typeof raw === 'object' && raw !== null && 'amendsId' in raw && typeof raw.amendsId === 'string')
        referred.add(raw.amendsId);
    }
    for (const { id, ...row } of st.findInspections.all(JSON.stringify([...referred])))
      ctx.known.set(id, row);
    const results = batch.records.map((raw) => ingestRecord(ctx, raw));
    // The review queue learns of the new inspections (and of originals an amendment supersedes) at once.
    const accepted = results.flatMap((r) => (r.status === 'accepted' && r.id ? [r.id] : []));
    refreshQueueInspections(db, queueDay(db, now), accepted);
    const result: PushResult = { batchId: batch.batchId, results };
    st.insertBatch.run(user.id, batch.batchId, ctx.receivedAt, batch.records.length, JSON.stringify(result));
    return { result, replayed: false, accepted: accepted.length };
  });
  return run.immediate();
}
