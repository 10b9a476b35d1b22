/**
 * Where a scanned plate leads, decided from the phone alone (never the network, so it works with no
 * signal): the ride itself, or — for a pivot's plate — the inspection of that ride in progress on this
 * phone, opened at that pivot's readings, or a new one (of the type assigned, else the inspector chooses).
 * Anything the phone does not hold gets a plain message saying what to do.
 */
import type { DeviceDb } from '@/features/device-db';
import { listDrafts } from '@/features/device-db';
import type { PlateRefusal, PlateTarget } from '@/features/rides';
import type { InspectionType } from '@/features/records/schema';
import { scheduleSchema } from '@/features/registry/schema';
import type { RideSummary } from '@/features/rides/schema';
import { readAssignments, readCurrentDesign, readRide } from '@/features/sync';

export type PlateOutcome =
  /** A ride's own plate: the ride, as the phone holds it. */
  | { kind: 'ride'; ride: RideSummary }
  /** A pivot's plate, with an inspection of its ride in progress: continue it there. */
  | { kind: 'continue'; draftId: string; joint: number }
  /** A pivot's plate, no inspection in progress: start one (`type` when one is assigned). */
  | { kind: 'start'; ride: RideSummary; joint: number; pivotName: string; type: InspectionType | null }
  | { kind: 'refused'; message: string };

export const refusalMessage: Record<PlateRefusal, string> = {
  empty: 'Paste or type the address of a plate first.',
  'not-plate':
    'This code is not a Pivotwatch plate. Scan the QR plate fixed on the ride or on one of its pivots.',
  'other-server':
    'This plate belongs to another Pivotwatch server, not this one. Ask your admin for this server’s plates.',
};

export async function openPlate(dev: DeviceDb, target: PlateTarget): Promise<PlateOutcome> {
  const ride = await readRide(dev, target.rideId);
  if (!ride)
    return {
      kind: 'refused',
      message:
        'This ride is not on your phone. Sync on Today while you have signal, then scan the plate again.',
    };
  if (target.joint === null) return { kind: 'ride', ride };
  const joint = target.joint;
  const design = await readCurrentDesign(dev, ride.id);
  if (!design)
    return {
      kind: 'refused',
      message: `${ride.name}’s design data is not on your phone, so its pivots cannot be shown. Sync on Today, then scan again.`,
    };
  const body = design.data.bodies[joint];
  if (!body)
    return {
      kind: 'refused',
      message: `${ride.name} has no pivot ${joint + 1} in the design data on your phone. Sync on Today and scan again; if it still says so, the plate may be out of date: tell your admin.`,
    };
  const drafts = await listDrafts(dev, ride.id);
  const latest = [...drafts].sort((a, b) => b.updatedAt.localeCompare(a.updatedAt))[0];
  if (latest) return { kind: 'continue', draftId: latest.id, joint };
  const assignment = (await readAssignments(dev)).find((a) => a.rideId === ride.id);
  const schedule = assignment ? scheduleSchema.safeParse(assignment) : null;
  const pivotName = design.data.pivots.find((p) => p.joint === joint)?.name ?? body.name;
  return {
    kind: 'start',
    ride,
    joint,
    pivotName,
    type: schedule?.success ? schedule.data.inspectionType : null,
  };
}
