/**
 * The demo inspection body's measuring instruments (invented names and serials). Dates are relative to the
 * seed day so the demo always shows one instrument due for calibration within the fortnight and one past
 * due; the rest are current.
 */
import { count } from 'drizzle-orm';

import { instruments } from '@/db/server/instruments';
import type { InstrumentSnapshot, ReadingKind } from '@/features/records/schema';
import type { instrumentMethods } from '@/features/instruments/schema';
import type { Db } from '@/server/db';
import { demoUuid } from '@/server/seed/demo-ids';
import { addDays, isoDay } from '@/lib/dates';

type DemoInstrument = {
  serial: string;
  name: string;
  method: (typeof instrumentMethods)[number];
  kinds: ReadingKind[];
  /** Days from the seed day to the calibration due date (negative: past due). */
  dueInDays: number;
  /** Calibration interval in days, to date the last calibration. */
  intervalDays: number;
  notes?: string;
};

export const demoInstruments: DemoInstrument[] = [
  {
    serial: 'HR-MIC-0101',
    name: 'Outside micrometer 0–25 mm',
    method: 'micrometer',
    kinds: ['pin_diameter'],
    dueInDays: 210,
    intervalDays: 365,
  },
  {
    serial: 'HR-MIC-0102',
    name: 'Outside micrometer 25–50 mm',
    method: 'micrometer',
    kinds: ['pin_diameter'],
    dueInDays: 188,
    intervalDays: 365,
  },
  {
    serial: 'HR-MIC-0412',
    name: 'Outside micrometer 100–125 mm',
    method: 'micrometer',
    kinds: ['pin_diameter'],
    dueInDays: 243,
    intervalDays: 365,
  },
  {
    serial: 'HR-MIC-0587',
    name: 'Outside micrometer 150–175 mm',
    method: 'micrometer',
    kinds: ['pin_diameter'],
    dueInDays: 97,
    intervalDays: 365,
  },
  {
    serial: 'HR-DIA-0233',
    name: 'Dial indicator 0.01 mm on magnetic base',
    method: 'dial_indicator',
    kinds: ['clearance'],
    dueInDays: 151,
    intervalDays: 365,
  },
  {
    serial: 'HR-DIA-0219',
    name: 'Dial indicator 0.01 mm, spare',
    method: 'dial_indicator',
    kinds: ['clearance'],
    dueInDays: 6,
    intervalDays: 365,
    notes: 'Booked in with the calibration laboratory for next week.',
  },
  {
    serial: 'HR-FG-0115',
    name: 'Feeler gauge set 0.05–1.00 mm',
    method: 'gauge',
    kinds: ['clearance'],
    dueInDays: 174,
    intervalDays: 365,
  },
  {
    serial: 'HR-FG-0107',
    name: 'Feeler gauge set 0.05–1.00 mm, van kit',
    method: 'gauge',
    kinds: ['clearance'],
    dueInDays: -3,
    intervalDays: 365,
    notes: 'Certificate lapsed; not to be used until recalibrated.',
  },
  {
    serial: 'HR-INC-0044',
    name: 'Digital inclinometer',
    method: 'gauge',
    kinds: ['amplitude'],
    dueInDays: 61,
    intervalDays: 365,
  },
  {
    serial: 'HR-TAC-0031',
    name: 'Optical tachometer',
    method: 'tachometer',
    kinds: ['speed'],
    dueInDays: 122,
    intervalDays: 365,
  },
  {
    serial: 'HR-STW-0012',
    name: 'Digital stopwatch',
    method: 'stopwatch',
    kinds: ['period', 'speed'],
    dueInDays: 301,
    intervalDays: 730,
  },
];

const idOf = (serial: string) => demoUuid(`instrument:${serial}`);

/** The snapshot a demo reading carries of the instrument with this serial, as registered on `now`. */
export function demoInstrumentSnapshot(serial: string, now: Date): InstrumentSnapshot {
  const i = demoInstruments.find((d) => d.serial === serial);
  if (!i) throw new Error(`no demo instrument ${serial}`);
  return { id: idOf(serial), name: i.name, serial, calibrationDueOn: addDays(isoDay(now), i.dueInDays) };
}

/** Adds the demo instruments when the register has none (so an emptied register is never refilled twice). */
export function topUpDemoInstruments(db: Pick<Db, 'select' | 'insert'>, now: Date): void {
  if ((db.select({ n: count() }).from(instruments).get()?.n ?? 0) > 0) return;
  const today = isoDay(now);
  for (const i of demoInstruments) {
    const due = addDays(today, i.dueInDays);
    db.insert(instruments)
      .values({
        id: idOf(i.serial),
        name: i.name,
        serial: i.serial,
        method: i.method,
        kinds: i.kinds,
        calibratedOn: addDays(due, -i.intervalDays),
        calibrationDueOn: due,
        notes: i.notes ?? null,
        createdAt: now.toISOString(),
        updatedAt: now.toISOString(),
      })
      .run();
  }
}
