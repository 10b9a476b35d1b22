import { and, desc, eq } from 'drizzle-orm';

import { designVersions, users } from '@/db/server/schema';
import type { DesignVersion } from '@/features/registry/schema';
import type { Db } from '@/server/db';

const versionColumns = {
  id: designVersions.id,
  version: designVersions.version,
  createdAt: designVersions.createdAt,
  createdByName: users.name,
  reason: designVersions.reason,
  origin: designVersions.origin,
  data: designVersions.data,
};

/** A ride's design data at one version, or its current (highest) version when `version` is omitted. */
export function findDesignVersion(
  db: Pick<Db, 'select'>,
  rideId: string,
  version?: number,
): DesignVersion | null {
  const row = db
    .select(versionColumns)
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
