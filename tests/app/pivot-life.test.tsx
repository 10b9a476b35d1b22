/**
 * The ride's Pivot life section and the operator's running log screen. The life is parsed with the API's
 * schema (features/pivot-life/schema.ts); its figures are worked by hand (Palmgren–Miner, EN 1993-1-9:
 * 319 ride cycles × 1e-3 per ride cycle = 0.319 of a limit of 1). Names are the invented demo scenario.
 */
import { render } from '@testing-library/react-native';
import { fireEvent, screen, waitFor, within } from 'expo-router/testing-library';

import { CAUTION_SHORT } from '@/components/caution';
import { PivotLifeBody } from '@/features/pivot-life/pivot-life-section';
import { RunningLogScreen } from '@/features/pivot-life/running-log-screen';
import { rideLifeSchema, type RideLife } from '@/features/pivot-life/schema';
import type { RunningLogResponse } from '@/features/pivot-life/running-log-schema';
import type { SessionUser } from '@/features/session/schema';
import { formatDate } from '@/lib/dates';
import { renderScreens, sessionClient } from '@/tests/support/app-screens';
import { ok, standInApi } from '@/tests/support/stand-in-api';
import { pickDate } from '@/tests/support/pick-date';

jest.mock('@/components/use-wide', () => ({ useWide: () => false }));

// The picked running-log file: expo-document-picker answers with it, and the register's reader reads it.
let mockCsv = '';
jest.mock('expo-document-picker', () => ({
  getDocumentAsync: jest.fn(async () => ({
    canceled: false,
    assets: [{ name: 'twin-comet-june.csv', uri: 'file:///june.csv', size: mockCsv.length }],
  })),
}));
jest.mock('@/features/registry/ui', () => ({
  ...jest.requireActual('@/features/registry/ui'),
  readPickedFile: jest.fn(async () => mockCsv),
}));

const life: RideLife = rideLifeSchema.parse({
  rideId: 'ride-tc',
  asOf: '2026-06-15',
  basis: {
    source: 'inspection',
    inspectionId: 'insp-7',
    submittedAt: '2026-05-20T09:00:00.000Z',
    designVersion: 1,
    rideCycleS: 150,
  },
  log: {
    entries: 3,
    firstDay: '2026-01-10',
    lastDay: '2026-06-14',
    cyclesLogged: 319,
    cyclesPerDay: 219 / 90,
  },
  pivots: [
    {
      joint: 0,
      name: 'Main axle',
      details: [
        {
          detail: 0,
          name: 'Axle in double shear',
          kind: 'pin_shear',
          categoryMPa: 100,
          damagePerRideCycle: 1e-3,
          governingCase: 'operating',
          cyclesLogged: 319,
          damage: 0.319,
          damageLimit: 1,
          lifeUsed: 0.319,
          projectedLimitOn: '2027-03-21',
        },
        {
          detail: 1,
          name: 'Arm lug net section',
          kind: 'lug_net_section',
          categoryMPa: 90,
          damagePerRideCycle: 0,
          governingCase: null,
          cyclesLogged: 319,
          damage: 0,
          damageLimit: 0.5,
          lifeUsed: 0,
          projectedLimitOn: null,
        },
      ],
      wear: [],
      ndt: [
        {
          method: 'MT',
          intervalDays: 365,
          lastOn: '2025-05-01',
          lastResult: 'no_indications',
          dueOn: '2026-05-01',
          state: 'overdue',
        },
      ],
      pin: {
        forceN: 120_000,
        diameterM: 0.09,
        shear: 0.31,
        bearing: 0.22,
        bending: 0.48,
        combined: 0.33,
        bearingService: null,
        bendingService: null,
      },
    },
    {
      joint: 1,
      name: 'Gondola hanger',
      details: [
        {
          detail: 2,
          name: 'Hanger weld toe',
          kind: 'weld_toe',
          categoryMPa: 71,
          damagePerRideCycle: 4e-3,
          governingCase: 'service_stop',
          cyclesLogged: 319,
          damage: 1.276,
          damageLimit: 1,
          lifeUsed: 1.276,
          projectedLimitOn: '2026-06-15',
        },
      ],
      wear: [],
      ndt: [],
      pin: null,
    },
  ],
});

