/**
 * An inspection as its report says it: everything the inspector recorded, exactly as accepted, with the
 * server's load check and the review so far. The same scope as reading the inspection (an inspector
 * gets only their own; another's answers 404), so an inspector can keep a copy of their own work.
 */
import { eq } from 'drizzle-orm';

import { companies, rides, sites } from '@/db/server/schema';
import type { SessionUser } from '@/features/session/schema';
import type { Db } from '@/server/db';
import { getInspection, type InspectionDetail } from '@/server/sync/read';
import { siteZoneSql } from '@/server/schedule-due';

export type InspectionReport = {
  inspection: InspectionDetail;
  ride: {
    name: string;
    rideClass: string;
    maker: string | null;
    model: string | null;
    serial: string | null;
    siteName: string | null;
    /** The site's clock (else the inspection body's default): the report prints its times on it, named. */
    siteTimeZone: string;
    operatorName: string;
  };
  /** Who asked for this copy and when: printed in the footer, never part of the record. */
  printedFor: string;
  printedAt: string;
};

export function inspectionReport(db: Db, user: SessionUser, id: string, now: Date): InspectionReport {
  const inspection = getInspection(db, user, id);
  const ride = db
    .select({
      name: rides.name,
      rideClass: rides.rideClass,
      maker: rides.maker,
      model: rides.model,
      serial: rides.serial,
      siteName: sites.name,
      siteTimeZone: siteZoneSql,
      operatorName: companies.name,
    })
    .from(rides)
    .innerJoin(companies, eq(companies.id, rides.operatorCompanyId))
    .leftJoin(sites, eq(sites.id, rides.siteId))
    .where(eq(rides.id, inspection.rideId))
    .get();
  // The inspection's foreign key keeps its ride; a missing one is a broken database, not a 404.
  if (!ride) throw new Error(`Inspection ${id} names ride ${inspection.rideId}, which does not exist`);
  return { inspection, ride, printedFor: user.name, printedAt: now.toISOString() };
}
