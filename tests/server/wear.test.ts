/**
 * A ride's wear trends from its inspections, schedules and running log (server/pivot-life/wear.ts). The
 * regression is the hand computation of tests/engine/wear-trend.test.ts (ordinary least squares and the
 * prediction interval of a new observation, e.g. Montgomery & Runger §11.7, from memory), moved onto the
 * Lantern Wheel's main axle limits: here the server must pick the right readings (the last per pivot of each
 * inspection not amended since, dated by its submission day), the limit of the design in force, the next
 * scheduled inspection of the types that measure wear, and the cycles the operator logged.
 */
import { randomUUID } from 'node:crypto';

import { and, eq } from 'drizzle-orm';

import { runningLog } from '@/db/server/life';
import { inspectionSchedules } from '@/db/server/schema';
import type { Reading } from '@/features/records/schema';
import { addDays } from '@/lib/dates';
import { cyclesLog, rideWearTrends } from '@/server/pivot-life/wear';

import { userIdOf, type TestServer } from './helpers';
import { demoClients, makePinnedServer, type Clients } from './registry-helpers';
import { pushAccepted } from './review-desk-fixtures';
import { demoRide, makeRecord } from './sync-fixtures';

jest.setTimeout(60_000);

const today = '2026-06-15';
const now = new Date(`${today}T10:00:00Z`);
let server: TestServer;
let api: Clients;
let wheel: ReturnType<typeof demoRide>;

beforeAll(async () => {
  server = await makePinnedServer(now);
  api = await demoClients(server.app);
  wheel = demoRide(server.db, 'Lantern Wheel');
});
afterAll(() => server.close());

function reading(
  kind: 'pin_diameter' | 'clearance',
  joint: number,
  valueSI: number,
  takenAt: string,
): Reading {
  return {
    id: randomUUID(),
    kind,
    joint,
    label: kind,
    valueSI,
    unit: 'mm',
    method: kind === 'clearance' ? 'dial_indicator' : 'micrometer',
    takenAt,
  };
}

const um = 1e-6;
// The hand-computed series: wear w (µm) on days 0, 30, 60, 90, 120 from 2026-01-05.
const days = ['2026-01-05', '2026-02-04', '2026-03-06', '2026-04-05', '2026-05-05'];
const w = [0, 10, 25, 32, 50];

function periodicOn(day: string, diameterM: number, clearanceM: number, amendsId: string | null = null) {
  const at = (hh: string) => `${day}T${hh}:00:00.000Z`;
  return makeRecord(wheel, {
    type: 'periodic',
    startedAt: at('07'),
    submittedAt: at('10'),
    amendsId,
    readings: [
      // A first, mistaken diameter the same morning is replaced by the later one.
      reading('pin_diameter', 0, diameterM + 0.001, at('08')),
      reading('pin_diameter', 0, diameterM, at('09')),
      reading('clearance', 0, clearanceM, at('09')),
    ],
  });
}