describe('the Pivot life section', () => {
  test('per pivot: life used as a figure, a bar and a mark, the projected date, the basis and the log', () => {
    render(<PivotLifeBody life={life} />);
    const axle = screen.getByLabelText('Fatigue detail Axle in double shear');
    expect(within(axle).getByText('31.9 %')).toBeTruthy();
    expect(within(axle).getByRole('progressbar', { name: 'Life used 31.9 %' })).toBeTruthy();
    expect(within(axle).getByText('Within')).toBeTruthy();
    expect(within(axle).getByText(formatDate('2027-03-21'))).toBeTruthy();
    expect(within(axle).getByText(/mostly from the operating cycle/)).toBeTruthy();
    // No damage per ride cycle: no date, and the reason is given.
    const lug = screen.getByLabelText('Fatigue detail Arm lug net section');
    expect(within(lug).getByText('no damage at these stress ranges')).toBeTruthy();
    // Past its limit: the mark says so in words, not in colour only.
    const weld = screen.getByLabelText('Fatigue detail Hanger weld toe');
    expect(within(weld).getByText('Over limit')).toBeTruthy();
    expect(within(weld).getByText(`limit reached (${formatDate('2026-06-15')})`)).toBeTruthy();

    // The pivot's other parts: its NDT due (E's rows) and its EN 1993-1-8 pin checks (D's rows).
    const axlePivot = screen.getByLabelText('Pivot Main axle');
    expect(within(axlePivot).getByLabelText('NDT due')).toBeTruthy();
    expect(within(axlePivot).getByLabelText(/^Pin checks, /)).toBeTruthy();
    expect(screen.getByText(/from the inspection submitted/)).toBeTruthy();
    expect(
      screen.getByText(/3 days, .* 319 ride cycles \(ride cycle 150 s\); 2\.43 ride cycles a day/),
    ).toBeTruthy();
  });

  test('the standards are named, the assumptions said and the caution shown', () => {
    render(<PivotLifeBody life={life} />);
    expect(screen.getByText(/ASTM E1049-85/)).toBeTruthy();
    expect(screen.getAllByText(/EN 1993-1-9/).length).toBeGreaterThan(0);
    expect(screen.getAllByText(/EN 1993-1-8/).length).toBeGreaterThan(0);
    expect(screen.getByText(/that analysis’s rate is applied to the whole log/)).toBeTruthy();
    expect(screen.getByText(CAUTION_SHORT)).toBeTruthy();
  });

  test('the compact form keeps the figures, the dates and the caution', () => {
    render(<PivotLifeBody life={life} compact />);
    expect(screen.getByText('31.9 %')).toBeTruthy();
    expect(screen.getByText(formatDate('2027-03-21'))).toBeTruthy();
    expect(screen.queryByLabelText('Assumptions')).toBeNull();
    expect(screen.getByText(CAUTION_SHORT)).toBeTruthy();
  });
});

const operator: SessionUser = {
  id: 'u-op',
  email: 'operator@pivotwatch.test',
  name: 'Priya Castellan',
  role: 'operator',
  companyId: 'co-tpl',
  companyName: 'Tamsworth Pier Leisure',
};

const logAnswer: RunningLogResponse = {
  rideId: 'ride-tc',
  rideName: 'Twin Comet',
  entries: [
    {
      id: 'l-2',
      rideId: 'ride-tc',
      day: '2026-06-14',
      cycles: 123,
      enteredBy: 'u-op',
      enteredByName: 'Priya Castellan',
      enteredAt: '2026-06-14T19:00:00.000Z',
      source: 'typed',
    },
    {
      id: 'l-1',
      rideId: 'ride-tc',
      day: '2026-06-01',
      hours: 4,
      note: 'Rain, closed early',
      enteredBy: 'u-op',
      enteredByName: 'Priya Castellan',
      enteredAt: '2026-06-01T19:00:00.000Z',
      source: 'csv',
    },
  ],
  totals: { days: 2, cycles: 123, hours: 4, rideCycles: 219, rideCycleS: 150, cyclesPerDay: 219 / 14 },
};

