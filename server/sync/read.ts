/**
 * Reading accepted inspections back: one with everything (record, readings, photos and whether their
 * bytes arrived, the server's analysis, review state and findings), or a page of summaries. Staff read all; an
 * inspector reads only their own, and another's inspection answers the same 404 as a missing one.
 */
import { and, asc, count, desc, eq, ne, sql, type SQL } from 'drizzle-orm';

import { DAILY_CHECK_TYPE } from '@/features/daily-checks/schema';
import { alias } from 'drizzle-orm/sqlite-core';

import { inspectionPhotos, inspectionReadings, inspections, photos } from '@/db/server/inspections';
import { designVersions, rides, users } from '@/db/server/schema';
import type { SessionUser } from '@/features/session/schema';
import type { Db } from '@/server/db';
import { notFound } from '@/server/http/errors';
import { offsetOf } from '@/server/registry/query';
import { rideTimeZone } from '@/server/schedule-due';
import { listFindings } from '@/server/findings/findings';

const reviewer = alias(users, 'reviewer');

/** Inspectors are limited to their own inspections; other staff see all. */
const ownOnly = (user: SessionUser): SQL | undefined =>
  user.role === 'inspector' ? eq(inspections.inspectorId, user.id) : undefined;

const photoCount = sql<number>`(SELECT count(*) FROM ${inspectionPhotos} ip WHERE ip.inspection_id = ${inspections.id})`;
const photosMissing = sql<number>`(SELECT count(*) FROM ${inspectionPhotos} ip WHERE ip.inspection_id = ${inspections.id} AND NOT EXISTS (SELECT 1 FROM ${photos} p WHERE p.sha256 = ip.sha256))`;
const readingCount = sql<number>`(SELECT count(*) FROM ${inspectionReadings} ir WHERE ir.inspection_id = ${inspections.id})`;

const summaryColumns = {
  id: inspections.id,
  rideId: inspections.rideId,
  rideName: rides.name,
  inspectorId: inspections.inspectorId,
  inspectorName: users.name,
  type: inspections.type,
  startedAt: inspections.startedAt,
  submittedAt: inspections.submittedAt,
  receivedAt: inspections.receivedAt,
  designVersionId: inspections.designVersionId,
  amendsId: inspections.amendsId,
  failedItems: inspections.failedItems,
  readingCount,
  photoCount,
  photosMissing,
  analysisStatus: inspections.analysisStatus,
  analysedAt: inspections.analysedAt,
  reviewState: inspections.reviewState,
  reviewedAt: inspections.reviewedAt,
};

type InspectionListFilter = {
  rideId?: string;
  inspectorId?: string;
  mine?: boolean;
  page: number;
  pageSize: number;
};

export function listInspections(db: Db, user: SessionUser, filter: InspectionListFilter) {
  const where = and(
    ownOnly(user),
    // Operators' daily checks have their own list (server/daily-checks); this one is the inspections'.
    ne(inspections.type, DAILY_CHECK_TYPE),
    filter.mine ? eq(inspections.inspectorId, user.id) : undefined,
    filter.rideId ? eq(inspections.rideId, filter.rideId) : undefined,
    filter.inspectorId ? eq(inspections.inspectorId, filter.inspectorId) : undefined,
  );
  const total = db.select({ n: count() }).from(inspections).where(where).get()?.n ?? 0;
  const rows = db
    .select(summaryColumns)
    .from(inspections)
    .innerJoin(rides, eq(rides.id, inspections.rideId))
    .innerJoin(users, eq(users.id, inspections.inspectorId))
    .where(where)
    .orderBy(desc(inspections.submittedAt), asc(inspections.id))
    .limit(filter.pageSize)
    .offset(offsetOf(filter))
    .all()
    .map((r) => ({
      ...r,
      readingCount: Number(r.readingCount),
      photoCount: Number(r.photoCount),
      photosMissing: Number(r.photosMissing),
    }));
  return { inspections: rows, total, page: filter.page, pageSize: filter.pageSize };
}

