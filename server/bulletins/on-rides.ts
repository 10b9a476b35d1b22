/**
 * Bulletins on each ride: which apply, whether each is done (and who recorded it, when, how), what the
 * phone needs to put the open ones in an inspection's checklist, and the records an inspection's bulletin
 * answers leave. A bulletin is done on a ride once anything records it done; until then each inspection
 * that found it not done is kept, so the supervisor sees it.
 */
import { asc, eq, gte, inArray } from 'drizzle-orm';

import { bulletinActions } from '@/db/server/bulletins';
import { users } from '@/db/server/schema';
import {
  type BulletinAction,
  type BulletinDoneInput,
  type OpenBulletin,
  type RideBulletin,
  bulletinApplies,
  bulletinIdOfItem,
  bulletinStateOn,
} from '@/features/bulletins/schema';
import type { ChecklistAnswer } from '@/features/records/schema';
import { dayInZone } from '@/lib/dates';
import {
  type BulletinRow,
  type RideRow,
  donePairs,
  pairKey,
  readBulletins,
  readRides,
} from '@/server/bulletins/bulletins';
import type { Db } from '@/server/db';
import { HttpError, notFound } from '@/server/http/errors';
import { recordAudit } from '@/server/registry/audit';
import { rideTimeZone } from '@/server/schedule-due';

type Reader = Pick<Db, 'select'>;

type ActionRow = BulletinAction & { bulletinId: string; rideId: string };

function actionsOf(db: Reader, rideIds: readonly string[]): ActionRow[] {
  if (!rideIds.length) return [];
  return db
    .select({
      bulletinId: bulletinActions.bulletinId,
      rideId: bulletinActions.rideId,
      outcome: bulletinActions.outcome,
      on: bulletinActions.on,
      byName: users.name,
      note: bulletinActions.note,
      inspectionId: bulletinActions.inspectionId,
      recordedAt: bulletinActions.recordedAt,
    })
    .from(bulletinActions)
    .innerJoin(users, eq(users.id, bulletinActions.byUserId))
    .where(inArray(bulletinActions.rideId, [...rideIds]))
    .orderBy(asc(bulletinActions.recordedAt))
    .all();
}

/** Each (bulletin, ride) pair of `list` with its state on the ride's own clock. */
function pairsOf(
  db: Reader,
  list: BulletinRow[],
  rideList: RideRow[],
  now: Date,
  keep: (b: BulletinRow, r: RideRow) => boolean = () => true,
): RideBulletin[] {
  const actions = actionsOf(
    db,
    rideList.map((r) => r.id),
  );
  const today = new Map<string, string>();
  const todayOf = (rideId: string) => {
    let day = today.get(rideId);
    if (!day) {
      day = dayInZone(now, rideTimeZone(db, rideId));
      today.set(rideId, day);
    }
    return day;
  };
  const out: RideBulletin[] = [];
  for (const r of rideList)
    for (const b of list) {
      if (!bulletinApplies(b, r) || !keep(b, r)) continue;
      const mine = actions.filter((a) => a.bulletinId === b.id && a.rideId === r.id);
      const done = mine.find((a) => a.outcome === 'done') ?? null;
      const notDone = done ? null : (mine.filter((a) => a.outcome === 'not_done').at(-1) ?? null);
      const strip = (a: ActionRow | null): BulletinAction | null =>
        a && {
          outcome: a.outcome,
          on: a.on,
          byName: a.byName,
          note: a.note,
          inspectionId: a.inspectionId,
          recordedAt: a.recordedAt,
        };
      out.push({
        bulletin: b,
        rideId: r.id,
        rideName: r.name,
        siteName: r.siteName,
        state: bulletinStateOn(b, done !== null, todayOf(r.id)),
        done: strip(done),
        lastNotDone: strip(notDone),
      });
    }
  return out;
}

const stateOrder = { overdue: 0, open: 1, done: 2 } as const;

/** The bulletins applying to a ride, the overdue first, then open, then done. */
export function rideBulletins(db: Reader, rideId: string, scope: string | null, now: Date): RideBulletin[] {
  const ride = readRides(db, scope, [rideId]);
  if (!ride.length) throw notFound('No such ride.');
  return pairsOf(db, readBulletins(db), ride, now).sort((a, b) => stateOrder[a.state] - stateOrder[b.state]);
}

/** A bulletin's rides (those `scope` may see), with where it stands on each. */
export function bulletinRides(db: Reader, bulletin: BulletinRow, scope: string | null, now: Date) {
  return pairsOf(db, [bulletin], readRides(db, scope), now);
}

/** The open bulletins of each ride, for the phone's copy of the ride (the sync pull). */
export function openBulletinsOf(db: Reader, rideIds: readonly string[]): Map<string, OpenBulletin[]> {
  const out = new Map<string, OpenBulletin[]>();
  if (!rideIds.length) return out;
  const done = donePairs(db);
  const list = readBulletins(db);
  for (const r of readRides(db, null, rideIds))
    out.set(
      r.id,
      list
        .filter((b) => bulletinApplies(b, r) && !done.has(pairKey(b.id, r.id)))
        .map((b) => ({
          id: b.id,
          reference: b.reference,
          title: b.title,
          requiredAction: b.requiredAction,
          severity: b.severity,
          deadlineOn: b.deadlineOn,
          beforeNextOperation: b.beforeNextOperation,
        })),
    );
  return out;
}

