import { and, desc, eq, max, ne } from 'drizzle-orm';
import { alias } from 'drizzle-orm/sqlite-core';

import { designVersions, users } from '@/db/server/schema';
import type { SessionUser } from '@/features/session/schema';
import type { DesignData } from '@/features/loads/design-schema';
import { diffDesign, loosensALimit } from '@/features/registry/design-diff';
import type {
  DesignDecisionBody,
  DesignOrigin,
  DesignVersion,
  DesignVersionInfo,
} from '@/features/registry/schema';
import type { Db } from '@/server/db';
import { HttpError, conflict, notFound } from '@/server/http/errors';
import { recordAudit } from '@/server/registry/audit';
import { carryDesignDocuments } from '@/server/registry/design-documents';
import { mustFindRide } from '@/server/registry/rides';

const decider = alias(users, 'decider');

const infoColumns = {
  id: designVersions.id,
  version: designVersions.version,
  createdAt: designVersions.createdAt,
  createdByName: users.name,
  createdById: designVersions.createdBy,
  reason: designVersions.reason,
  origin: designVersions.origin,
  approvalState: designVersions.approvalState,
  basedOnVersion: designVersions.basedOnVersion,
  decidedAt: designVersions.decidedAt,
  decidedByName: decider.name,
  decisionReason: designVersions.decisionReason,
};

function selectVersions(db: Pick<Db, 'select'>) {
  return db
    .select({ ...infoColumns, data: designVersions.data })
    .from(designVersions)
    .innerJoin(users, eq(users.id, designVersions.createdBy))
    .leftJoin(decider, eq(decider.id, designVersions.decidedBy));
}

type VersionRow = DesignVersion & { createdById: string };

/**
 * A ride's design data at one version (in any approval state), or — when `version` is omitted — the
 * version in force: the highest approved one. Analyses, phones and the ride page use only that one; a
 * revision waiting for a second person never counts.
 */
export function findDesignVersion(
  db: Pick<Db, 'select'>,
  rideId: string,
  version?: number,
): DesignVersion | null {
  const row = findRow(db, rideId, version);
  return row;
}

function findRow(db: Pick<Db, 'select'>, rideId: string, version?: number): VersionRow | null {
  return (
    selectVersions(db)
      .where(
        version === undefined
          ? and(eq(designVersions.rideId, rideId), eq(designVersions.approvalState, 'in_force'))
          : and(eq(designVersions.rideId, rideId), eq(designVersions.version, version)),
      )
      .orderBy(desc(designVersions.version))
      .limit(1)
      .get() ?? null
  );
}

/** The revision waiting for a second person, if any (a ride has at most one). */
export function findPendingDesignVersion(db: Pick<Db, 'select'>, rideId: string): DesignVersion | null {
  const row = selectVersions(db)
    .where(and(eq(designVersions.rideId, rideId), eq(designVersions.approvalState, 'pending')))
    .orderBy(desc(designVersions.version))
    .limit(1)
    .get();
  return row ?? null;
}

export function mustFindDesignVersion(
  db: Pick<Db, 'select'>,
  rideId: string,
  version?: number,
): DesignVersion {
  const found = findDesignVersion(db, rideId, version);
  if (!found)
    throw notFound(
      version === undefined ? 'This ride has no design data yet.' : `No design data version ${version}.`,
    );
  return found;
}

/**
 * Every version of a ride's design data, newest first, without the data itself. A pending revision is
 * listed only for those who may approve it (`withPending`).
 */
export function listDesignVersions(
  db: Pick<Db, 'select'>,
  rideId: string,
  { withPending = true }: { withPending?: boolean } = {},
): DesignVersionInfo[] {
  return db
    .select(infoColumns)
    .from(designVersions)
    .innerJoin(users, eq(users.id, designVersions.createdBy))
    .leftJoin(decider, eq(decider.id, designVersions.decidedBy))
    .where(
      withPending
        ? eq(designVersions.rideId, rideId)
        : and(eq(designVersions.rideId, rideId), ne(designVersions.approvalState, 'pending')),
    )
    .orderBy(desc(designVersions.version))
    .all();
}

/** JSON with object keys sorted, so two equal objects compare equal whatever order their keys came in. */
function canonical(value: unknown): string {
  return JSON.stringify(value, (_key, v: unknown) =>
    v !== null && typeof v === 'object' && !Array.isArray(v)
      ? Object.fromEntries(Object.entries(v).sort(([a], [b]) => a.localeCompare(b)))
      : v,
  );
}

type NewDesignVersion = {
  reason: string;
  data: DesignData;
  origin: DesignOrigin;
  /** The version the change was made from; a different current version means someone else saved first. */
  basedOnVersion?: number;
};

/**
 * Stores `data` (already validated) as the ride's next version, with its audit entry, in one transaction.
 * A version that loosens any limit of the version in force (features/registry/design-diff.ts) is stored
 * as `pending`: the version in force stays in force until a second person approves it. Anything else is
 * in force at once. Refuses a stale `basedOnVersion` (409 `version_conflict`), data identical to the
 * version in force (409 `design_unchanged`) and any new version while one waits for approval (409
 * `design_pending`), so a pending revision is always compared with the version it would replace.
 */
