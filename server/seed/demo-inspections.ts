/**
 * The demo's inspection history as data: which rides were inspected when, what was read and found, and
 * how the supervisor decided (`demo-activity.ts` pushes it through the real paths). Invented values: pin
 * wear and clearances drift toward their limits over months.
 */
import type { InspectionType, Reading, ReadingKind } from '@/features/records/schema';
import type { FindingSeverity } from '@/features/review/schema';
import type { DemoPhotoName } from '@/server/seed/demo-photos';

// Rounded, so a reading reads back as typed (0.12 mm is 0.00012 m, not 0.00011999999999999999).
const mm = (v: number) => Number((v / 1000).toPrecision(10));
const rpm = (v: number) => (v * 2 * Math.PI) / 60;
const deg = (v: number) => (v * Math.PI) / 180;

export type DemoReading = {
  kind: ReadingKind;
  joint: number | null;
  label: string;
  valueSI: number;
  unit: string;
  method: Reading['method'];
  spreadSI?: number;
  /** Serial of the demo instrument it was taken with (server/seed/demo-instruments.ts). */
  instrument?: string;
};

const speed = (joint: number, value: number, label = 'Arm speed'): DemoReading => ({
  kind: 'speed',
  joint,
  label,
  valueSI: rpm(value),
  unit: 'rpm',
  method: 'tap_timer',
  spreadSI: rpm(0.04),
});
const amplitude = (value: number): DemoReading => ({
  kind: 'amplitude',
  joint: 0,
  label: 'Swing amplitude, largest side',
  valueSI: deg(value),
  unit: '°',
  method: 'gauge',
  instrument: 'HR-INC-0044',
});
const diameter = (joint: number, valueMm: number): DemoReading => ({
  kind: 'pin_diameter',
  joint,
  label: 'Pin diameter, smallest of four',
  valueSI: mm(valueMm),
  unit: 'mm',
  method: 'micrometer',
  // The micrometer whose range holds the pin.
  instrument:
    valueMm < 25
      ? 'HR-MIC-0101'
      : valueMm < 50
        ? 'HR-MIC-0102'
        : valueMm < 125
          ? 'HR-MIC-0412'
          : 'HR-MIC-0587',
});
const clearance = (
  joint: number,
  valueMm: number,
  method: Reading['method'] = 'dial_indicator',
): DemoReading => ({
  kind: 'clearance',
  joint,
  label: 'Diametral clearance, load reversed',
  valueSI: mm(valueMm),
  unit: 'mm',
  method,
  ...(method === 'dial_indicator'
    ? { instrument: 'HR-DIA-0233' }
    : method === 'gauge'
      ? { instrument: 'HR-FG-0115' }
      : {}),
});

export type DemoFinding = {
  severity: FindingSeverity;
  description: string;
  ruleRef?: string;
  requiredAction?: string;
  /** Days from the seed day (negative: already past). */
  dueInDays?: number;
  photos?: DemoPhotoName[];
};

export type DemoInspection = {
  /** Names the record's ids and its batch. */
  key: string;
  serial: string;
  type: InspectionType;
  /** Submitted this long before the moment of seeding. */
  ago: { days?: number; hours?: number };
  readings: DemoReading[];
  /** Checklist items answered "fail", with the inspector's note. */
  fails?: Record<string, string>;
  photos?: { name: DemoPhotoName; caption: string; joint: number | null; checklistItemId: string | null }[];
  notes?: string;
  /** The phone ran an older app whose preview did not check pin clearance. */
  olderPhone?: boolean;
  amends?: string;
  review?: { state: 'approved' | 'returned'; hoursLater: number; note?: string };
  findings?: DemoFinding[];
};

const approved = (note?: string) => ({ state: 'approved' as const, hoursLater: 20, note });

const SKYLARK = 'ORW-PX15-0412';
const COMET = 'BME-TA2-0097';
const WHEEL = 'MFW-LW18-0031';
const TIDEBREAKER = 'ORW-RX30-0158';
const WHIRLIGIG = 'QCW-SC32-0264';
const KITE = 'ORW-PX6-0733';

/** Skylark's main pivot wears slowly: diameter down, clearance up, month by month. */
const skylarkPeriodics: DemoInspection[] = [175, 145, 115, 85, 55, 25].map((days, i) => ({
  key: `skylark-periodic-${days}`,
  serial: SKYLARK,
  type: 'periodic',
  ago: { days },
  readings: [
    amplitude(108 + (i % 3)),
    diameter(0, 159.86 - i * 0.07),
    clearance(0, 0.31 + i * 0.04),
    clearance(1, 0.15 + i * 0.01),
  ],
  review: approved(),
  findings:
    days === 55
      ? [
          {
            severity: 'note',
            description:
              'Main pivot shaft clearance rising steadily: 0.47 mm against the 0.60 mm limit (about 0.04 mm a month).',
          },
        ]
      : days === 25
        ? [
            {
              severity: 'fix_by_date',
              description:
                'Main pivot shaft clearance 0.51 mm; at this rate it reaches the limit within three months.',
              ruleRef: 'Maker’s maintenance manual PX-15, section 6.2 (pivot bushings)',
              requiredAction:
                'Order the main pivot bushing set and book its replacement at the winter shutdown.',
              dueInDays: 60,
            },
          ]
        : undefined,
}));

