/**
 * POST /api/sync/push, the service: stores a phone's batch of inspection records and answers per record.
 * The whole batch and its answer are one transaction, so the batch's answer exists exactly when its
 * records do — a re-sent batch (same user, same batch id) gets that answer back and writes nothing. Every
 * record is checked, then the accepted ones are stored together; a record is stored whole or not at all,
 * and one the database refuses never costs the others (`ingestRecords`).
 *
 * The write path talks to better-sqlite3 with prepared statements made once per connection
 * (server/sync/ingest-store.ts): it is the server's hottest path (a phone back from a day without signal
 * sends everything at once), and building a drizzle query per row costs more than the insert itself (see
 * bench/ingest.ts).
 */
import { hash } from 'node:crypto';

import { z } from 'zod';

import { DAILY_CHECK_TYPE } from '@/features/daily-checks/schema';
import { canonicalJson } from '@/features/ledger';
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
import {
  type BulletinAnswerRecord,
  bulletinAnswerIssues,
  bulletinAnswerRecords,
  bulletinLookup,
  storeBulletinAnswers,
} from '@/server/bulletins/on-rides';
import { instrumentLookup, recordTruthIssues } from '@/server/instruments/record-checks';
import type { Db } from '@/server/db';
import { appendNewRecords, type NewRecordEntry } from '@/server/ledger/append';
import { nodeEd25519 } from '@/server/ledger/ed25519';
import { queueDay, refreshQueueInspections } from '@/server/queue/queue-refresh';
import { rideTimeZone } from '@/server/schedule-due';
import { checklistLimitIssues, checklistLimitLookup } from '@/server/sync/checklist-check';
import {
  type InspectionParams,
  type PhoneKey,
  type Statements,
  type StoredRecord,
  statementsFor,
} from '@/server/sync/ingest-store';
import { enteredIssues } from '@/server/sync/entered-check';
import {
  acceptedReadingsLookup,
  designDataLookup,
  plausibilityIssues,
} from '@/server/sync/plausibility-check';

type Signature = { keyId: string; signature: string };
/** A checked signature with what it covers: the record's RFC 8785 form and its SHA-256 (its chain entry's). */
type SignedRecord = Signature & { record: string; recordHash: string };
type PushBatch = { batchId: string; records: unknown[]; signatures?: Record<string, Signature> };
type RecordResult = PushResult['results'][number];
type Issue = { path: string; message: string };

/** Better-sqlite3 reports constraint failures with codes like SQLITE_CONSTRAINT_PRIMARYKEY. */
const isConstraintError = (err: unknown): boolean =>
  typeof err === 'object' &&
  err !== null &&
  'code' in err &&
  typeof err.code === 'string' &&
  err.code.startsWith('SQLITE_CONSTRAINT');

type ExistingRow = { contentSha256: string; rideId: string; inspectorId: string };
type RideRow = { id: string; operatorCompanyId: string; currentDesignId: string | null };

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

/**
 * An operator's staff send daily pre-opening checks and nothing else (their rides only: the ride's scope
 * check below); anyone may send a daily check. Test runs belong to a daily check, which is never
 * corrected by an amendment: a new check is recorded instead.
 */
function dailyCheckIssues(user: SessionUser, record: InspectionRecord): Issue[] {
  const daily = record.type === DAILY_CHECK_TYPE;
  if (user.role === 'operator' && !daily)
    return [{ path: 'type', message: "An operator's phone sends daily pre-opening checks only" }];
  if (!daily && record.testRuns?.length)
    return [{ path: 'testRuns', message: 'Only a daily pre-opening check records test runs' }];
  if (daily && record.amendsId)
    return [{ path: 'amendsId', message: 'A daily check is not amended; record a new daily check instead' }];
  return [];
}

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
  /** Accepted records waiting to be stored together; null while each is stored as it is accepted. */
  pending: StoredRecord[] | null;
  /** Design data by version id, for the plausibility of motion readings. */
  design: (designVersionId: string) => DesignData | null;
  /** The readings of an accepted inspection, for what an amendment carries over. */
  acceptedReadings: (inspectionId: string) => readonly Reading[];
  /** Register entries by id, for the calibration check. */
  instrument: ReturnType<typeof instrumentLookup>;
  /** Template and design versions by id, for the checklist limits. */
  limits: ReturnType<typeof checklistLimitLookup>;
  /** The batch's signatures by record id, and the sender's phone keys by key id (read once per batch). */
  signatures: Readonly<Record<string, Signature>>;
  phoneKeys: Map<string, PhoneKey>;
  /** A key that signs each record the server is given (the demo seed's phone), instead of the batch's. */
  signWith: SigningKey | null;
  /** Each accepted record's chain entry to be: its ride, kind, form, hash and the phone's signature. */
  signed: Map<string, NewRecordEntry>;
  /** Makers' bulletins and rides, for the checklist's bulletin items (read once per batch). */
  bulletins: ReturnType<typeof bulletinLookup>;
  /** The zone each ride's days are counted in, for the day a bulletin was found done. */
  zoneOf: (rideId: string) => string;
  /** What each accepted record's bulletin answers record on its ride (server/bulletins/on-rides.ts). */
  bulletinAnswers: Map<string, BulletinAnswerRecord[]>;
};

