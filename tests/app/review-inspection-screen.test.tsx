/**
 * The review desk's inspection screen (/review/:id). The server's answers are built the way the server
 * builds them: the load check comes from the real engine (features/inspections/analysis) run on a
 * textbook body — a uniform rod pinned at one end, turning at constant speed — so the numbers the screen
 * shows can be held against closed forms and definitions from outside the project:
 *  - the rod's peak pin force m·g + m·ω²·L/2 (standard rigid-body result: the centripetal force of the
 *    centre of mass adds to the weight when the rod hangs straight down);
 *  - 1 in = 25.4 mm exactly (international yard and pound agreement, 1959; NIST SP 811, from memory);
 *  - a clearance's share of its limit is value / limit; a pin's wear allowance used is
 *    (nominal − measured) / (nominal − minimum) (the definition of a wear allowance).
 * Ride, people and data are invented.
 */
import { Image, Modal, Text } from 'react-native';
import { act, fireEvent, screen, waitFor, within } from 'expo-router/testing-library';

import { CAUTION_SHORT } from '@/components/caution';
import type { SessionUser } from '@/features/session/schema';
import { analyseInspection, previewDifferences, previewOf } from '@/features/records/analysis';
import type { Reading } from '@/features/records/schema';
import {
  STANDARD_GRAVITY_MS2,
  boundCycle,
  cycleResultToJson,
  ENGINE_ASSUMPTIONS,
  ENGINE_VERSION,
} from '@/features/loads/engine';
import { inspectionResponseSchema } from '@/features/review/inspection-schema';
import type { DesignData } from '@/features/loads/design-schema';
import { jointRangesOf } from '@/features/loads';
import { formatDamage } from '@/features/fatigue';
import { InspectionReviewScreen } from '@/features/review/inspection-screen';
import type { TrendsResponse } from '@/features/review/schema';
import { setUnitSystem } from '@/features/settings/unit-system';
import { formatQuantity } from '@/lib/units';
import { rodDesign } from '@/tests/support/rod-design';
import { renderScreens, sessionClient } from '@/tests/support/app-screens';
import { type StandInCall, standInApi } from '@/tests/support/stand-in-api';

// d3 ships ES modules only, which the app project's jest transform leaves alone; its own UMD builds are
// the same code in CommonJS form (one per package, each requiring the next by name).
jest.mock('d3-array', () =>
  jest.requireActual(`${process.cwd()}/node_modules/d3-array/dist/d3-array.min.js`),
);
jest.mock('d3-color', () =>
  jest.requireActual(`${process.cwd()}/node_modules/d3-color/dist/d3-color.min.js`),
);
jest.mock('d3-format', () =>
  jest.requireActual(`${process.cwd()}/node_modules/d3-format/dist/d3-format.min.js`),
);
jest.mock('d3-interpolate', () =>
  jest.requireActual(`${process.cwd()}/node_modules/d3-interpolate/dist/d3-interpolate.min.js`),
);
jest.mock('d3-path', () => jest.requireActual(`${process.cwd()}/node_modules/d3-path/dist/d3-path.min.js`));
jest.mock('d3-scale', () =>
  jest.requireActual(`${process.cwd()}/node_modules/d3-scale/dist/d3-scale.min.js`),
);
jest.mock('d3-shape', () =>
  jest.requireActual(`${process.cwd()}/node_modules/d3-shape/dist/d3-shape.min.js`),
);
jest.mock('d3-time', () => jest.requireActual(`${process.cwd()}/node_modules/d3-time/dist/d3-time.min.js`));
jest.mock('d3-time-format', () =>
  jest.requireActual(`${process.cwd()}/node_modules/d3-time-format/dist/d3-time-format.min.js`),
);

jest.mock('@/features/session/token-store', () => ({
  tokenStore: {
    get: async () => ({ token: 'token-of-mara', expiresAt: '2099-01-01T00:00:00.000Z', user: null }),
    set: async () => {},
    clear: async () => {},
  },
}));

let mockWide = true;
jest.mock('@/components/use-wide', () => ({ useWide: () => mockWide }));

// The decision panel is another screen part with its own API; here only what it is handed matters.
let mockPanelProps: Record<string, unknown> | null = null;
jest.mock('@/features/review/decision-panel', () => {
  const { Text: RNText } = jest.requireActual('react-native');
  return {
    DecisionPanel: (props: Record<string, unknown>) => {
      mockPanelProps = props;
      return <RNText>Decision panel stand-in</RNText>;
    },
  };
});