/** Rides whose bulletin records changed since `since` (the pull sends those rides again). */
export function ridesWithActionsSince(db: Reader, since: string): string[] {
  const rows = db
    .select({ rideId: bulletinActions.rideId })
    .from(bulletinActions)
    .where(gte(bulletinActions.recordedAt, since))
    .all();
  return [...new Set(rows.map((r) => r.rideId))];
}

/** A supervisor records a bulletin done on a ride, with what they saw; audited under the ride. */
export function recordBulletinDone(
  db: Db,
  userId: string,
  rideId: string,
  bulletinId: string,
  input: BulletinDoneInput,
  now: Date,
): RideBulletin {
  return db.transaction((tx) => {
    const ride = readRides(tx, null, [rideId])[0];
    if (!ride) throw notFound('No such ride.');
    const bulletin = readBulletins(tx, [bulletinId])[0];
    if (!bulletin) throw notFound('No such bulletin.');
    if (!bulletinApplies(bulletin, ride))
      throw new HttpError(
        409,
        'not_applicable',
        `Bulletin ${bulletin.reference} is for ${bulletin.maker} ${bulletin.models.join(', ')}, not ${ride.name}.`,
      );
    const today = dayInZone(now, rideTimeZone(tx, rideId));
    if (input.on > today)
      throw new HttpError(400, 'validation_failed', 'Some fields are missing or invalid.', [
        { path: 'on', message: 'Later than today at the ride' },
      ]);
    const { id } = tx
      .insert(bulletinActions)
      .values({
        bulletinId,
        rideId,
        outcome: 'done',
        on: input.on,
        byUserId: userId,
        note: input.note,
        inspectionId: null,
        recordedAt: now.toISOString(),
      })
      .returning({ id: bulletinActions.id })
      .get();
    recordAudit(tx, {
      userId,
      entity: 'bulletin_action',
      entityId: id,
      action: 'create',
      rideId,
      summary: `Bulletin ${bulletin.reference} recorded done on ${ride.name}`,
      after: { bulletinId, rideId, outcome: 'done', ...input },
    });
    const pair = pairsOf(tx, [bulletin], [ride], now)[0];
    return pair;
  });
}

// ——— an inspection's bulletin answers (server/sync/ingest.ts) ———

type Issue = { path: string; message: string };

/**
 * What a push checks a batch's bulletin answers against, read once per batch: every bulletin and the
 * rides' makers and models.
 */
export function bulletinLookup(db: Reader) {
  let list: BulletinRow[] | null = null;
  const rideRows = new Map<string, RideRow | null>();
  return {
    bulletin: (id: string) => (list ??= readBulletins(db)).find((b) => b.id === id) ?? null,
    ride: (id: string) => {
      let r = rideRows.get(id);
      if (r === undefined) {
        r = readRides(db, null, [id])[0] ?? null;
        rideRows.set(id, r);
      }
      return r;
    },
  };
}
export type BulletinLookup = ReturnType<typeof bulletinLookup>;

/** Issues for each bulletin answer that names no bulletin, or one for another maker or model. */
export function bulletinAnswerIssues(
  lookup: BulletinLookup,
  rideId: string,
  checklist: readonly ChecklistAnswer[],
): Issue[] {
  const issues: Issue[] = [];
  checklist.forEach((a, i) => {
    const id = bulletinIdOfItem(a.itemId);
    if (id === null) return;
    const b = lookup.bulletin(id);
    if (!b)
      issues.push({
        path: `checklist.${i}.itemId`,
        message: 'No maker bulletin in the register has this id',
      });
    else if (!bulletinApplies(b, lookup.ride(rideId) ?? { maker: null, model: null }))
      issues.push({
        path: `checklist.${i}.itemId`,
        message: `Bulletin ${b.reference} is for ${b.maker} ${b.models.join(', ')}, not this ride`,
      });
  });
  return issues;
}

/** The bulletin records an accepted inspection leaves: a passed item done, a failed one not done. */
export type BulletinAnswerRecord = {
  bulletinId: string;
  rideId: string;
  outcome: 'done' | 'not_done';
  on: string;
  byUserId: string;
  note: string | null;
  inspectionId: string;
};

export function bulletinAnswerRecords(
  record: { id: string; rideId: string; submittedAt: string; checklist: readonly ChecklistAnswer[] },
  byUserId: string,
  zoneOf: (rideId: string) => string,
): BulletinAnswerRecord[] {
  return record.checklist.flatMap((a) => {
    const bulletinId = bulletinIdOfItem(a.itemId);
    if (bulletinId === null || a.result === null || a.result === 'na') return [];
    return [
      {
        bulletinId,
        rideId: record.rideId,
        outcome: a.result === 'pass' ? ('done' as const) : ('not_done' as const),
        on: dayInZone(record.submittedAt, zoneOf(record.rideId)),
        byUserId,
        note: a.note?.trim() || null,
        inspectionId: record.id,
      },
    ];
  });
}

/** Stores an accepted batch's bulletin records (inside the push's transaction, after its inspections). */
export function storeBulletinAnswers(
  tx: Pick<Db, 'insert'>,
  rows: readonly BulletinAnswerRecord[],
  now: Date,
) {
  if (!rows.length) return;
  tx.insert(bulletinActions)
    .values(rows.map((r) => ({ ...r, recordedAt: now.toISOString() })))
    .run();
}