/** A phone key the server holds the private half of: only the demo seed's and the ingest bench's. */
export type SigningKey = { keyId: string; privateKey: string };

const signAgain = 'sign in again on the phone and send it again';

/**
 * The record's signature, checked: by a key registered to the sender, not withdrawn, over the record's
 * hash (features/ledger `recordHashOf` of the parsed record, as the phone signed it). The hash is the same
 * SHA-256 over the same RFC 8785 form, through Node's one-shot digest.
 */
function signatureOf(ctx: BatchContext, record: InspectionRecord): SignedRecord | Issue {
  const issue = (message: string): Issue => ({ path: 'signature', message });
  let canonical: string;
  let recordHash: string;
  try {
    canonical = canonicalJson(record);
    recordHash = hash('sha256', canonical, 'hex');
  } catch {
    // RFC 8785 has no form for a string with a lone UTF-16 surrogate, so nothing can sign it.
    return issue(
      'This inspection holds text that cannot be signed (a broken character); correct it on the phone',
    );
  }
  const given =
    ctx.signWith !== null
      ? { keyId: ctx.signWith.keyId, signature: nodeEd25519.sign(ctx.signWith.privateKey, recordHash) }
      : Object.hasOwn(ctx.signatures, record.id)
        ? ctx.signatures[record.id]
        : undefined;
  if (!given) return issue(`This inspection is not signed by this phone's key; ${signAgain}`);
  const key = ctx.phoneKeys.get(given.keyId);
  if (!key) {
    const owner = ctx.st.keyOwner.get(given.keyId);
    return issue(
      owner
        ? `This inspection is signed with another person's phone key; ${signAgain}`
        : `This inspection is signed with a phone key the server does not know; ${signAgain}`,
    );
  }
  if (key.revokedAt !== null)
    return issue(
      `The phone key this inspection is signed with was withdrawn (revoked) on ${key.revokedAt.slice(0, 10)}; ` +
        signAgain,
    );
  if (!nodeEd25519.verify(key.publicKey, recordHash, given.signature))
    return issue("The signature does not match this inspection's content");
  return { keyId: given.keyId, signature: given.signature, record: canonical, recordHash };
}

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

/**
 * The record schema compiled to one generated function (zod's `compile`): the same answers, four times
 * faster than the schema walking itself (checking the record was a third of a push's time). Anything
 * the fast path can't settle, every refusal included, falls back to the schema's own parser, so the
 * issues are the schema's (tests/server/ingest-batching.test.ts compares the two).
 */
export const compiledRecordSchema = z.compile(inspectionRecordSchema);

function ingestRecord(ctx: BatchContext, raw: unknown): RecordResult {
  const parsed = compiledRecordSchema.safeParse(raw);
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
  const notDaily = dailyCheckIssues(ctx.user, record);
  if (notDaily.length) return rejected(record.id, notDaily);

  // The schema's output has its keys in schema order whatever order the phone sent, so equal content
  // always serialises (and hashes) the same.
  const json = JSON.stringify(record);
  // The one-shot digest: the same SHA-256 as a Hash object's, without building one per record.
  const contentSha256 = hash('sha256', json, 'hex');

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
  const signature = signatureOf(ctx, record);
  if ('path' in signature) return rejected(record.id, [signature]);
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

  // A bulletin item must be one of the register's bulletins for this ride's maker and model.
  const strayBulletins = bulletinAnswerIssues(ctx.bulletins, ride.id, record.checklist);
  if (strayBulletins.length) return rejected(record.id, strayBulletins);

  const inspection: InspectionParams = [
    record.id,
    ride.id,
    ctx.user.id,
    record.type,
    record.startedAt,
    record.submittedAt,
    ctx.receivedAt,
    ctx.batchId,
    designVersionId,
    record.templateId,
    record.templateVersion,
    amendsId,
    json,
    contentSha256,
    // A daily check's failed test runs stop the ride like a failed item, so they count with them.
    record.checklist.reduce((n, a) => n + (a.result === 'fail' ? 1 : 0), 0) +
      (record.testRuns ?? []).reduce((n, t) => n + (t.result === 'fail' ? 1 : 0), 0),
  ];
  const row: StoredRecord = { inspection, record };
  if (ctx.pending) ctx.pending.push(row);
  else
    try {
      ctx.st.storeOne(row);
    } catch (err) {
      // A record the database itself refuses can never be stored, so it is answered like any invalid one;
      // anything else (disk, lock) fails the whole batch, which the phone then sends again unchanged.
      if (!isConstraintError(err)) throw err;
      return rejected(record.id, [
        { path: '', message: 'The server could not store this record as it is; it was not kept' },
      ]);
    }
  ctx.known.set(record.id, { contentSha256, rideId: ride.id, inspectorId: ctx.user.id });
  ctx.signed.set(record.id, {
    rideId: ride.id,
    kind: amendsId !== null ? 'amendment' : 'inspection',
    refId: record.id,
    record: signature.record,
    recordHash: signature.recordHash,
    device: { keyId: signature.keyId, signature: signature.signature },
  });
  ctx.bulletinAnswers.set(record.id, bulletinAnswerRecords(record, ctx.user.id, ctx.zoneOf));
  return { id: record.id, status: 'accepted' };
}