const supervisor: SessionUser = {
  id: 'u-sup',
  email: 'mara.quill@halvard.example',
  name: 'Mara Quill',
  role: 'supervisor',
  companyId: null,
  companyName: null,
};

// ——— the textbook body and what the inspector measured ———

const MASS_KG = 100;
const LENGTH_M = 4;
const RPM = 6;
const OMEGA = (RPM * 2 * Math.PI) / 60;
// One body, "Rod", on one pivot, "Main pivot", with a 20 kN force limit and pin wear limits, and one
// fatigue detail: the pin's lug following the force across the rod, 40 MPa per kN, category 80.
const RIDE_CYCLE_S = 120;
const design: DesignData = {
  ...rodDesign(MASS_KG, LENGTH_M),
  fatigue: {
    rideCycleS: RIDE_CYCLE_S,
    details: [
      {
        joint: 0,
        name: 'Lug net section',
        kind: 'lug_net_section',
        member: 'body',
        component: 'across',
        stressPerKnMPa: 40,
        categoryMPa: 80,
      },
    ],
  },
};

const readings: Reading[] = [
  {
    id: '00000000-0000-4000-8000-000000000001',
    kind: 'speed',
    joint: 0,
    label: 'Speed, main pivot',
    valueSI: OMEGA,
    unit: 'rpm',
    method: 'tachometer',
    spreadSI: null,
    takenAt: '2026-06-02T08:10:00.000Z',
  },
  {
    id: '00000000-0000-4000-8000-000000000002',
    kind: 'pin_diameter',
    joint: 0,
    label: 'Pin diameter, main pivot',
    valueSI: 0.0578,
    unit: 'mm',
    method: 'micrometer',
    spreadSI: null,
    takenAt: '2026-06-02T08:20:00.000Z',
  },
  {
    id: '00000000-0000-4000-8000-000000000003',
    kind: 'clearance',
    joint: 0,
    label: 'Bushing clearance, main pivot',
    valueSI: 0.00048,
    unit: 'mm',
    method: 'dial_indicator',
    spreadSI: null,
    takenAt: '2026-06-02T08:25:00.000Z',
  },
];

const result = analyseInspection(design, readings, 360);
const server = previewOf(result);
// The phone rounded its peak differently: one difference to report.
const device = { ...server, peakForceN: [1000] };

const sha = (c: string) => c.repeat(64);
const photos = [
  {
    id: 'p1',
    sha256: sha('a'),
    mime: 'image/jpeg',
    bytes: 204800,
    caption: 'Crack along the gusset weld',
    joint: null,
    checklistItemId: 'weld',
    takenAt: '2026-06-02T08:30:00.000Z',
    received: true,
    url: `/api/photos/${sha('a')}`,
  },
  {
    id: 'p2',
    sha256: sha('b'),
    mime: 'image/jpeg',
    bytes: 190000,
    caption: 'Main pin, worn face',
    joint: 0,
    checklistItemId: null,
    takenAt: '2026-06-02T08:31:00.000Z',
    received: true,
    url: `/api/photos/${sha('b')}`,
  },
  {
    id: 'p3',
    sha256: sha('c'),
    mime: 'image/jpeg',
    bytes: 150000,
    caption: 'Guard rail, left side',
    joint: null,
    checklistItemId: null,
    takenAt: '2026-06-02T08:32:00.000Z',
    received: false,
    url: `/api/photos/${sha('c')}`,
  },
];

