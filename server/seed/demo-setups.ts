/**
 * The demo's travelling rides (issue #19): Tidebreaker moves between Corvane's two fairgrounds, and the
 * Brackley Meadow spring fair, a shared ground, hosts Corvane's Whirligig Chairs and Tamsworth's Twin
 * Comet as a guest ride. Dates count from the seed day; the set-ups agree with the demo's schedules
 * (each set-up inspection last done 40 days before; Whirligig's and Twin Comet's next ones due in two
 * days, booked in demo-schedules.ts). Days count on the shared ground's clock. Nothing here
 * changes a ride's status: the set-ups under way were cleared long ago, the coming ones are planned.
 */
import { count, inArray } from 'drizzle-orm';

import { rides, sites } from '@/db/server/schema';
import { setupChanges, setups, siteEvents } from '@/db/server/setups';
import type { SetupState } from '@/features/registry/schema';
import { addDays, dayInZone } from '@/lib/dates';
import type { Db } from '@/server/db';

type Tx = Pick<Db, 'select' | 'insert'>;

const SHARED_GROUND = 'Brackley Meadow showground';

type DemoSetup = {
  ride: string;
  site: string;
  event?: boolean;
  from: number;
  to: number;
  pitch?: string;
  /** The states it went through, in order (its first is always planned). */
  states: SetupState[];
};

const demoSetups: DemoSetup[] = [
  {
    ride: 'Tidebreaker',
    site: 'Marrowby Wharf winter fair',
    from: -80,
    to: -45,
    states: ['set_up', 'cleared', 'pulled_down'],
  },
  {
    ride: 'Tidebreaker',
    site: 'Lowfield Common fairground',
    from: -41,
    to: 8,
    pitch: 'North field, pitch 3',
    states: ['set_up', 'cleared'],
  },
  { ride: 'Tidebreaker', site: 'Marrowby Wharf winter fair', from: 12, to: 40, states: [] },
  {
    ride: 'Whirligig Chairs',
    site: 'Lowfield Common fairground',
    from: -41,
    to: 1,
    pitch: 'North field, pitch 5',
    states: ['set_up', 'cleared'],
  },
  {
    ride: 'Whirligig Chairs',
    site: SHARED_GROUND,
    event: true,
    from: 2,
    to: 12,
    pitch: 'Row B, pitch 4',
    states: [],
  },
  {
    ride: 'Twin Comet',
    site: SHARED_GROUND,
    event: true,
    from: 2,
    to: 12,
    pitch: 'Row A, pitch 1',
    states: [],
  },
];

export function topUpDemoSetups(tx: Tx, authorId: string, now: Date): void {
  if ((tx.select({ n: count() }).from(setups).get()?.n ?? 0) > 0) return;
  const names = [...new Set(demoSetups.map((s) => s.ride))];
  const rideIds = new Map(
    tx
      .select({ id: rides.id, name: rides.name })
      .from(rides)
      .where(inArray(rides.name, names))
      .all()
      .map((r) => [r.name, r.id]),
  );
  const siteRows = tx.select({ id: sites.id, name: sites.name, zone: sites.timeZone }).from(sites).all();
  const siteIds = new Map(siteRows.map((s) => [s.name, s.id]));
  const groundRow = siteRows.find((s) => s.name === SHARED_GROUND);
  if (!groundRow || rideIds.size !== names.length) return;
  const ground = groundRow.id;
  const today = dayInZone(now, groundRow.zone ?? 'UTC');
  const at = (days: number) => new Date(Date.parse(`${addDays(today, days)}T09:00:00Z`)).toISOString();
  const { id: eventId } = tx
    .insert(siteEvents)
    .values({
      siteId: ground,
      name: 'Brackley Meadow spring fair',
      fromDate: addDays(today, 2),
      toDate: addDays(today, 12),
      createdAt: now.toISOString(),
    })
    .returning({ id: siteEvents.id })
    .get();
  for (const s of demoSetups) {
    const rideId = rideIds.get(s.ride) as string;
    const siteId = siteIds.get(s.site) as string;
    const { id } = tx
      .insert(setups)
      .values({
        rideId,
        siteId,
        eventId: s.event ? eventId : null,
        fromDate: addDays(today, s.from),
        toDate: addDays(today, s.to),
        pitch: s.pitch ?? null,
        state: s.states.at(-1) ?? 'planned',
        createdBy: authorId,
        createdAt: at(s.from - 30),
      })
      .returning({ id: setups.id })
      .get();
    const path: SetupState[] = ['planned', ...s.states];
    const when = [s.from - 30, s.from, s.from + 1, s.to];
    path.forEach((state, i) =>
      tx
        .insert(setupChanges)
        .values({
          setupId: id,
          at: at(when[i]),
          byUser: authorId,
          fromState: i === 0 ? null : path[i - 1],
          toState: state,
        })
        .run(),
    );
  }
}
