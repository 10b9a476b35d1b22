/**
 * What a sheet of plates holds: one label for each ride and one for each pivot of its design data in
 * force, each with the address its code holds (features/rides/plate-url.ts). Pivots are numbered along the
 * body chain as the inspector's readings step numbers them, and named as the design data names them.
 */
import { asc, eq } from 'drizzle-orm';

import { rides, sites } from '@/db/server/schema';
import { plateUrl, type PlateTarget } from '@/features/rides/plate-url';
import type { Db } from '@/server/db';
import { notFound } from '@/server/http/errors';
import { findDesignVersion } from '@/server/registry/design';

export type Plate = {
  target: PlateTarget;
  url: string;
  rideName: string;
  /** "Pivot 2 · Main arm bearing", or null on the ride's own plate. */
  pivot: string | null;
  siteName: string | null;
};

export type PlateSheet = { plates: Plate[]; rideCount: number; printedAt: string };

/** The pivots of a ride's design data in force: "Pivot n · name" in chain order (none without design data). */
function pivotsOf(db: Db, rideId: string): { joint: number; words: string }[] {
  const design = findDesignVersion(db, rideId)?.data;
  if (!design) return [];
  return design.bodies.map((body, joint) => {
    const pivot = design.pivots.find((p) => p.joint === joint);
    return { joint, words: `Pivot ${joint + 1} · ${pivot?.name ?? body.name}` };
  });
}

/** Every ride's plates (or one ride's, by id: 404 when there is no such ride), by site then ride name. */
export function plateSheet(db: Db, appUrl: string, now: Date, rideId?: string): PlateSheet {
  const query = db
    .select({ id: rides.id, name: rides.name, siteName: sites.name })
    .from(rides)
    .leftJoin(sites, eq(sites.id, rides.siteId));
  const list = (rideId ? query.where(eq(rides.id, rideId)) : query)
    .orderBy(asc(sites.name), asc(rides.name))
    .all();
  if (rideId && list.length === 0) throw notFound('No such ride.');
  const plates: Plate[] = [];
  for (const ride of list) {
    const base = { rideName: ride.name, siteName: ride.siteName };
    const whole: PlateTarget = { rideId: ride.id, joint: null };
    plates.push({ ...base, target: whole, url: plateUrl(appUrl, whole), pivot: null });
    for (const p of pivotsOf(db, ride.id)) {
      const target: PlateTarget = { rideId: ride.id, joint: p.joint };
      plates.push({ ...base, target, url: plateUrl(appUrl, target), pivot: p.words });
    }
  }
  return { plates, rideCount: list.length, printedAt: now.toISOString() };
}