function inspectionAnswer(over: Record<string, unknown> = {}) {
  return {
    inspection: {
      id: 'insp-3',
      rideId: 'ride-1',
      rideName: 'Gull Wing',
      inspectorId: 'u-ins',
      inspectorName: 'Tobin Reyes',
      type: 'periodic',
      startedAt: '2026-06-02T08:00:00.000Z',
      submittedAt: '2026-06-02T09:15:00.000Z',
      receivedAt: '2026-06-02T09:16:00.000Z',
      designVersionId: 'dv-3',
      designVersion: 3,
      amendsId: null,
      failedItems: 2,
      readingCount: 3,
      photoCount: 3,
      photosMissing: 1,
      analysisStatus: server.status,
      analysedAt: '2026-06-02T09:16:01.000Z',
      reviewState: 'submitted',
      reviewedAt: null,
      templateId: 'tpl-1',
      templateVersion: 2,
      record: {
        id: 'insp-3',
        checklist: [
          { itemId: 'fence', area: 'Queue', text: 'Queue fence secure', result: 'pass' },
          {
            itemId: 'weld',
            area: 'Structure',
            text: 'Arm gusset welds free of cracks',
            result: 'fail',
            note: 'Hairline crack, 30 mm, at the lower gusset',
          },
          { itemId: 'lights', area: 'Electrical', text: 'Lamps working', result: 'na' },
          {
            itemId: 'rail',
            area: 'Guards',
            text: 'Guard rail bolts all present',
            result: 'fail',
            note: 'One bolt missing on the left rail',
          },
        ],
        readings,
        photos: [],
        preview: device,
      },
      analysis: JSON.parse(
        JSON.stringify({
          engineVersion: ENGINE_VERSION,
          designVersionId: 'dv-3',
          designVersion: 3,
          status: server.status,
          durationS: result.durationS,
          samples: result.samples,
          joints: result.joints.map((j) => ({
            name: j.name,
            peakForceN: j.peakForce.value,
            peakForceAtArmAngleRad: j.peakForce.armAngleRad,
            peakTorqueNm: j.peakTorque.value,
            ranges: jointRangesOf(j),
          })),
          seats: [],
          envelope: result.envelope,
          server,
          device,
          differences: previewDifferences(device, server),
          fatigue: result.fatigue,
        }),
      ),
      analysisNote: null,
      reviewedByName: null,
      reviewNote: null,
      readings: readings.map((r) => ({ ...r, spreadSI: null, note: null })),
      photos,
      amendedBy: [],
      ...over,
    },
  };
}

const trends: TrendsResponse = {
  rideId: 'ride-1',
  joints: [
    { joint: 0, name: 'Main pivot', maxForceN: 20_000, minPinDiameterM: 0.058, maxClearanceM: 0.0005 },
  ],
  points: [
    ['insp-1', '2025-12-01T09:00:00.000Z', 0.0599, 0.0002],
    ['insp-2', '2026-03-01T09:00:00.000Z', 0.0591, 0.00035],
    ['insp-3', '2026-06-02T09:15:00.000Z', 0.0578, 0.00048],
  ].map(([id, at, d, c]) => ({
    inspectionId: id as string,
    submittedAt: at as string,
    type: 'periodic' as const,
    reviewState: 'approved' as const,
    analysisStatus: 'within' as const,
    peakForceN: [result.joints[0].peakForce.value],
    pins: [{ joint: 0, diameterM: d as number, clearanceM: c as number }],
  })),
};

let answers: Record<string, () => [number, unknown]>;
let requests: StandInCall[];

const notFound = (message: string): [number, unknown] => [404, { error: { code: 'not_found', message } }];

beforeEach(() => {
  mockWide = true;
  mockPanelProps = null;
  setUnitSystem('si');
  answers = {
    '/api/inspections/insp-3': () => [200, inspectionAnswer()],
    '/api/inspections/insp-3/cycle': () => [
      200,
      { engineVersion: ENGINE_VERSION, assumptions: ENGINE_ASSUMPTIONS, ...cycleResultToJson(result) },
    ],
    '/api/inspections/insp-3/trail': () => [
      200,
      {
        entries: [
          {
            id: 'a-1',
            at: '2026-06-02T10:00:00.000Z',
            userId: 'u-sup',
            userName: 'Mara Quill',
            entity: 'finding',
            entityId: 'f-1',
            action: 'create',
            rideId: 'ride-1',
            summary: 'Finding 1: crack at the lower gusset (fix before operation)',
            before: null,
            after: { inspectionId: 'insp-3' },
          },
        ],
      },
    ],
    '/api/rides/ride-1': () => [
      200,
      {
        ride: {
          id: 'ride-1',
          name: 'Gull Wing',
          rideClass: 'pendulum_swing',
          description: null,
          maker: null,
          model: null,
          serial: null,
          year: null,
          status: 'restricted',
          statusReason: 'Awaiting weld repair',
          statusSince: '2026-06-02T10:05:00.000Z',
          siteId: null,
          siteName: null,
          operatorCompanyId: 'op-1',
          operatorName: 'Tamsworth Pier Leisure',
        },
        design: null,
      },
    ],
    '/api/rides/ride-1/design/versions/3': () => [
      200,
      {
        design: {
          id: 'dv-3',
          version: 3,
          createdAt: '2026-01-10T12:00:00.000Z',
          createdByName: 'Ines Okafor',
          reason: 'Pin limits from the maker’s revision C',
          origin: 'editor',
          data: design,
        },
      },
    ],
    '/api/rides/ride-1/trends': () => [200, trends],
  };
  requests = standInApi((call) => {
    const answer = answers[call.path];
    const [status, body] = answer ? answer() : notFound('No such route');
    return { status, body };
  }).calls;
});