/** Tidebreaker's sub-arm pivot: the bushing wore to near its limit, was replaced, and the drive now runs fast. */
const tidebreakerPeriodics: DemoInspection[] = [61, 47, 33, 19, 5].map((days, i) => ({
  key: `tidebreaker-periodic-${days}`,
  serial: TIDEBREAKER,
  type: 'periodic',
  ago: { days },
  readings: [
    speed(0, 6.0 + (i % 2) * 0.04, 'Main arm speed'),
    speed(1, 12.0, 'Sub-arm speed'),
    diameter(1, 119.68 - i * 0.04),
    clearance(1, [0.27, 0.3, 0.32, 0.35, 0.37][i]),
  ],
  photos:
    days === 5
      ? [
          {
            name: 'tidebreaker-sub-arm-pin',
            caption: 'Sub-arm pivot pin, drive side',
            joint: 1,
            checklistItemId: 'pins.sub-arm-clearance',
          },
          {
            name: 'tidebreaker-bushing-bore',
            caption: 'Sub-arm bushing bore',
            joint: 1,
            checklistItemId: 'pins.sub-arm-clearance',
          },
        ]
      : undefined,
  review: approved(
    days === 5 ? 'Restricted to the reduced programme until the bushing is replaced.' : undefined,
  ),
  findings:
    days === 5
      ? [
          {
            severity: 'fix_by_date',
            description:
              'Sub-arm pivot bushing scored at 4 o’clock; clearance 0.37 mm against the 0.40 mm limit.',
            ruleRef: 'Maker’s maintenance manual RX-30, section 5.4 (sub-arm pivot)',
            requiredAction:
              'Replace the sub-arm pivot bushing and measure the clearance again before the restriction is lifted.',
            dueInDays: 2,
            photos: ['tidebreaker-bushing-bore'],
          },
        ]
      : undefined,
}));

