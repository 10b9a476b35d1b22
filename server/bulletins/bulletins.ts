/**
 * The register of makers' bulletins: read, add, change, remove (each change audited), and which rides
 * each applies to. Rides are matched in TypeScript with the contract's `bulletinApplies` (case and spaces
 * ignored, Unicode lower case), the same rule as everywhere else; a register holds tens or hundreds of
 * bulletins and rides, so reading them whole per request is cheap and keeps one rule.
 */
import { and, asc, eq, inArray } from 'drizzle-orm';

import { bulletinActions, bulletinModels, bulletins } from '@/db/server/bulletins';
import { rides, sites } from '@/db/server/schema';
import {
  type Bulletin,
  type BulletinInput,
  type BulletinPatch,
  bulletinApplies,
  bulletinInputSchema,
  bulletinListQuerySchema,
  matchKey,
} from '@/features/bulletins/schema';
import type { Db } from '@/server/db';
import { missingDocument } from '@/server/documents/store';
import { conflict, HttpError, notFound } from '@/server/http/errors';
import { recordAudit } from '@/server/registry/audit';
import type { z } from 'zod';

type Reader = Pick<Db, 'select'>;
type ListQuery = z.output<typeof bulletinListQuerySchema>;
export type BulletinRow = Omit<Bulletin, 'rideCount' | 'doneCount'>;
export type RideRow = {
  id: string;
  name: string;
  maker: string | null;
  model: string | null;
  siteName: string | null;
  operatorCompanyId: string;
};

const invalid = (path: string, message: string) =>
  new HttpError(400, 'validation_failed', 'Some fields are missing or invalid.', [{ path, message }]);

/** Every bulletin with its models, newest issue first (or only `ids`). */
export function readBulletins(db: Reader, ids?: readonly string[]): BulletinRow[] {
  const rows = db
    .select()
    .from(bulletins)
    .where(ids ? inArray(bulletins.id, [...ids]) : undefined)
    .all();
  const models = new Map<string, string[]>();
  for (const m of db
    .select({ bulletinId: bulletinModels.bulletinId, model: bulletinModels.model })
    .from(bulletinModels)
    .orderBy(asc(bulletinModels.bulletinId), asc(bulletinModels.position))
    .all())
    models.set(m.bulletinId, [...(models.get(m.bulletinId) ?? []), m.model]);
  return rows
    .map((b) => ({
      id: b.id,
      maker: b.maker,
      models: models.get(b.id) ?? [],
      reference: b.reference,
      title: b.title,
      issuedOn: b.issuedOn,
      severity: b.severity,
      requiredAction: b.requiredAction,
      deadlineOn: b.deadlineOn,
      beforeNextOperation: b.beforeNextOperation,
      documentSha256: b.documentSha256,
      notes: b.notes,
      createdAt: b.createdAt,
      updatedAt: b.updatedAt,
    }))
    .sort((a, b) => b.issuedOn.localeCompare(a.issuedOn) || a.reference.localeCompare(b.reference));
}

/** The rides a reader may see (`scope`: an operator's company), with what bulletins are matched by. */
export function readRides(db: Reader, scope: string | null, ids?: readonly string[]): RideRow[] {
  return db
    .select({
      id: rides.id,
      name: rides.name,
      maker: rides.maker,
      model: rides.model,
      siteName: sites.name,
      operatorCompanyId: rides.operatorCompanyId,
    })
    .from(rides)
    .leftJoin(sites, eq(sites.id, rides.siteId))
    .where(
      and(
        scope === null ? undefined : eq(rides.operatorCompanyId, scope),
        ids ? inArray(rides.id, [...ids]) : undefined,
      ),
    )
    .orderBy(asc(rides.name))
    .all();
}

/** The (bulletin, ride) pairs with a record of it done. */
export function donePairs(db: Reader): Set<string> {
  return new Set(
    db
      .select({ bulletinId: bulletinActions.bulletinId, rideId: bulletinActions.rideId })
      .from(bulletinActions)
      .where(eq(bulletinActions.outcome, 'done'))
      .all()
      .map((p) => pairKey(p.bulletinId, p.rideId)),
  );
}

export const pairKey = (bulletinId: string, rideId: string) => `${bulletinId}|${rideId}`;

const withCounts = (b: BulletinRow, visible: RideRow[], done: Set<string>): Bulletin => {
  const applying = visible.filter((r) => bulletinApplies(b, r));
  return {
    ...b,
    rideCount: applying.length,
    doneCount: applying.filter((r) => done.has(pairKey(b.id, r.id))).length,
  };
};

const searchable = (b: BulletinRow) =>
  [b.maker, ...b.models, b.reference, b.title, b.requiredAction].join(' ').toLowerCase();

/**
 * A page of the register. Staff see every bulletin; an operator only those applying to one of their
 * company's rides, with the counts of their rides alone.
 */
export function listBulletins(db: Reader, query: ListQuery, scope: string | null) {
  const visible = readRides(db, scope);
  const done = donePairs(db);
  const term = query.q?.toLowerCase();
  const all = readBulletins(db)
    .filter((b) => !term || searchable(b).includes(term))
    .filter((b) => !query.severity?.length || query.severity.includes(b.severity))
    .map((b) => withCounts(b, visible, done))
    .filter((b) => scope === null || b.rideCount > 0);
  const start = (query.page - 1) * query.pageSize;
  return {
    bulletins: all.slice(start, start + query.pageSize),
    total: all.length,
    page: query.page,
    pageSize: query.pageSize,
  };
}

