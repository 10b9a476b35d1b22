/**
 * What the phone keeps from the server for offline work: rides, design-data versions, checklist
 * templates, assignments and supervisor decisions. Writers take values already checked against the pull
 * schemas; readers check again and skip what no longer parses (a cache can always be downloaded again,
 * and an app update may have changed a shape).
 */
import { desc, eq, inArray } from 'drizzle-orm';
import type { z } from 'zod';

import {
  assignments,
  cachedChecklistTemplates,
  cachedDesignVersions,
  cachedRides,
  decisions,
} from '@/db/device/schema';
import { type DeviceDb, getDeviceOwner, ownedBy } from '@/features/device-db';
import {
  type PulledRide,
  pulledRideSchema,
  type PulledAssignment,
  type PulledDecision,
  type PulledDesign,
  type PulledTemplate,
  pulledAssignmentSchema,
  pulledDecisionSchema,
  pulledDesignSchema,
  pulledTemplateSchema,
} from '@/features/sync/pull-schema';

function parseEach<T>(schema: z.ZodType<T>, rows: { json: string }[]): T[] {
  const out: T[] = [];
  for (const row of rows) {
    const parsed = schema.safeParse(JSON.parse(row.json));
    if (parsed.success) out.push(parsed.data);
  }
  return out;
}

const iso = (now: Date) => now.toISOString();

export async function writeRides(dev: DeviceDb, rides: PulledRide[], now = new Date()): Promise<void> {
  for (const ride of rides) {
    const row = { id: ride.id, json: JSON.stringify(ride), updatedAt: iso(now) };
    await dev.db
      .insert(cachedRides)
      .values(row)
      .onConflictDoUpdate({ target: cachedRides.id, set: { json: row.json, updatedAt: row.updatedAt } })
      .run();
  }
}

export async function readRides(dev: DeviceDb): Promise<PulledRide[]> {
  return parseEach(pulledRideSchema, await dev.db.select().from(cachedRides).all());
}

export async function readRide(dev: DeviceDb, id: string): Promise<PulledRide | null> {
  const rows = await dev.db.select().from(cachedRides).where(eq(cachedRides.id, id)).all();
  return parseEach(pulledRideSchema, rows)[0] ?? null;
}

export async function writeDesignVersions(dev: DeviceDb, designs: PulledDesign[]): Promise<void> {
  for (const design of designs) {
    // Versions never change, so a second copy of the same id is simply ignored.
    await dev.db
      .insert(cachedDesignVersions)
      .values({ id: design.id, rideId: design.rideId, version: design.version, json: JSON.stringify(design) })
      .onConflictDoNothing()
      .run();
  }
}

export async function readDesignVersion(dev: DeviceDb, id: string): Promise<PulledDesign | null> {
  const rows = await dev.db.select().from(cachedDesignVersions).where(eq(cachedDesignVersions.id, id)).all();
  return parseEach(pulledDesignSchema, rows)[0] ?? null;
}

/** The newest design-data version the phone holds for a ride. */
export async function readCurrentDesign(dev: DeviceDb, rideId: string): Promise<PulledDesign | null> {
  const rows = await dev.db
    .select()
    .from(cachedDesignVersions)
    .where(eq(cachedDesignVersions.rideId, rideId))
    .orderBy(desc(cachedDesignVersions.version))
    .all();
  return parseEach(pulledDesignSchema, rows)[0] ?? null;
}

export async function writeTemplates(
  dev: DeviceDb,
  templates: PulledTemplate[],
  now = new Date(),
): Promise<void> {
  for (const t of templates) {
    const row = { id: t.id, rideClass: t.rideClass, json: JSON.stringify(t), updatedAt: iso(now) };
    await dev.db
      .insert(cachedChecklistTemplates)
      .values(row)
      .onConflictDoUpdate({
        target: cachedChecklistTemplates.id,
        set: { rideClass: row.rideClass, json: row.json, updatedAt: row.updatedAt },
      })
      .run();
  }
}

export async function readTemplates(dev: DeviceDb, rideClass?: string): Promise<PulledTemplate[]> {
  const query = dev.db.select().from(cachedChecklistTemplates);
  const rows = rideClass
    ? await query.where(eq(cachedChecklistTemplates.rideClass, rideClass)).all()
    : await query.all();
  return parseEach(pulledTemplateSchema, rows);
}

export async function writeAssignments(
  dev: DeviceDb,
  items: PulledAssignment[],
  now = new Date(),
): Promise<void> {
  for (const a of items) {
    const row = { id: a.id, rideId: a.rideId, json: JSON.stringify(a), updatedAt: iso(now) };
    await dev.db
      .insert(assignments)
      .values(row)
      .onConflictDoUpdate({
        target: assignments.id,
        set: { rideId: row.rideId, json: row.json, updatedAt: row.updatedAt },
      })
      .run();
  }
}

export async function readAssignments(dev: DeviceDb): Promise<PulledAssignment[]> {
  return parseEach(pulledAssignmentSchema, await dev.db.select().from(assignments).all());
}

export async function writeDecisions(
  dev: DeviceDb,
  items: PulledDecision[],
  now = new Date(),
): Promise<void> {
  const authorId = await getDeviceOwner(dev);
  for (const d of items) {
    const row = { inspectionId: d.inspectionId, json: JSON.stringify(d), updatedAt: iso(now), authorId };
    await dev.db
      .insert(decisions)
      .values(row)
      .onConflictDoUpdate({
        target: decisions.inspectionId,
        set: { json: row.json, updatedAt: row.updatedAt, authorId },
      })
      .run();
  }
}

/** Every decision the phone holds for the signed-in person, for their list of sent inspections. */
export async function readDecisions(dev: DeviceDb): Promise<PulledDecision[]> {
  return parseEach(
    pulledDecisionSchema,
    await dev.db.select().from(decisions).where(ownedBy(decisions.authorId)).all(),
  );
}

export async function removeCached(
  dev: DeviceDb,
  removed: { rides?: string[]; assignments?: string[]; templates?: string[] },
): Promise<void> {
  if (removed.rides?.length)
    await dev.db.delete(cachedRides).where(inArray(cachedRides.id, removed.rides)).run();
  if (removed.assignments?.length)
    await dev.db.delete(assignments).where(inArray(assignments.id, removed.assignments)).run();
  if (removed.templates?.length)
    await dev.db
      .delete(cachedChecklistTemplates)
      .where(inArray(cachedChecklistTemplates.id, removed.templates))
      .run();
}