afterEach(() => {
  jest.restoreAllMocks();
});

function renderReview(user: SessionUser = supervisor, initialUrl = '/review/insp-3') {
  return renderScreens(
    sessionClient(user),
    {
      'review/[id]': InspectionReviewScreen,
      'rides/[id]': () => <Text>Page of one ride</Text>,
      'rides/[id]/versions/[version]': () => <Text>One design version</Text>,
    },
    initialUrl,
  );
}

/** The pivot's row of the peak pivot loads, once the design version has named the pivot. */
async function pivotRow() {
  const table = await screen.findByLabelText('Peak pivot loads');
  const name = await within(table).findByText('P1 · Main pivot');
  let node: typeof name | null = name;
  while (node && node.props.role !== 'row') node = node.parent;
  if (!node) throw new Error('No row holds the pivot');
  return node;
}

/** The table row (role="row") that holds a text, found by walking up from the text. */
function rowWith(text: string) {
  let node: ReturnType<typeof screen.getByText> | null = screen.getByText(text);
  while (node && node.props.role !== 'row') node = node.parent;
  if (!node) throw new Error(`No row holds ${text}`);
  return node;
}

describe('inspection review', () => {
  test('the fixture is in the shape the screen parses (the test talks the API’s shape)', () => {
    expect(() => inspectionResponseSchema.parse(inspectionAnswer())).not.toThrow();
    // Tolerant of what the findings work adds, even in a shape it does not know.
    const parsed = inspectionResponseSchema.parse(inspectionAnswer({ findings: [{ odd: true }] }));
    expect(parsed.inspection.findings).toBeUndefined();
  });

  test('header: ride (a link), type, inspector, review state, ride status and envelope status', async () => {
    const view = renderReview();
    expect(await screen.findByText('Periodic inspection')).toBeTruthy();
    expect(screen.getByRole('link', { name: 'Ride Gull Wing' })).toBeTruthy();
    expect(screen.getByText('Tobin Reyes')).toBeTruthy();
    expect(screen.getAllByText('Awaiting decision').length).toBeGreaterThan(0);
    expect(await screen.findByLabelText('Restricted')).toBeTruthy();
    expect(screen.getAllByLabelText('Over limit').length).toBeGreaterThan(0);
    fireEvent.press(screen.getByRole('link', { name: 'Ride Gull Wing' }));
    expect(await screen.findByText('Page of one ride')).toBeTruthy();
    expect(view.getPathname()).toBe('/rides/ride-1');
  });

  test('readings against their limits: share of the limit and status, from the definitions', async () => {
    renderReview();
    await screen.findByText('Rod: pin diameter (wear)');
    // Wear allowance used: (60 − 57.8) / (60 − 58) = 110 %, over.
    const pin = rowWith('Rod: pin diameter (wear)');
    expect(within(pin).getByText('110 %')).toBeTruthy();
    expect(within(pin).getByLabelText('Over limit')).toBeTruthy();
    // Clearance 0.48 mm of 0.50 mm = 96 %, at or above the 90 % margin: near.
    const clearance = rowWith('Rod: bushing clearance');
    expect(within(clearance).getByText('96.0 %')).toBeTruthy();
    expect(within(clearance).getByLabelText('Near limit')).toBeTruthy();
    // The peak pin force, 1.06 kN, is far inside 20 kN: within.
    const force = rowWith('Rod: peak pivot force');
    expect(within(force).getByLabelText('Within')).toBeTruthy();
    // The raw readings: value with unit and the method. This record predates the typed text, so the
    // stored value is shown in its shortest exact form (lib/measured-format.ts), not padded to 57.80.
    const raw = rowWith('Pin diameter, main pivot');
    expect(within(raw).getByText('57.8 mm')).toBeTruthy();
    expect(within(raw).getByText('Micrometer')).toBeTruthy();
    expect(within(rowWith('Speed, main pivot')).getByText(`${RPM} rpm`)).toBeTruthy();
    // Results carry the caution.
    expect(screen.getAllByText(CAUTION_SHORT).length).toBeGreaterThan(0);
  });

  test('the declaration and each reading’s instrument, as the record states them; a reading without one reads as before', async () => {
    const base = inspectionAnswer().inspection;
    const declared = inspectionAnswer({
      record: {
        ...base.record,
        readings: readings.map((r) =>
          r.kind === 'pin_diameter'
            ? {
                ...r,
                instrument: {
                  id: 'i-1',
                  name: 'Outside micrometer 50–75 mm',
                  serial: 'MC-1',
                  calibrationDueOn: '2026-11-30',
                },
              }
            : r,
        ),
        declaration: {
          text: 'I inspected this ride in person; this record holds only what I found and measured.',
          declaredAt: '2026-06-02T09:14:00.000Z',
          declaredBy: 'u-ins',
          declaredByName: 'Tobin Reyes',
        },
      },
    });
    answers['/api/inspections/insp-3'] = () => [200, declared];
    renderReview();
    expect(
      await screen.findByText(
        '“I inspected this ride in person; this record holds only what I found and measured.”',
      ),
    ).toBeTruthy();
    expect(screen.getByText(/^Made by Tobin Reyes on 2 Jun 2026/)).toBeTruthy();
    const raw = rowWith('Pin diameter, main pivot');
    expect(within(raw).getByText('Micrometer · Outside micrometer 50–75 mm (MC-1)')).toBeTruthy();
    // A reading with no instrument recorded reads as before.
    expect(within(rowWith('Bushing clearance, main pivot')).getByText('Dial indicator')).toBeTruthy();
  });

  test('pivot ranges along and across the rod in its own frame: 2·m·g each (textbook fixed-axis rotation)', async () => {
    renderReview();
    const row = await pivotRow();
    // Across the rod m·g·cos θ, along it −m·ω²·r_G + m·g·sin θ: both range over 2·m·g per turn.
    const twoMg = formatQuantity(2 * MASS_KG * STANDARD_GRAVITY_MS2, 'force', 'si').text;
    expect(within(row).getByText(`${twoMg} / ${twoMg} (Rod frame)`)).toBeTruthy();
    expect(screen.getAllByText('Force range along / across'.toUpperCase()).length).toBeGreaterThan(0);
    // The force's size only ranges over m·ω²·L = 158 N, which hides the reversal: never shown as a range.
    const sizeRange = formatQuantity(MASS_KG * OMEGA ** 2 * LENGTH_M, 'force', 'si').text;
    expect(within(row).queryByText(sizeRange)).toBeNull();
  });

  test('an analysis stored before component ranges says they were not recorded, not the size’s range', async () => {
    const old = inspectionAnswer();
    const analysis = old.inspection.analysis as { engineVersion: string; joints: Record<string, unknown>[] };
    analysis.engineVersion = '1.1.0';
    analysis.joints = analysis.joints.map(({ ranges: _r, ...j }) => ({ ...j, forceRangeN: 158 }));
    answers['/api/inspections/insp-3'] = () => [200, old];
    renderReview();
    const row = await pivotRow();
    expect(within(row).getAllByText('Not recorded (engine 1.1.0)')).toHaveLength(2);
    expect(within(row).queryByText('158 N')).toBeNull();
  });

  test('fatigue per detail: the lug’s range 40 MPa/kN × 2·m·g and its Miner damage per ride cycle (EN 1993-1-9)', async () => {
    renderReview();
    const table = await screen.findByLabelText('Fatigue per detail');
    // Δσ = 40 × 1.961 kN = 78.45 MPa > Δσ_D = 0.737 × 80 = 58.96 MPa, so m = 3: one turn does
    // (78.45/80)³ / 2×10⁶ = 4.716×10⁻⁷; a 120 s ride cycle is 12 turns of 10 s (6 rpm): 5.659×10⁻⁶.
    const rangeMPa = (40 * 2 * MASS_KG * STANDARD_GRAVITY_MS2) / 1000;
    const perTurn = (rangeMPa / 80) ** 3 / 2e6;
    const perRide = perTurn * (RIDE_CYCLE_S / (60 / RPM));
    expect(perRide / 5.659e-6).toBeCloseTo(1, 3);
    // The stored analysis's values (360 instants per turn: the sampled range within 10⁻⁴ of the textbook's).
    const stored = result.fatigue?.[0];
    expect((stored?.cases[0].maxRangeMPa ?? 0) / rangeMPa).toBeCloseTo(1, 4);
    expect((stored?.damagePerRideCycle ?? 0) / perRide).toBeCloseTo(1, 3);
    // The detail with its EN 1993-1-9 category on a line of its own.
    await screen.findByText('P1 · Main pivot · Lug net section Δσ_C 80 MPa');
    const row = rowWith('P1 · Main pivot · Lug net section Δσ_C 80 MPa');
    expect(
      within(row).getByText(
        `Operating cycle: ${formatQuantity((stored?.cases[0].maxRangeMPa ?? 0) * 1e6, 'stress', 'si').text}`,
      ),
    ).toBeTruthy();
    expect(within(row).getByText(formatDamage(stored?.damagePerRideCycle ?? 0))).toBeTruthy();
    expect(within(row).getByText('Operating cycle')).toBeTruthy();
    expect(within(row).getByText('No emergency stop in the design')).toBeTruthy();
    expect(within(table).getAllByText(/P1 · Main pivot · Lug net section/)).toHaveLength(1);
    expect(screen.getAllByText(/rainflow \(ASTM E1049-85, §5.4.4\)/).length).toBeGreaterThan(0);
    expect(screen.getAllByText(/EN 1993-1-9 §7 S-N curve/).length).toBeGreaterThan(0);
    expect(screen.getAllByText(CAUTION_SHORT).length).toBeGreaterThan(1);
  });

  test('a record stored before declarations says so rather than showing one', async () => {
    renderReview();
    expect(
      await screen.findByText('No declaration: recorded before inspectors were asked for one.'),
    ).toBeTruthy();
  });

  test('values follow the person’s unit system (1 in = 25.4 mm exactly)', async () => {
    setUnitSystem('us');
    renderReview();
    await screen.findByText('Pin diameter, main pivot');
    const inches = 0.0578 / 0.0254; // 2.2756 in
    expect(within(rowWith('Pin diameter, main pivot')).getByText(`${inches.toFixed(3)} in`)).toBeTruthy();
  });

  test('the force chart: the rod’s peak is m·g + m·ω²·L/2, with the pivot’s limit line', async () => {
    renderReview();
    const peakN = MASS_KG * STANDARD_GRAVITY_MS2 + (MASS_KG * OMEGA ** 2 * LENGTH_M) / 2;
    const expected = formatQuantity(peakN, 'force', 'si').text; // 1.060 kN
    const chart = await screen.findByLabelText(/^Force on P1 · Main pivot over the ride cycle/);
    const label = chart.props.accessibilityLabel as string;
    expect(label).toContain(`peak ${expected}`);
    // The design limit as stated (lib/measured-format.ts): 20 kN, not padded to 20.00 kN.
    expect(label).toContain('limit 20 kN');
    // Time instead of angle: the same peak, now located in time.
    fireEvent.press(screen.getByRole('radio', { name: 'Time' }));
    const byTime = screen.getByLabelText(/^Force on P1 · Main pivot over the ride cycle against time/);
    expect(byTime.props.accessibilityLabel).toContain(`peak ${expected} at `);
  });

  test('without design data the cycle answers 404 and the screen says so', async () => {
    answers['/api/inspections/insp-3/cycle'] = () =>
      notFound('This inspection has no design data, so there is no ride cycle to show.');
    renderReview();
    expect(await screen.findByText('No ride cycle to chart')).toBeTruthy();
    expect(screen.getByText(/cannot run the load engine over a ride cycle/)).toBeTruthy();
    // Asked once: a 404 is not retried.
    expect(requests.filter((r) => r.url.pathname.endsWith('/cycle'))).toHaveLength(1);
  });

  test('a bounded cycle says how many instants it draws and offers every one; a refusal reads the reason', async () => {
    // The server's bounded answer (server/compute/cycle-series.ts), cut here to a small bound.
    const cut = boundCycle(result, 1200);
    expect(cut.sampleIndex).not.toBeNull();
    const refusal = 'Full resolution is limited to 500,000 numbers; this cycle has 600,000';
    answers['/api/inspections/insp-3/cycle'] = () => {
      const last = requests.filter((r) => r.url.pathname.endsWith('/cycle')).pop();
      return last?.url.searchParams.get('resolution') === 'full'
        ? [
            400,
            {
              error: {
                code: 'validation_failed',
                message: 'The request has invalid fields.',
                issues: [{ path: 'query.resolution', message: refusal }],
              },
            },
          ]
        : [
            200,
            {
              engineVersion: ENGINE_VERSION,
              assumptions: ENGINE_ASSUMPTIONS,
              ...cycleResultToJson(cut.result),
              resolution: 'bounded',
              sampleIndex: cut.sampleIndex,
            },
          ];
    };
    renderReview();
    expect(
      await screen.findByText(new RegExp(`drawn through ${cut.sampleIndex!.length} of them`)),
    ).toBeTruthy();
    // The peak still reads as the full analysis's: the bounded series keep it.
    const chart = await screen.findByLabelText(/^Force on P1 · Main pivot over the ride cycle/);
    expect(chart.props.accessibilityLabel).toContain('peak ');
    fireEvent.press(screen.getByRole('button', { name: 'Every instant' }));
    expect(await screen.findByText(refusal)).toBeTruthy();
    expect(requests.some((r) => r.url.searchParams.get('resolution') === 'full')).toBe(true);
    fireEvent.press(screen.getByRole('button', { name: 'Show the bounded series' }));
    expect(await screen.findByText(new RegExp(`drawn through ${cut.sampleIndex!.length}`))).toBeTruthy();
  });

  test('failed checklist items come first with their notes and photos; the rest on request', async () => {
    renderReview();
    const weld = await screen.findByLabelText('Failed item: Arm gusset welds free of cracks');
    expect(within(weld).getByText('Hairline crack, 30 mm, at the lower gusset')).toBeTruthy();
    expect(
      within(weld).getByRole('button', { name: /^Open photo: Crack along the gusset weld/ }),
    ).toBeTruthy();
    expect(screen.getByLabelText('Failed item: Guard rail bolts all present')).toBeTruthy();
    expect(screen.getByText('2 failed · 1 passed · 1 not applicable')).toBeTruthy();
    expect(screen.queryByText('Queue fence secure')).toBeNull();
    fireEvent.press(screen.getByRole('button', { name: 'Show the other 2 items' }));
    expect(screen.getByText('Queue fence secure')).toBeTruthy();
    expect(screen.getByText('Lamps working')).toBeTruthy();
  });

  test('the gallery opens a photo full size with its caption; Close and Escape shut it', async () => {
    renderReview();
    const thumb = await screen.findByRole('button', {
      name: 'Open photo: Main pin, worn face (P1 · Main pivot)',
    });
    // A photo still on the phone says so.
    expect(screen.getAllByText('Not uploaded from the phone yet').length).toBe(1);
    fireEvent.press(thumb);
    expect(await screen.findByText('PHOTO 2 OF 3')).toBeTruthy();
    // The full-size image is asked for with the session token: photos sit behind sign-in.
    const full = await screen.findByLabelText('Main pin, worn face');
    expect(full.props.source).toMatchObject({
      uri: `/api/photos/${sha('b')}`,
      headers: { Authorization: 'Bearer token-of-mara' },
    });
    fireEvent.press(screen.getByRole('button', { name: 'Next' }));
    expect(await screen.findByText('The phone has not uploaded this photo yet.')).toBeTruthy();
    fireEvent.press(screen.getByRole('button', { name: 'Close' }));
    await waitFor(() => expect(screen.queryByText('PHOTO 3 OF 3')).toBeNull());

    fireEvent.press(thumb);
    expect(await screen.findByText('PHOTO 2 OF 3')).toBeTruthy();
    // react-native-web's Modal calls onRequestClose on the Escape key.
    const modal = screen.UNSAFE_getByType(Modal);
    act(() => modal.props.onRequestClose());
    await waitFor(() => expect(screen.queryByText('PHOTO 2 OF 3')).toBeNull());
    expect(screen.UNSAFE_queryAllByType(Image).length).toBeGreaterThan(0);
  });

  test('beside each photo: when it was taken on the site’s clock, where its time came from, and the place when kept', async () => {
    const answer = inspectionAnswer({ siteTimeZone: 'Europe/London' });
    const shown = answer.inspection.photos as Record<string, unknown>[];
    shown[1] = {
      ...shown[1],
      takenAtSource: 'device',
      place: { lat: 51.5034, lon: -0.1276, accuracyM: 12, source: 'device' },
    };
    shown[0] = { ...shown[0], takenAtSource: 'exif' };
    answers['/api/inspections/insp-3'] = () => [200, answer];
    renderReview();
    // 08:31 UTC on 2 June is 09:31 in London (BST, UTC+1, IANA tz database).
    const line = 'Taken 2 Jun 2026, 09:31 (device clock) · 51.5034° N, 0.1276° W (device, ±12 m)';
    expect(await screen.findByText(line)).toBeTruthy();
    expect(screen.getByText('Taken 2 Jun 2026, 09:30 (camera clock)')).toBeTruthy();
    // A photo from a record made before the time's source was kept: its time only.
    expect(screen.getByText('Taken 2 Jun 2026, 09:32')).toBeTruthy();
    // The full-size view says the same under the caption.
    fireEvent.press(
      await screen.findByRole('button', { name: 'Open photo: Main pin, worn face (P1 · Main pivot)' }),
    );
    expect(await screen.findByText(`P1 · Main pivot · ${line} · 186 KB`)).toBeTruthy();
  });

  test('the versions the analysis used, and where the phone’s preview differed', async () => {
    const view = renderReview();
    const facts = await screen.findByLabelText('Analysis facts');
    expect(within(facts).getAllByText(ENGINE_VERSION)).toHaveLength(2);
    expect(within(facts).getByText('Version 3')).toBeTruthy();
    const peak = Math.round(result.joints[0].peakForce.value);
    expect(within(facts).getByText(`• Pivot 1 peak force: phone 1000 N, server ${peak} N.`)).toBeTruthy();
    fireEvent.press(within(facts).getByRole('link'));
    expect(await screen.findByText('One design version')).toBeTruthy();
    expect(view.getPathname()).toBe('/rides/ride-1/versions/3');
  });

  test('a preview that agreed is said so', async () => {
    const agreeing = inspectionAnswer();
    agreeing.inspection.analysis.device = server;
    agreeing.inspection.analysis.differences = previewDifferences(server, server);
    answers['/api/inspections/insp-3'] = () => [200, agreeing];
    renderReview();
    expect(await screen.findByText('The phone’s preview agreed with the server’s analysis.')).toBeTruthy();
  });

  test('the decision panel gets the inspection, the ride’s status and the photos', async () => {
    renderReview();
    expect(await screen.findByText('Decision panel stand-in')).toBeTruthy();
    expect(mockPanelProps).toEqual({
      inspectionId: 'insp-3',
      rideId: 'ride-1',
      rideName: 'Gull Wing',
      rideStatus: 'restricted',
      rideStatusReason: 'Awaiting weld repair',
      reviewState: 'submitted',
      reviewNote: null,
      // No key pressed on the desk (the shortcuts' a and r set it).
      keyIntent: null,
      // Each photo by its own id, with when it was taken and what it shows, for the finding's photo picker.
      photos: photos.map((p) =>
        expect.objectContaining({ id: p.id, sha256: p.sha256, caption: p.caption, takenAt: p.takenAt }),
      ),
      // The server's checked values, for the approve warning (over and near limits, not only findings).
      envelope: expect.arrayContaining([expect.objectContaining({ status: expect.any(String) })]),
    });
    const envelope = (mockPanelProps as { envelope: { status: string }[] }).envelope;
    expect(envelope.length).toBeGreaterThan(0);
  });

  test('trends: the pin’s drift toward its minimum, and the history', async () => {
    renderReview();
    const chart = await screen.findByLabelText(/^Pin diameter at P1 · Main pivot/);
    // 59.9 mm → 57.8 mm: 2.1 mm of wear over the three inspections. Measured values are shown as
    // measured (shortest exact form for records without the typed text), the limit as stated.
    expect(chart.props.accessibilityLabel).toMatch(
      /59\.9 mm on 1 Dec 2025 → 57\.8 mm on 2 Jun 2026 \(−2\.1 mm\)/,
    );
    expect(chart.props.accessibilityLabel).toContain('minimum 58 mm; this inspection 57.8 mm');
    fireEvent.press(screen.getByRole('button', { name: 'Show the numbers' }));
    expect(screen.getByText(/\(this one\)$/)).toBeTruthy();
    expect(await screen.findByText('Mara Quill')).toBeTruthy();
    expect(screen.getByText(/Finding 1: crack at the lower gusset \(fix before operation\)$/)).toBeTruthy();
  });

  test('an inspector is turned away', async () => {
    renderReview({ ...supervisor, id: 'u-ins', role: 'inspector' });
    expect(await screen.findByText('Not part of your role')).toBeTruthy();
    expect(requests.some((r) => r.url.pathname.startsWith('/api/inspections'))).toBe(false);
  });

  test('an unknown inspection is said to be missing', async () => {
    renderReview(supervisor, '/review/nope');
    expect(await screen.findByText('Inspection not found')).toBeTruthy();
  });
});