export const demoInspections: DemoInspection[] = [
  // ——— history ———
  {
    key: 'skylark-annual-200',
    serial: SKYLARK,
    type: 'annual',
    ago: { days: 200 },
    readings: [
      amplitude(110),
      diameter(0, 159.89),
      clearance(0, 0.29),
      diameter(1, 139.95),
      clearance(1, 0.14),
    ],
    review: approved('Annual inspection complete; NDT of the arm root welds clear (report on file).'),
  },
  ...skylarkPeriodics,
  {
    key: 'comet-annual-340',
    serial: COMET,
    type: 'annual',
    ago: { days: 340 },
    readings: [speed(0, 11.9), diameter(0, 119.88), clearance(0, 0.14)],
    review: approved(),
  },
  {
    key: 'comet-periodic-10',
    serial: COMET,
    type: 'periodic',
    ago: { days: 10 },
    readings: [speed(0, 11.9), diameter(0, 119.75), clearance(0, 0.21)],
    fails: { 'restraints.padding': 'Gondola B door seal torn over about 300 mm.' },
    review: approved(),
    findings: [
      {
        severity: 'fix_by_date',
        description: 'Gondola B door seal torn over about 300 mm; rain gets onto the seats.',
        requiredAction: 'Replace the door seal on gondola B.',
        dueInDays: -3,
      },
      {
        severity: 'note',
        description: 'Hub access ladder: two rungs slippery with grease.',
      },
    ],
  },
  {
    key: 'wheel-periodic-29',
    serial: WHEEL,
    type: 'periodic',
    ago: { days: 29 },
    readings: [speed(0, 1.2, 'Wheel speed'), clearance(1, 0.08, 'gauge')],
    review: approved(),
  },
  ...tidebreakerPeriodics.slice(0, 2),
  {
    key: 'tidebreaker-setup-40',
    serial: TIDEBREAKER,
    type: 'setup_after_assembly',
    ago: { days: 40 },
    readings: [speed(0, 6.02, 'Main arm speed'), speed(1, 12.0, 'Sub-arm speed'), clearance(1, 0.31)],
    notes: 'Set up on Lowfield Common, north field. Packing checked at all eight jacking points.',
    review: approved(),
  },
  ...tidebreakerPeriodics.slice(2),
  {
    key: 'whirligig-periodic-12',
    serial: WHIRLIGIG,
    type: 'periodic',
    ago: { days: 12 },
    readings: [amplitude(12), diameter(0, 19.82), clearance(0, 0.2)],
    review: approved(),
  },
  {
    key: 'kite-periodic-16',
    serial: KITE,
    type: 'periodic',
    ago: { days: 16 },
    readings: [amplitude(74), clearance(0, 0.18, 'typed')],
    review: {
      state: 'returned',
      hoursLater: 6,
      note:
        'The main pivot clearance has no measuring method and the pin photo is missing. Measure it again ' +
        'with the dial indicator, load reversed, and send an amendment.',
    },
  },
  {
    key: 'kite-periodic-15',
    serial: KITE,
    type: 'periodic',
    ago: { days: 15 },
    amends: 'kite-periodic-16',
    readings: [amplitude(74), clearance(0, 0.19)],
    notes: 'Amended: clearance measured with the dial indicator, load reversed.',
    review: approved(),
  },
  // ——— waiting for a decision ———
  {
    // Over its limit: the main arm runs fast since the drive controller was replaced.
    key: 'tidebreaker-follow-up-0',
    serial: TIDEBREAKER,
    type: 'follow_up',
    ago: { hours: 2 },
    readings: [
      speed(0, 6.7, 'Main arm speed'),
      speed(1, 12.1, 'Sub-arm speed'),
      diameter(1, 119.52),
      clearance(1, 0.12),
    ],
    fails: {
      'drive.speed':
        'Main arm timed at 6.7 rpm over five turns, design 6.0 rpm. Drive controller replaced last week.',
    },
    photos: [
      {
        name: 'tidebreaker-sub-arm-pin',
        caption: 'Sub-arm pivot pin, refitted with the new bushing',
        joint: 1,
        checklistItemId: 'pins.sub-arm-clearance',
      },
    ],
    notes: 'Sub-arm bushing replaced yesterday by the operator’s fitter; new clearance 0.12 mm.',
  },
  {
    // Failed checklist items after the move to a new ground.
    key: 'whirligig-setup-0',
    serial: WHIRLIGIG,
    type: 'setup_after_assembly',
    ago: { hours: 4 },
    readings: [amplitude(12), diameter(0, 19.8), clearance(0, 0.21)],
    fails: {
      'restraints.every-seat':
        'Seat 14: restraint bar does not hold on the first notch; holds on the second.',
      'signage.fencing': 'Gap of about 40 cm in the fence behind the pay box.',
    },
    photos: [
      {
        name: 'whirligig-restraint-latch',
        caption: 'Seat 14 restraint latch',
        joint: null,
        checklistItemId: 'restraints.every-seat',
      },
    ],
    notes: 'Set up on Brackley Meadow. Ground firm; packing under all jacks.',
  },
  {
    // Near a limit: the main pivot clearance keeps rising.
    key: 'skylark-periodic-1',
    serial: SKYLARK,
    type: 'periodic',
    ago: { days: 1 },
    readings: [amplitude(109), diameter(0, 159.46), clearance(0, 0.55), clearance(1, 0.21)],
    photos: [
      {
        name: 'skylark-dial-indicator',
        caption: 'Main pivot play, dial indicator',
        joint: 0,
        checklistItemId: 'pins.main-clearance',
      },
    ],
    olderPhone: true,
  },
  {
    // Nothing flagged.
    key: 'wheel-periodic-0',
    serial: WHEEL,
    type: 'periodic',
    ago: { hours: 1 },
    readings: [speed(0, 1.19, 'Wheel speed'), diameter(1, 29.93), clearance(1, 0.09, 'gauge')],
    notes: 'All 18 gondola doors and locks checked.',
  },
];

/** Plausible values for the template's other measurement items, so a checklist reads complete. */
export const otherMeasurements: Record<string, { valueSI: number; unit: string }> = {
  'structure.inclination': { valueSI: deg(0.3), unit: '°' },
  'bolts.torque': { valueSI: 410, unit: 'N·m' },
  'drive.brake-gap': { valueSI: mm(0.6), unit: 'mm' },
  'electrical.insulation': { valueSI: 48, unit: 'MΩ' },
  'documents.hours': { valueSI: 6240, unit: 'h' },
};

/** Which reading answers a measurement item, by item id. */
export const measuredBy: Record<string, { kind: ReadingKind; joint: number }> = {
  'pins.main-diameter': { kind: 'pin_diameter', joint: 0 },
  'pins.main-clearance': { kind: 'clearance', joint: 0 },
  'pins.sub-arm-clearance': { kind: 'clearance', joint: 1 },
  'pins.gondola-clearance': { kind: 'clearance', joint: 1 },
  'drive.speed': { kind: 'speed', joint: 0 },
  'drive.amplitude': { kind: 'amplitude', joint: 0 },
};
