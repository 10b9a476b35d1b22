/**
 * A ride's trends: its inspections oldest first, each with the peak pivot forces the server computed and
 * the pin diameters and clearances measured, so a slow drift toward a wear limit shows before it is
 * reached. Pivot names and limits come from the ride's current design data.
 */
import { and, asc, desc, eq, inArray, isNotNull, ne, notExists, sql } from 'drizzle-orm';

import { DAILY_CHECK_TYPE } from '@/features/daily-checks/schema';
import { alias } from 'drizzle-orm/sqlite-core';

import { inspectionReadings, inspections } from '@/db/server/inspections';
import type { TrendsResponse } from '@/features/review/schema';
import type { SessionUser } from '@/features/session/schema';
import type { Db } from '@/server/db';
import { findDesignVersion } from '@/server/registry/design';
import { mustFindRide } from '@/server/registry/rides';

/** Points answered at most: the latest ones, still oldest first (years of daily checks stay readable). */
const TRENDS_LIMIT = 1000;

const amendment = alias(inspections, 'amendment');

/**
 * Scoped like the inspections themselves (server/sync/read.ts): staff see every inspection of the ride,
 * an inspector only their own, so another inspector's readings never reach them through a chart.
 */
export function rideTrends(db: Pick<Db, 'select'>, user: SessionUser, rideId: string): TrendsResponse {
  mustFindRide(db, rideId);
  const design = findDesignVersion(db, rideId)?.data ?? null;
  const jointCount = design?.bodies.length ?? 0;
  const joints = Array.from({ length: jointCount }, (_, joint) => {
    const pivot = design?.pivots.find((p) => p.joint === joint);
    return {
      joint,
      name: pivot?.name ?? design?.bodies[joint]?.name ?? `Pivot ${joint + 1}`,
      maxForceN: pivot?.maxForceN ?? null,
      minPinDiameterM: pivot?.minimumDiameterM ?? null,
      maxClearanceM: pivot?.maxClearanceM ?? null,
    };
  });

  // A corrected record replaces the one it amends, so only inspections not amended since count.
  const rows = db
    .select({
      inspectionId: inspections.id,
      submittedAt: inspections.submittedAt,
      type: inspections.type,
      reviewState: inspections.reviewState,
      analysisStatus: inspections.analysisStatus,
      // Only the peaks, not the whole stored analysis.
      peaks: sql<
        string | null
      >`(SELECT json_group_array(json_extract(j.value, '$.peakForceN')) FROM json_each(${inspections.analysis}, '$.joints') j)`,
    })
    .from(inspections)
    .where(
      and(
        eq(inspections.rideId, rideId),
        ne(inspections.type, DAILY_CHECK_TYPE),
        user.role === 'inspector' ? eq(inspections.inspectorId, user.id) : undefined,
        notExists(
          db.select({ id: amendment.id }).from(amendment).where(eq(amendment.amendsId, inspections.id)),
        ),
      ),
    )
    .orderBy(desc(inspections.submittedAt), desc(inspections.id))
    .limit(TRENDS_LIMIT)
    .all()
    .reverse();

  const ids = rows.map((r) => r.inspectionId);
  // Readings in the order they were taken: the last of a kind for a joint is the one that counts, as in
  // the load check itself.
  const wear = new Map<string, Map<number, { diameterM: number | null; clearanceM: number | null }>>();
  if (ids.length)
    for (const r of db
      .select({
        inspectionId: inspectionReadings.inspectionId,
        kind: inspectionReadings.kind,
        joint: inspectionReadings.joint,
        valueSi: inspectionReadings.valueSi,
      })
      .from(inspectionReadings)
      .where(
        and(
          eq(inspectionReadings.rideId, rideId),
          inArray(inspectionReadings.kind, ['pin_diameter', 'clearance']),
          isNotNull(inspectionReadings.joint),
          inArray(inspectionReadings.inspectionId, ids),
        ),
      )
      .orderBy(asc(inspectionReadings.takenAt), sql`"inspection_readings"."rowid"`)
      .all()) {
      if (r.joint === null) continue;
      let byJoint = wear.get(r.inspectionId);
      if (!byJoint) wear.set(r.inspectionId, (byJoint = new Map()));
      const pin = byJoint.get(r.joint) ?? { diameterM: null, clearanceM: null };
      if (r.kind === 'pin_diameter') pin.diameterM = r.valueSi;
      else pin.clearanceM = r.valueSi;
      byJoint.set(r.joint, pin);
    }

  const points = rows.map(({ peaks, ...r }) => {
    const stored: unknown = peaks ? JSON.parse(peaks) : [];
    const list = Array.isArray(stored) ? stored : [];
    const peakForceN = Array.from({ length: Math.max(jointCount, list.length) }, (_, i) => {
      const v: unknown = list[i];
      return typeof v === 'number' && Number.isFinite(v) ? v : null;
    });
    const pins = [...(wear.get(r.inspectionId) ?? new Map()).entries()]
      .sort(([a], [b]) => a - b)
      .map(([joint, pin]) => ({ joint, ...pin }));
    return { ...r, peakForceN, pins };
  });

  return { rideId, joints, points };
}
