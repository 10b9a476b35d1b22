import { and, desc, eq, max } from 'drizzle-orm';

import { designVersions, users } from '@/db/server/schema';
import type { DesignData } from '@/features/registry/design-data';
import type { DesignOrigin, DesignVersion, DesignVersionInfo } from '@/features/registry/schema';
import type { Db } from '@/server/db';
import { conflict, notFound } from '@/server/http/errors';
import { recordAudit } from '@/server/registry/audit';
import { mustFindRide } from '@/server/registry/rides';

const infoColumns = {
  id: designVersions.id,
  version: designVersions.version,
  createdAt: designVersions.createdAt,
  createdByName: users.name,
  reason: designVersions.reason,
  origin: designVersions.origin,
};

/** A ride's design data at one version, or its current (highest) version when `version` is omitted. */
export function findDesignVersion(
  db: Pick<Db, 'select'>,
  rideId: string,
  version?: number,
): DesignVersion | null {
  const row = db
    .select({ ...infoColumns, data: designVersions.data })
    .from(designVersions)
    .innerJoin(users, eq(users.id, designVersions.createdBy))
    .where(
      version === undefined
        ? eq(designVersions.rideId, rideId)
        : and(eq(designVersions.rideId, rideId), eq(designVersions.version, version)),
    )
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

/** Every version of a ride's design data, newest first, without the data itself. */
export function listDesignVersions(db: Pick<Db, 'select'>, rideId: string): DesignVersionInfo[] {
  return db
    .select(infoColumns)
    .from(designVersions)
    .innerJoin(users, eq(users.id, designVersions.createdBy))
    .where(eq(designVersions.rideId, rideId))
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

export type NewDesignVersion = {
  reason: string;
  data: DesignData;
  origin: DesignOrigin;
  /** The version the change was made from; a different current version means someone else saved first. */
  basedOnVersion?: number;
};

/**
 * Stores `data` (already validated) as the ride's next version, with its audit entry, in one transaction.
 * Refuses a stale `basedOnVersion` (409 `version_conflict`) and data identical to the current version
 * (409 `design_unchanged`), so the version list only holds real changes.
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
    const { id } = tx
      .insert(designVersions)
      .values({
        rideId,
        version: next,
        data: input.data,
        reason: input.reason,
        origin: input.origin,
        createdBy: userId,
      })
      .returning({ id: designVersions.id })
      .get();
    const created = mustFindDesignVersion(tx, rideId, next);
    recordAudit(tx, {
      userId,
      entity: 'design',
      entityId: id,
      action: 'create',
      rideId,
      summary: `${ride.name}: design data version ${next} — ${input.reason}`,
      before: current ? { version: current.version, data: current.data } : null,
      after: { version: next, reason: input.reason, origin: input.origin, data: input.data },
    });
    return created;
  });
}