export function createDesignVersion(
  db: Db,
  userId: string,
  rideId: string,
  input: NewDesignVersion,
): DesignVersion {
  return db.transaction((tx) => {
    const ride = mustFindRide(tx, rideId);
    const current = findDesignVersion(tx, rideId);
    const currentVersion = current?.version ?? 0;
    const pending = findPendingDesignVersion(tx, rideId);
    if (pending)
      throw conflict(
        `Version ${pending.version} waits for a second person's approval. Nothing was saved; it must be ` +
          'approved or rejected before another version is made.',
        'design_pending',
      );
    if (input.basedOnVersion !== undefined && input.basedOnVersion !== currentVersion)
      throw conflict(
        `The design data changed while you were editing: version ${currentVersion} is now current, your change ` +
          `was made from version ${input.basedOnVersion}. Nothing was saved; reload and apply your change again.`,
        'version_conflict',
      );
    if (current && canonical(current.data) === canonical(input.data))
      throw conflict(
        `This is the same as version ${current.version}; nothing was saved.`,
        'design_unchanged',
      );
    const next =
      (tx
        .select({ v: max(designVersions.version) })
        .from(designVersions)
        .where(eq(designVersions.rideId, rideId))
        .get()?.v ?? 0) + 1;
    const loosens = loosensALimit(current?.data ?? null, input.data);
    const { id } = tx
      .insert(designVersions)
      .values({
        rideId,
        version: next,
        data: input.data,
        reason: input.reason,
        origin: input.origin,
        createdBy: userId,
        approvalState: loosens ? 'pending' : 'in_force',
        basedOnVersion: current?.version ?? null,
      })
      .returning({ id: designVersions.id })
      .get();
    // The new version starts with the documents of the version it was made from (a manual stays with the ride).
    if (current) carryDesignDocuments(tx, current, { id, version: next }, new Date());
    const created = mustFindDesignVersion(tx, rideId, next);
    const loosened = loosens
      ? diffDesign(current?.data ?? null, input.data).filter((c) => c.effect === 'loosened').length
      : 0;
    recordAudit(tx, {
      userId,
      entity: 'design',
      entityId: id,
      action: 'create',
      rideId,
      summary: loosens
        ? `${ride.name}: design data version ${next} proposed — loosens ${loosened} limit${loosened === 1 ? '' : 's'}, ` +
          `waits for a second person; version ${currentVersion} stays in force — ${input.reason}`
        : `${ride.name}: design data version ${next} — ${input.reason}`,
      before: current ? { version: current.version, data: current.data } : null,
      after: {
        version: next,
        reason: input.reason,
        origin: input.origin,
        approvalState: loosens ? 'pending' : 'in_force',
        data: input.data,
      },
    });
    return created;
  });
}

/**
 * A second person's decision on a pending revision. Only an admin or supervisor other than its proposer
 * may decide (403 `own_revision` for the proposer); only a pending revision can be decided (409
 * `design_not_pending`). Approving puts it in force in place of the version it was compared with;
 * rejecting leaves the version in force as it is. Either way the decision, who made it, when and why are
 * kept on the version and in the audit log.
 */
export function decideDesignVersion(
  db: Db,
  user: Pick<SessionUser, 'id'>,
  rideId: string,
  version: number,
  input: DesignDecisionBody,
): DesignVersion {
  return db.transaction((tx) => {
    const ride = mustFindRide(tx, rideId);
    const target = findRow(tx, rideId, version);
    if (!target) throw notFound(`No design data version ${version}.`);
    if (target.approvalState !== 'pending')
      throw conflict(
        `Version ${version} is ${target.approvalState === 'rejected' ? 'rejected' : 'in force'} already; nothing was changed.`,
        'design_not_pending',
      );
    if (target.createdById === user.id)
      throw new HttpError(
        403,
        'own_revision',
        'You proposed this version: another supervisor or admin must approve or reject it.',
      );
    const current = findDesignVersion(tx, rideId);
    const approve = input.decision === 'approve';
    if (approve && (current?.version ?? null) !== (target.basedOnVersion ?? null))
      throw conflict(
        `Version ${version} was compared with version ${target.basedOnVersion ?? 'none'}, but version ` +
          `${current?.version ?? 'none'} is in force now; reject it and import it again.`,
        'version_conflict',
      );
    const decidedAt = new Date().toISOString();
    tx.update(designVersions)
      .set({
        approvalState: approve ? 'in_force' : 'rejected',
        decidedBy: user.id,
        decidedAt,
        decisionReason: input.reason,
      })
      .where(eq(designVersions.id, target.id))
      .run();
    // Documents attached to the version it replaces while it waited follow it into force.
    if (approve && current) carryDesignDocuments(tx, current, target, new Date(decidedAt), target.createdAt);
    recordAudit(tx, {
      userId: user.id,
      entity: 'design',
      entityId: target.id,
      action: 'update',
      rideId,
      summary: approve
        ? `${ride.name}: design data version ${version} approved, now in force (proposed by ` +
          `${target.createdByName}) — ${input.reason}`
        : `${ride.name}: design data version ${version} rejected (proposed by ${target.createdByName}); ` +
          `version ${current?.version ?? 'none'} stays in force — ${input.reason}`,
      // An approval records the data it replaces and puts in force, so the log reads the change in words.
      before: approve
        ? { version: current?.version ?? null, approvalState: 'pending', data: current?.data }
        : { version, approvalState: 'pending' },
      after: approve
        ? { version, approvalState: 'in_force', decisionReason: input.reason, data: target.data }
        : { version, approvalState: 'rejected', decisionReason: input.reason },
    });
    return mustFindDesignVersion(tx, rideId, version);
  });
}