export function getInspection(db: Db, user: SessionUser, id: string) {
  const row = db
    .select({
      ...summaryColumns,
      templateId: inspections.templateId,
      templateVersion: inspections.templateVersion,
      record: inspections.record,
      analysis: inspections.analysis,
      analysisNote: inspections.analysisNote,
      /** The number of the design-data version resolved at receipt (null without design data). */
      designVersion: designVersions.version,
      reviewedByName: reviewer.name,
      reviewNote: inspections.reviewNote,
    })
    .from(inspections)
    .innerJoin(rides, eq(rides.id, inspections.rideId))
    .innerJoin(users, eq(users.id, inspections.inspectorId))
    .leftJoin(designVersions, eq(designVersions.id, inspections.designVersionId))
    .leftJoin(reviewer, eq(reviewer.id, inspections.reviewedBy))
    .where(and(eq(inspections.id, id), ownOnly(user)))
    .get();
  if (!row) throw notFound('No such inspection.');

  const readings = db
    .select({
      id: inspectionReadings.id,
      kind: inspectionReadings.kind,
      joint: inspectionReadings.joint,
      label: inspectionReadings.label,
      valueSI: inspectionReadings.valueSi,
      unit: inspectionReadings.unit,
      method: inspectionReadings.method,
      spreadSI: inspectionReadings.spreadSi,
      takenAt: inspectionReadings.takenAt,
      note: inspectionReadings.note,
    })
    .from(inspectionReadings)
    .where(eq(inspectionReadings.inspectionId, id))
    .orderBy(asc(inspectionReadings.takenAt), asc(inspectionReadings.id))
    .all();
  // The typed text of each value is kept only in the record; older records have none.
  const typed = new Map((row.record.readings ?? []).map((r) => [r.id, r.entered]));
  const readingsAsTyped = readings.map((r) => {
    const entered = typed.get(r.id);
    return entered ? { ...r, entered } : r;
  });
  // Where the capture time came from and the place are kept only in the record; older records have neither.
  const photoFactsOf = new Map(
    (row.record.photos ?? []).map((p) => [
      p.id,
      {
        ...(p.takenAtSource ? { takenAtSource: p.takenAtSource } : {}),
        ...(p.place ? { place: p.place } : {}),
      },
    ]),
  );
  const photoRefs = db
    .select({
      id: inspectionPhotos.id,
      sha256: inspectionPhotos.sha256,
      mime: inspectionPhotos.mime,
      bytes: inspectionPhotos.bytes,
      caption: inspectionPhotos.caption,
      joint: inspectionPhotos.joint,
      checklistItemId: inspectionPhotos.checklistItemId,
      takenAt: inspectionPhotos.takenAt,
      storedAt: photos.storedAt,
    })
    .from(inspectionPhotos)
    .leftJoin(photos, eq(photos.sha256, inspectionPhotos.sha256))
    .where(eq(inspectionPhotos.inspectionId, id))
    .orderBy(asc(inspectionPhotos.takenAt), asc(inspectionPhotos.id))
    .all()
    .map(({ storedAt, ...p }) => ({
      ...p,
      ...photoFactsOf.get(p.id),
      received: storedAt !== null,
      url: `/api/photos/${p.sha256}`,
    }));
  const amendedBy = db
    .select({ id: inspections.id, submittedAt: inspections.submittedAt })
    .from(inspections)
    .where(eq(inspections.amendsId, id))
    .orderBy(asc(inspections.submittedAt))
    .all();

  return {
    ...row,
    /** The clock the desk shows its times on: the ride's site's zone, else the inspection body's default. */
    siteTimeZone: rideTimeZone(db, row.rideId),
    readingCount: Number(row.readingCount),
    photoCount: Number(row.photoCount),
    photosMissing: Number(row.photosMissing),
    readings: readingsAsTyped,
    photos: photoRefs,
    amendedBy,
    findings: listFindings(db, id),
  };
}

export type InspectionDetail = ReturnType<typeof getInspection>;