describe('the running log screen', () => {
  function open() {
    const api = standInApi({
      '/api/rides/ride-tc/running-log': (call) =>
        call.method === 'POST'
          ? (call.body as { cycles?: number }).cycles === 999
            ? {
                status: 400,
                body: {
                  error: {
                    code: 'validation_failed',
                    message: 'Some fields are missing or invalid.',
                    issues: [{ path: 'day', message: 'A day not yet run' }],
                  },
                },
              }
            : {
                status: 201,
                body: {
                  replaced: false,
                  entry: { ...logAnswer.entries[0], id: 'l-3', day: '2026-06-15', cycles: 88 },
                },
              }
          : ok(logAnswer),
    });
    renderScreens(sessionClient(operator), { 'rides/[id]/log': RunningLogScreen }, '/rides/ride-tc/log');
    return api;
  }

  test('the log newest first with its totals; hours are converted at the ride cycle time', async () => {
    open();
    const list = await screen.findByLabelText('The log');
    expect(within(list).getByText(/2 days · 219 ride cycles/)).toBeTruthy();
    const days = within(list).getAllByLabelText(/^Logged /);
    expect(days.map((d) => d.props.accessibilityLabel)).toEqual(['Logged 2026-06-14', 'Logged 2026-06-01']);
    expect(within(list).getByText(/Rain, closed early · Priya Castellan · from a CSV file/)).toBeTruthy();
    fireEvent.press(screen.getByRole('radio', { name: 'Hours run' }));
    expect(screen.getByText('Counted at one ride cycle per 150 s of running.')).toBeTruthy();
  });

  test('a day is saved with what was typed; a bad number is stopped before it is sent', async () => {
    const api = open();
    await screen.findByLabelText('The log');
    pickDate('Day', '2026-06-15');
    fireEvent.changeText(screen.getByLabelText('Ride cycles run'), '12.5');
    fireEvent.press(screen.getByRole('button', { name: 'Save day' }));
    expect(await screen.findByText('Must be a whole number')).toBeTruthy();
    expect(api.callsTo('POST', '/api/rides/ride-tc/running-log')).toHaveLength(0);

    fireEvent.changeText(screen.getByLabelText('Ride cycles run'), '88');
    fireEvent.changeText(screen.getByLabelText('Note (optional)'), 'School trip');
    fireEvent.press(screen.getByRole('button', { name: 'Save day' }));
    await waitFor(() => expect(api.callsTo('POST', '/api/rides/ride-tc/running-log')).toHaveLength(1));
    expect(api.callsTo('POST', '/api/rides/ride-tc/running-log')[0].body).toEqual({
      day: '2026-06-15',
      cycles: 88,
      note: 'School trip',
    });
    expect(await screen.findByText(/Saved .*: 88 cycles\./)).toBeTruthy();
  });

  test('the server’s refusal is shown at its field', async () => {
    open();
    await screen.findByLabelText('The log');
    pickDate('Day', '2026-06-15');
    fireEvent.changeText(screen.getByLabelText('Ride cycles run'), '999');
    fireEvent.press(screen.getByRole('button', { name: 'Save day' }));
    expect(await screen.findByText('A day not yet run')).toBeTruthy();
  });

  test('a CSV import shows its steps, the days counted as this device reads them, until the server answers', async () => {
    // RFC 4180 rows under the documented header (features/pivot-life/running-log-csv.ts).
    mockCsv = 'day,cycles,hours,note\n2026-06-02,120,,\n2026-06-03,96,,"Wind, closed at 6"\n';
    let release = () => {};
    const held = new Promise<void>((r) => (release = r));
    const api = standInApi({
      '/api/rides/ride-tc/running-log': () => ok(logAnswer),
      '/api/rides/ride-tc/running-log/import': async () => {
        await held;
        return { status: 201, body: { saved: 2, replaced: 0 } };
      },
    });
    renderScreens(sessionClient(operator), { 'rides/[id]/log': RunningLogScreen }, '/rides/ride-tc/log');
    await screen.findByLabelText('The log');
    fireEvent.press(screen.getByRole('button', { name: 'Choose a CSV file' }));
    const bar = await screen.findByRole('progressbar', { name: 'Importing the running log' });
    expect(bar.props['aria-valuenow']).toBe(1);
    expect(bar.props['aria-valuemax']).toBe(2);
    expect(screen.getByText('The server is checking and saving 2 days (step 2 of 2)')).toBeTruthy();
    expect(api.callsTo('POST', '/api/rides/ride-tc/running-log/import')[0].body).toEqual({ csv: mockCsv });
    release();
    expect(await screen.findByText(/twin-comet-june\.csv: 2 days saved\./)).toBeTruthy();
    expect(screen.queryByRole('progressbar', { name: 'Importing the running log' })).toBeNull();
  });

  test('a day already logged says that saving replaces it', async () => {
    open();
    await screen.findByLabelText('The log');
    pickDate('Day', '2026-06-14');
    expect(screen.getByText('Already logged: 123 cycles. Saving replaces it.')).toBeTruthy();
  });
});