/** The inspections the batch names (its ids and amendsIds) that are stored already. */
function storedOf(st: Statements, records: readonly unknown[]): Map<string, ExistingRow> {
  const referred = new Set<string>();
  for (const raw of records) {
    const id = idOf(raw);
    if (id) referred.add(id);
    if (typeof raw === 'object' && raw !== null && 'amendsId' in raw && typeof raw.amendsId === 'string')
      referred.add(raw.amendsId);
  }
  const known = new Map<string, ExistingRow>();
  for (const { id, ...row } of st.findInspections.all(JSON.stringify([...referred]))) known.set(id, row);
  return known;
}

/**
 * Every record checked first, the accepted ones then stored together. Should the database refuse any of
 * those rows (which the checks leave all but impossible), none of them is kept and the batch is checked
 * again with each record stored in a savepoint of its own as it is accepted: then only the refused record
 * is rejected, and everything after it is judged by what really went in.
 */
function ingestRecords(ctx: BatchContext, records: readonly unknown[]): RecordResult[] {
  ctx.pending = [];
  const results = records.map((raw) => ingestRecord(ctx, raw));
  try {
    ctx.st.storeAll(ctx.pending);
    return results;
  } catch (err) {
    if (!isConstraintError(err)) throw err;
  } finally {
    ctx.pending = null;
  }
  ctx.known = storedOf(ctx.st, records);
  ctx.signed.clear();
  ctx.bulletinAnswers.clear();
  return records.map((raw) => ingestRecord(ctx, raw));
}

type IngestOutcome = { result: PushResult; replayed: boolean; accepted: number };

/**
 * Stores a batch (already checked against pushBatchSchema) for `user`. A batch id this user has sent
 * before gets its stored answer and changes nothing. `signWith` is for the server's own callers (the demo
 * seed): its key, registered to `user`, signs each record in place of the batch's signatures.
 */
export function ingestBatch(
  db: Db,
  user: SessionUser,
  batch: PushBatch,
  now: Date = new Date(),
  options: { signWith?: SigningKey } = {},
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
    const design = designDataLookup(st.sqlite);
    const ctx: BatchContext = {
      st,
      user,
      scope,
      batchId: batch.batchId,
      receivedAt: now.toISOString(),
      rides: new Map(),
      designs: new Map(),
      known: storedOf(st, batch.records),
      pending: null,
      design,
      acceptedReadings: acceptedReadingsLookup(st.sqlite),
      instrument: instrumentLookup(db),
      limits: checklistLimitLookup(st.sqlite, design),
      signatures: batch.signatures ?? {},
      phoneKeys: new Map(st.personKeys.all(user.id).map((k) => [k.keyId, k])),
      signWith: options.signWith ?? null,
      signed: new Map(),
      bulletins: bulletinLookup(db),
      zoneOf: (() => {
        const zones = new Map<string, string>();
        return (rideId: string) => {
          let zone = zones.get(rideId);
          if (zone === undefined) zones.set(rideId, (zone = rideTimeZone(db, rideId)));
          return zone;
        };
      })(),
      bulletinAnswers: new Map(),
    };
    const results = ingestRecords(ctx, batch.records);
    // The review queue learns of the new inspections (and of originals an amendment supersedes) at once.
    const accepted = results.flatMap((r) => (r.status === 'accepted' && r.id ? [r.id] : []));
    // Each accepted inspection or amendment joins its ride's record chain (a re-sent one is already there).
    // Each carries the phone's signature, which the entry's record hash lets anyone check later.
    appendNewRecords(
      db,
      accepted.flatMap((id) => ctx.signed.get(id) ?? []),
      now,
    );
    // An inspection's passed bulletin items record the bulletins done on the ride; failed ones not done.
    storeBulletinAnswers(
      db,
      accepted.flatMap((id) => ctx.bulletinAnswers.get(id) ?? []),
      now,
    );
    refreshQueueInspections(db, queueDay(db, now), accepted);
    const result: PushResult = { batchId: batch.batchId, results };
    st.insertBatch.run(user.id, batch.batchId, ctx.receivedAt, batch.records.length, JSON.stringify(result));
    return { result, replayed: false, accepted: accepted.length };
  });
  return run.immediate();
}