test('the main axle’s diameter and clearance projected to the design limits, by days and by logged cycles', async () => {
  const pivot = wheel.design.pivots.find((p) => p.joint === 0)!;
  // Limits from the design in force (server/seed/demo-design.ts): 218.5 mm minimum, 0.8 mm clearance.
  expect(pivot.minimumDiameterM).toBeCloseTo(0.2185, 12);
  expect(pivot.maxClearanceM).toBeCloseTo(0.0008, 12);
  // Each series reaches its limit at w = 100 µm.
  const diameter = (wi: number) => pivot.minimumDiameterM + (100 - wi) * um;
  const clearance = (wi: number) => pivot.maxClearanceM - (100 - wi) * um;

  const records = days.map((d, i) => periodicOn(d, diameter(w[i]), clearance(w[i])));
  // The April reading first arrived wrong (as if worn to 217 mm) and was corrected by an amendment.
  const wrong = periodicOn(days[3], 0.217, 0.00079);
  await pushAccepted(server.db, api.inspector, [records[0], records[1], records[2], wrong, records[4]]);
  await pushAccepted(server.db, api.inspector, [
    { ...periodicOn(days[3], diameter(w[3]), clearance(w[3]), wrong.id), id: records[3].id },
  ]);

  // Periodic due on 1 Sep (the type that measured the wear), the annual later; the daily check never counts.
  for (const [type, dueOn] of [
    ['periodic', '2026-09-01'],
    ['annual', '2026-12-01'],
  ] as const)
    server.db
      .update(inspectionSchedules)
      .set({ dueOn })
      .where(and(eq(inspectionSchedules.rideId, wheel.id), eq(inspectionSchedules.inspectionType, type)))
      .run();

  // 100 ride cycles every day from the first reading's day to yesterday: 161 days, 16 100 cycles.
  const operator = userIdOf(server.db, 'operator@pivotwatch.test');
  // This test's log alone (a demo log, if the seed ever has one, would change the counts).
  server.db.delete(runningLog).where(eq(runningLog.rideId, wheel.id)).run();
  server.db
    .insert(runningLog)
    .values(
      Array.from({ length: 161 }, (_, k) => ({
        rideId: wheel.id,
        day: addDays(days[0], k),
        cycles: 100,
        enteredBy: operator,
        enteredAt: now.toISOString(),
        source: 'typed' as const,
      })),
    )
    .run();

  const trends = rideWearTrends(server.db, wheel.id, today);
  const [d, c] = trends.get(0)!;
  expect(d.quantity).toBe('pin_diameter');
  expect(c.quantity).toBe('clearance');
  // The amended April record is gone, its amendment counts; one point per inspection, the later reading.
  expect(d.points.map((p) => p.on)).toEqual(days);
  d.points.forEach((p, i) => expect(p.valueM).toBeCloseTo(diameter(w[i]), 12));
  // Logged cycles up to and including each reading's day: 100 × (day index + 1).
  expect(d.points.map((p) => p.cycles)).toEqual([100, 3100, 6100, 9100, 12100]);

  for (const t of [d, c]) {
    const sign = t.quantity === 'pin_diameter' ? -1 : 1;
    // Slope 3660/9000 µm a day (hand computation); per 1000 cycles, 10× that (100 cycles a day).
    expect(t.slopePerDay).toBeCloseTo((sign * 3660 * um) / 9000, 15);
    expect(t.slopePer1000Cycles).toBeCloseTo((sign * 36600 * um) / 9000, 13);
    expect(t.limitM).toBe(t.quantity === 'pin_diameter' ? pivot.minimumDiameterM : pivot.maxClearanceM);
    // The line reaches the limit on day 248.36 (2026-09-10), the 95 % bound on day 207.36 (2026-07-31).
    expect(t.projectedOn).toBe('2026-09-10');
    expect(t.earliestOn).toBe('2026-07-31');
    // By cycles: the line reaches it at 100 × (248.36 + 1) = 24 936 cycles; 16 100 logged by 14 June, the
    // other 8 836 at 100 a day take 89 days (rounded up): 2026-09-11.
    expect(t.projectedByCyclesOn).toBe('2026-09-11');
    expect(t.nextInspectionOn).toBe('2026-09-01');
    expect(t.flagged).toBe(true);
    // 14 days before the cautious date.
    expect(t.suggestedOn).toBe('2026-07-17');
  }
});

describe('cycles from the log', () => {
  it('hours become ride cycles at the ride cycle time; a reading before the log has none', () => {
    // 2 h at a 240 s ride cycle = 30 ride cycles (7200 / 240).
    const log = cyclesLog(
      [
        { day: '2026-01-01', cycles: 10, hours: null },
        { day: '2026-01-03', cycles: null, hours: 2 },
      ],
      240,
    );
    expect(log.cyclesAt('2025-12-31')).toBeNull();
    expect(log.cyclesAt('2026-01-02')).toBe(10);
    expect(log.cyclesAt('2026-01-05')).toBe(40);
    // 40 cycles over the 3 days the log spans: 13.33 a day.
    expect(log.cyclesPerDay).toBeCloseTo(40 / 3, 12);
    expect(log.dayAtCycles(25)).toBe('2026-01-03');
    // 100 cycles: 60 more at 40/3 a day = 4.5 → 5 days after the last logged day.
    expect(log.dayAtCycles(100)).toBe('2026-01-08');
  });
});