/** One bulletin as `scope` may see it: null when there is none, or it applies to none of their rides. */
export function findBulletin(db: Reader, id: string, scope: string | null): Bulletin | null {
  const b = readBulletins(db, [id])[0];
  if (!b) return null;
  const found = withCounts(b, readRides(db, scope), donePairs(db));
  return scope !== null && found.rideCount === 0 ? null : found;
}

function mustFind(db: Reader, id: string): Bulletin {
  const b = findBulletin(db, id, null);
  if (!b) throw notFound('No such bulletin.');
  return b;
}

/** The checks beyond the schema's: the PDF is stored, and the maker has not used the reference already. */
function assertStorable(db: Reader, input: BulletinInput, exceptId: string | null): void {
  if (input.documentSha256 && missingDocument(db, [input.documentSha256]))
    throw invalid('documentSha256', 'No stored document has this SHA-256; upload the PDF first');
  const same = db
    .select({ id: bulletins.id })
    .from(bulletins)
    .where(and(eq(bulletins.makerKey, matchKey(input.maker)), eq(bulletins.reference, input.reference)))
    .get();
  if (same && same.id !== exceptId)
    throw invalid('reference', `${input.maker} already has a bulletin ${input.reference} in the register`);
}

type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];

function writeModels(tx: Tx, bulletinId: string, models: readonly string[]): void {
  tx.delete(bulletinModels).where(eq(bulletinModels.bulletinId, bulletinId)).run();
  tx.insert(bulletinModels)
    .values(models.map((model, position) => ({ bulletinId, position, model, modelKey: matchKey(model) })))
    .run();
}

const columnsOf = (input: BulletinInput) => ({
  maker: input.maker,
  makerKey: matchKey(input.maker),
  reference: input.reference,
  title: input.title,
  issuedOn: input.issuedOn,
  severity: input.severity,
  requiredAction: input.requiredAction,
  deadlineOn: input.deadlineOn ?? null,
  beforeNextOperation: input.beforeNextOperation ?? false,
  documentSha256: input.documentSha256 ?? null,
  notes: input.notes ?? null,
});

export function createBulletin(db: Db, userId: string, input: BulletinInput, now: Date): Bulletin {
  return db.transaction((tx) => {
    assertStorable(tx, input, null);
    const at = now.toISOString();
    const { id } = tx
      .insert(bulletins)
      .values({ ...columnsOf(input), createdAt: at, createdBy: userId, updatedAt: at })
      .returning({ id: bulletins.id })
      .get();
    writeModels(tx, id, input.models);
    const after = mustFind(tx, id);
    recordAudit(tx, {
      userId,
      entity: 'bulletin',
      entityId: id,
      action: 'create',
      summary: `Bulletin ${after.reference} (${after.maker}) added`,
      after,
    });
    return after;
  });
}

/** Applies a patch; the whole bulletin as it would become is checked by the create schema's rules. */
export function updateBulletin(
  db: Db,
  userId: string,
  id: string,
  patch: BulletinPatch,
  now: Date,
): Bulletin {
  return db.transaction((tx) => {
    const before = mustFind(tx, id);
    const merged = bulletinInputSchema.safeParse({ ...before, ...patch });
    if (!merged.success) {
      const issue = merged.error.issues[0];
      throw invalid(issue.path.join('.'), issue.message);
    }
    const input = merged.data;
    assertStorable(tx, input, id);
    tx.update(bulletins)
      .set({ ...columnsOf(input), updatedAt: now.toISOString() })
      .where(eq(bulletins.id, id))
      .run();
    if (patch.models) writeModels(tx, id, input.models);
    const after = mustFind(tx, id);
    recordAudit(tx, {
      userId,
      entity: 'bulletin',
      entityId: id,
      action: 'update',
      summary: `Bulletin ${after.reference} (${after.maker}) changed`,
      before,
      after,
    });
    return after;
  });
}

/** A bulletin with anything recorded against it stays: those records are part of the rides' history. */
export function deleteBulletin(db: Db, userId: string, id: string): void {
  db.transaction((tx) => {
    const before = mustFind(tx, id);
    const recorded = tx
      .select({ id: bulletinActions.id })
      .from(bulletinActions)
      .where(eq(bulletinActions.bulletinId, id))
      .get();
    if (recorded)
      throw conflict(
        `Bulletin ${before.reference} has been recorded done or not done on a ride; it stays in the register.`,
        'in_use',
      );
    tx.delete(bulletins).where(eq(bulletins.id, id)).run();
    recordAudit(tx, {
      userId,
      entity: 'bulletin',
      entityId: id,
      action: 'delete',
      summary: `Bulletin ${before.reference} (${before.maker}) removed`,
      before,
    });
  });
}

/** A ride with bulletin records keeps them: it cannot be removed from the register (rides' delete guard). */
export function hasBulletinRecords(db: Reader, rideId: string): string | null {
  const row = db
    .select({ id: bulletinActions.id })
    .from(bulletinActions)
    .where(eq(bulletinActions.rideId, rideId))
    .get();
  return row ? 'records of makers’ bulletins' : null;
}
