import type { InspectionType } from '@/features/registry/schema';

/*
 * The demo's inspection schedule, in days relative to the day the demo is seeded, so a fresh demo always
 * opens with some inspections due, exactly one overdue (Tidebreaker's follow-up after its restriction) and
 * some assigned to the demo inspector. As real days pass without inspections, more fall due, as they would.
 */
type DemoSchedule = {
  /** The demo ride's serial. */
  serial: string;
  inspectionType: InspectionType;
  intervalDays: number | null;
  /** Days before the seed day the last inspection was done; null if never. */
  lastDoneDaysAgo: number | null;
  /** An explicit due date, in days from the seed day (negative: in the past). */
  dueInDays?: number;
  assignToDemoInspector?: boolean;
  notes?: string;
};

export const demoSchedules: DemoSchedule[] = [
  // Skylark (pier, in service)
  {
    serial: 'ORW-PX15-0412',
    inspectionType: 'periodic',
    intervalDays: 30,
    lastDoneDaysAgo: 25,
    assignToDemoInspector: true,
  },
  { serial: 'ORW-PX15-0412', inspectionType: 'annual', intervalDays: 365, lastDoneDaysAgo: 200 },
  {
    serial: 'ORW-PX15-0412',
    inspectionType: 'daily_pre_opening',
    intervalDays: 1,
    lastDoneDaysAgo: 1,
    notes: 'Done by the operator’s staff; their log is checked at each periodic inspection.',
  },
  // Twin Comet
  { serial: 'BME-TA2-0097', inspectionType: 'periodic', intervalDays: 30, lastDoneDaysAgo: 10 },
  // Its guest set-up at the Brackley Meadow spring fair (server/seed/demo-setups.ts) books this one.
  {
    serial: 'BME-TA2-0097',
    inspectionType: 'setup_after_assembly',
    intervalDays: null,
    lastDoneDaysAgo: null,
    dueInDays: 2,
    notes: 'Booked by its set-up at the Brackley Meadow spring fair.',
  },
  {
    serial: 'BME-TA2-0097',
    inspectionType: 'annual',
    intervalDays: 365,
    lastDoneDaysAgo: 340,
    assignToDemoInspector: true,
    notes: 'Book the NDT technician for the arm root welds.',
  },
  // Lantern Wheel
  { serial: 'MFW-LW18-0031', inspectionType: 'periodic', intervalDays: 30, lastDoneDaysAgo: 29 },
  { serial: 'MFW-LW18-0031', inspectionType: 'annual', intervalDays: 365, lastDoneDaysAgo: 100 },
  // Tidebreaker (travelling, restricted)
  {
    serial: 'ORW-RX30-0158',
    inspectionType: 'follow_up',
    intervalDays: null,
    lastDoneDaysAgo: null,
    dueInDays: -3,
    assignToDemoInspector: true,
    notes: 'Check the sub-arm pivot bushing after its replacement before the restriction is lifted.',
  },
  { serial: 'ORW-RX30-0158', inspectionType: 'periodic', intervalDays: 14, lastDoneDaysAgo: 5 },
  {
    serial: 'ORW-RX30-0158',
    inspectionType: 'setup_after_assembly',
    intervalDays: null,
    lastDoneDaysAgo: 40,
  },
  // Whirligig Chairs (travelling): moves to its next ground in two days.
  {
    serial: 'QCW-SC32-0264',
    inspectionType: 'setup_after_assembly',
    intervalDays: null,
    lastDoneDaysAgo: 40,
    dueInDays: 2,
    assignToDemoInspector: true,
    notes: 'Next ground: Brackley Meadow.',
  },
  { serial: 'QCW-SC32-0264', inspectionType: 'periodic', intervalDays: 30, lastDoneDaysAgo: 12 },
  // Little Kite
  { serial: 'ORW-PX6-0733', inspectionType: 'periodic', intervalDays: 30, lastDoneDaysAgo: 15 },
  { serial: 'ORW-PX6-0733', inspectionType: 'annual', intervalDays: 365, lastDoneDaysAgo: 300 },
];
