/**
 * The phone says only what happened: a reading has no measuring method or instrument until the inspector
 * picks them (the methods offered fit the kind of reading), an instrument past its calibration due date
 * cannot be picked and one due within 14 days is flagged, and the inspection is submitted only with the
 * inspection body's declaration, which the record keeps with who made it and when. The register and the
 * declaration reach the phone through the real pull engine into the real device database (in memory).
 * Instruments, ride and people are invented demo data; the calibration rule is ours (README), after the
 * common practice that an instrument past its calibration due date is not used for acceptance checks.
 */
import { Text } from 'react-native';
import { fireEvent, screen, waitFor } from 'expo-router/testing-library';

import { outbox } from '@/db/device/schema';
import { makeQueryClient } from '@/features/api/query-client';
import type { SessionUser } from '@/features/session/schema';
import { loadDraft, saveDraft } from '@/features/device-db/drafts';
import { DeviceDbProvider } from '@/features/device-db/provider';
import { type Draft, newDraft } from '@/features/records/draft';
import { InspectionScreen } from '@/features/inspections/inspection-screen';
import { inspectionRecordSchema } from '@/features/records/schema';
import { measuredWithProblem, nothingChosen } from '@/features/instruments/measured-with';
import { readDeclarationSetting, readInstruments } from '@/features/instruments/device-cache';
import {
  type Instrument,
  calibrationStatus,
  measuredWithWords,
  methodsForKind,
  pastDueAt,
} from '@/features/instruments/schema';
import { addDays, isoDay } from '@/lib/dates';
import { inspectionDetailSchema } from '@/features/review/inspection-schema';
import type { RideSummary } from '@/features/rides/schema';
import type { SyncApi } from '@/features/sync/api';
import { pull } from '@/features/sync/pull';
import { rodDesign } from '@/tests/support/rod-design';

import { type MemoryDeviceDb, memoryDeviceDb } from '@/tests/support/memory-device-db';
import { renderScreens, sessionClient } from '@/tests/support/app-screens';
import { noSignal } from '@/tests/support/stand-in-api';

jest.setTimeout(30_000);

jest.mock('@/features/session/token-store', () => ({
  tokenStore: { get: async () => null, set: async () => {}, clear: async () => {} },
}));
jest.mock('expo-crypto', () => ({
  ...jest.requireActual('expo-crypto'),
  randomUUID: () => jest.requireActual('node:crypto').randomUUID(),
}));
// The load-check charts are not under test here (and their d3 modules need their own set-up in jest).
jest.mock('@/features/loads/cycle-results', () => ({ CycleResults: () => null }));
jest.mock('@/features/sync/use-sync-status', () => ({
  useSyncStatus: () => ({
    waiting: 0,
    photosWaiting: 0,
    currentPhoto: null,
    lastSuccessAt: null,
    lastError: null,
    online: false,
    running: false,
    needsAttention: [],
    photosRefused: [],
    syncNow: async () => {},
    refresh: async () => {},
    retryRecord: async () => {},
    retryPhoto: async () => {},
  }),
}));

const inspector: SessionUser = {
  id: 'u-ins',
  email: 'tobin.reyes@halvard.example',
  name: 'Tobin Reyes',
  role: 'inspector',
  companyId: null,
  companyName: null,
};
const ride: RideSummary = {
  id: 'ride-rod',
  name: 'Test Rod',
  rideClass: 'rotating_arm',
  description: null,
  maker: null,
  model: null,
  serial: null,
  year: null,
  status: 'in_service',
  statusReason: null,
  statusSince: null,
  siteId: null,
  siteName: null,
  operatorCompanyId: 'op-1',
  operatorName: 'Tamsworth Pier Leisure',
};

const today = isoDay(new Date());
const inDays = (n: number) => addDays(today, n);
const instrument = (
  serial: string,
  name: string,
  dueInDays: number,
  patch: Partial<Instrument> = {},
): Instrument => ({
  id: `i-${serial}`,
  name,
  serial,
  method: 'micrometer',
  kinds: ['pin_diameter'],
  calibratedOn: inDays(dueInDays - 365),
  calibrationDueOn: inDays(dueInDays),
  notes: null,
  retiredAt: null,
  createdAt: '2026-01-01T00:00:00.000Z',
  updatedAt: '2026-01-01T00:00:00.000Z',
  ...patch,
});
const register: Instrument[] = [
  instrument('MC-1', 'Outside micrometer 50–75 mm', 200),
  instrument('MC-2', 'Outside micrometer 50–75 mm, spare', 6),
  instrument('MC-3', 'Outside micrometer 50–75 mm, van kit', -2),
  instrument('MC-4', 'Outside micrometer, withdrawn', 100, { retiredAt: '2026-02-01T00:00:00.000Z' }),
  instrument('TC-1', 'Optical tachometer', 100, { method: 'tachometer', kinds: ['speed'] }),
];
const declarationText = 'I inspected this ride in person; this record holds only what I found and measured.';

let dev: MemoryDeviceDb;
let clients: ReturnType<typeof makeQueryClient>[] = [];
let draft: Draft;

beforeEach(async () => {
  dev = await memoryDeviceDb();
  const api: SyncApi = {
    push: async () => {
      throw new Error('not used');
    },
    putPhoto: async () => {},
    registerKey: async () => {},
    pull: async () => ({
      cursor: 'v1:2026-06-03T07:00:00.000Z',
      rides: [ride],
      designs: [
        {
          id: 'dv-1',
          rideId: ride.id,
          version: 1,
          createdAt: '2026-01-01T00:00:00.000Z',
          createdByName: 'Admin',
          reason: 'Test',
          origin: 'seed',
          data: rodDesign(100, 2),
        },
      ],
      instruments: register,
      declaration: { text: declarationText, updatedAt: '2026-01-01T00:00:00.000Z', updatedByName: 'Admin' },
    }),
  };
  const report = await pull(api, dev);
  expect(report.instruments).toBe(register.length);
  draft = newDraft({
    id: jest.requireActual('node:crypto').randomUUID(),
    ride,
    designVersionId: 'dv-1',
    template: null,
    type: 'periodic',
    now: new Date(),
  });
  await saveDraft(dev, { id: draft.id, rideId: ride.id, data: draft });
  noSignal();
});

afterEach(async () => {
  jest.useRealTimers();
  for (const c of clients) c.clear();
  clients = [];
  jest.restoreAllMocks();
  await dev.close();
});

function renderRecording() {
  const queries = sessionClient(inspector, true);
  clients.push(queries);
  const view = renderScreens(
    queries,
    {
      today: () => <Text>Today screen</Text>,
      'inspect/[id]': function Route() {
        const { useLocalSearchParams } = jest.requireActual('expo-router');
        const { id } = useLocalSearchParams();
        return <InspectionScreen id={id as string} />;
      },
    },
    `/inspect/${draft.id}`,
    (slot) => <DeviceDbProvider open={async () => dev}>{slot}</DeviceDbProvider>,
  );
  jest.useRealTimers();
  return view;
}

const savedReadings = async () => (await loadDraft<Draft>(dev, draft.id))?.data.readings ?? [];

describe('a reading on the phone', () => {
  test('has no method or instrument until the inspector picks them, and cannot be kept without them', async () => {
    renderRecording();
    fireEvent.press(await screen.findByRole('radio', { name: 'Readings' }));
    fireEvent.changeText(await screen.findByLabelText(/^Pin diameter/), '59.93');
    // The methods fit a pin diameter, and none is chosen for the inspector.
    const methods = screen
      .getAllByRole('radio')
      .filter((r) =>
        ['Micrometer', 'Gauge (feeler, caliper, angle)', 'Other (say how)'].includes(
          r.props.accessibilityLabel,
        ),
      );
    expect(methods).toHaveLength(3);
    for (const m of methods) expect(m.props.accessibilityState.checked).toBe(false);
    expect(screen.queryByRole('radio', { name: 'Tachometer' })).toBeNull();

    fireEvent.press(screen.getByRole('button', { name: 'Add pin diameter for Rod' }));
    expect(await screen.findByText('Choose how it was measured')).toBeTruthy();
    expect(await savedReadings()).toEqual([]);

    fireEvent.press(screen.getByRole('radio', { name: 'Micrometer' }));
    // The register's micrometers for pins, the retired one left out; nothing chosen yet.
    expect(
      screen.getByLabelText(/^Outside micrometer 50–75 mm, serial MC-1\. Calibrated, next due/),
    ).toBeTruthy();
    const dueSoon = screen.getByLabelText(/serial MC-2\. Calibration due in 6 days/);
    const pastDue = screen.getByLabelText(/serial MC-3\. Calibration past due since .* not to be used/);
    expect(screen.queryByLabelText(/serial MC-4/)).toBeNull();
    expect(pastDue.props.accessibilityState.disabled).toBe(true);
    // The past-due one cannot be chosen.
    fireEvent.press(pastDue);
    expect(pastDue.props.accessibilityState.checked).toBe(false);
    fireEvent.press(screen.getByRole('button', { name: 'Add pin diameter for Rod' }));
    expect(
      await screen.findByText('Choose the instrument, or say none from the register was used'),
    ).toBeTruthy();
    expect(await savedReadings()).toEqual([]);

    // The flagged one may be used: it is in date today.
    fireEvent.press(dueSoon);
    fireEvent.press(screen.getByRole('button', { name: 'Add pin diameter for Rod' }));
    await waitFor(async () => expect(await savedReadings()).toHaveLength(1));
    const [reading] = await savedReadings();
    expect(reading).toMatchObject({
      kind: 'pin_diameter',
      method: 'micrometer',
      instrument: {
        id: 'i-MC-2',
        name: 'Outside micrometer 50–75 mm, spare',
        serial: 'MC-2',
        calibrationDueOn: inDays(6),
      },
    });
    expect(reading.valueSI).toBeCloseTo(0.05993, 9);
    // The next reading starts with nothing chosen again.
    fireEvent.changeText(screen.getByLabelText(/^Pin diameter/), '59.90');
    for (const m of screen.getAllByRole('radio', { name: 'Micrometer' }))
      expect(m.props.accessibilityState.checked).toBe(false);
  });

  test('“None from the register” is recorded as no instrument, never as a guess', async () => {
    renderRecording();
    fireEvent.press(await screen.findByRole('radio', { name: 'Readings' }));
    fireEvent.changeText(await screen.findByLabelText(/^Bushing clearance/), '0.21');
    fireEvent.press(screen.getByRole('radio', { name: 'Gauge (feeler, caliper, angle)' }));
    expect(screen.getByText(/has no gauge \(feeler, caliper, angle\) for this reading/)).toBeTruthy();
    fireEvent.press(screen.getByRole('radio', { name: 'None from the register' }));
    fireEvent.press(screen.getByRole('button', { name: 'Add bushing clearance (diametral) for Rod' }));
    await waitFor(async () => expect(await savedReadings()).toHaveLength(1));
    expect((await savedReadings())[0]).toMatchObject({ method: 'gauge', instrument: null });
  });
});

test('a method the list does not name must be described, and the description is the reading’s note', async () => {
  renderRecording();
  fireEvent.press(await screen.findByRole('radio', { name: 'Readings' }));
  fireEvent.changeText(await screen.findByLabelText(/^Pin diameter/), '59.91');
  fireEvent.press(screen.getByRole('radio', { name: 'Other (say how)' }));
  fireEvent.press(screen.getByRole('radio', { name: 'None from the register' }));
  fireEvent.press(screen.getByRole('button', { name: 'Add pin diameter for Rod' }));
  expect(await screen.findByText('Say how it was measured')).toBeTruthy();
  expect(await savedReadings()).toEqual([]);
  fireEvent.changeText(
    screen.getByLabelText('How it was measured'),
    'Go/no-go ring gauge, 59.90 mm ring passes',
  );
  fireEvent.press(screen.getByRole('button', { name: 'Add pin diameter for Rod' }));
  await waitFor(async () => expect(await savedReadings()).toHaveLength(1));
  expect((await savedReadings())[0]).toMatchObject({
    method: 'other',
    instrument: null,
    note: 'Go/no-go ring gauge, 59.90 mm ring passes',
  });
});

describe('submitting', () => {
  test('needs the declaration ticked; the record keeps its text, who made it and when', async () => {
    renderRecording();
    fireEvent.press(await screen.findByRole('radio', { name: 'Submit' }));
    expect(await screen.findByText(declarationText)).toBeTruthy();
    const submit = screen.getByRole('button', { name: 'Submit inspection' });
    expect(submit).toBeDisabled();
    expect(screen.getByText('The inspection can be submitted once you have ticked the box.')).toBeTruthy();

    const box = screen.getByRole('checkbox', { name: 'I, Tobin Reyes, make this declaration' });
    fireEvent.press(box);
    expect(screen.getByRole('button', { name: 'Submit inspection' })).not.toBeDisabled();
    // Leaving the step withdraws the declaration: it is made at the moment of submitting.
    fireEvent.press(screen.getByRole('radio', { name: 'Readings' }));
    fireEvent.press(screen.getByRole('radio', { name: 'Submit' }));
    expect(await screen.findByRole('button', { name: 'Submit inspection' })).toBeDisabled();

    const before = new Date().toISOString();
    fireEvent.press(screen.getByRole('checkbox', { name: 'I, Tobin Reyes, make this declaration' }));
    fireEvent.press(screen.getByRole('button', { name: 'Submit inspection' }));
    expect(await screen.findByText('Today screen')).toBeTruthy();
    const rows = await dev.db.select().from(outbox).all();
    expect(rows).toHaveLength(1);
    const record = inspectionRecordSchema.parse(JSON.parse(rows[0].json));
    expect(record.declaration).toEqual({
      text: declarationText,
      declaredAt: expect.any(String),
      declaredBy: 'u-ins',
      declaredByName: 'Tobin Reyes',
    });
    expect(record.declaration!.declaredAt >= before).toBe(true);
  });
});

test('a reading whose method an older app filled in must be taken again before submitting', async () => {
  const guessed = {
    id: jest.requireActual('node:crypto').randomUUID(),
    kind: 'clearance' as const,
    joint: 0,
    label: 'Rod: bushing clearance (diametral)',
    valueSI: 0.0002,
    unit: 'mm',
    method: 'dial_indicator' as const,
    spreadSI: null,
    takenAt: new Date().toISOString(),
  };
  const timed = {
    ...guessed,
    id: jest.requireActual('node:crypto').randomUUID(),
    kind: 'period' as const,
    method: 'tap_timer' as const,
    label: 'Rod: period',
  };
  await saveDraft(dev, { id: draft.id, rideId: ride.id, data: { ...draft, readings: [guessed, timed] } });
  renderRecording();
  fireEvent.press(await screen.findByRole('radio', { name: 'Submit' }));
  expect(
    await screen.findByText(
      /How was “Rod: bushing clearance \(diametral\)” measured\? Remove it under Readings/,
    ),
  ).toBeTruthy();
  // The tap timer's own reading says what happened: it is not asked about.
  expect(screen.queryByText(/How was “Rod: period” measured/)).toBeNull();
  fireEvent.press(screen.getByRole('checkbox', { name: 'I, Tobin Reyes, make this declaration' }));
  expect(screen.getByRole('button', { name: 'Submit inspection' })).toBeDisabled();
});

describe('calibration rule', () => {
  test('usable through the due date, refused the day after, flagged within 14 days', () => {
    expect(calibrationStatus('2026-06-10', '2026-06-10')).toEqual({ state: 'due_soon', daysLeft: 0 });
    expect(calibrationStatus('2026-06-10', '2026-06-11')).toEqual({ state: 'past_due', daysPast: 1 });
    expect(calibrationStatus('2026-06-24', '2026-06-10')).toEqual({ state: 'due_soon', daysLeft: 14 });
    expect(calibrationStatus('2026-06-25', '2026-06-10')).toEqual({ state: 'current', daysLeft: 15 });
    expect(calibrationStatus(null, '2026-06-10')).toEqual({ state: 'not_required' });
    // Across a month end and a leap day (2028-02-29 exists).
    expect(calibrationStatus('2028-03-01', '2028-02-28')).toEqual({ state: 'due_soon', daysLeft: 2 });
    // A reading's instant is judged by its UTC date: late on the due date is still in date.
    expect(pastDueAt('2026-06-10', '2026-06-10T23:59:59.999Z')).toBe(false);
    expect(pastDueAt('2026-06-10', '2026-06-11T00:00:00.000Z')).toBe(true);
    expect(pastDueAt('2026-06-10', '2026-06-11T01:00:00+02:00')).toBe(false);
  });

  test('the form refuses a past-due instrument even if the date moved on while it was chosen', () => {
    const chosen = { method: 'micrometer' as const, instrument: register[1], note: '' };
    expect(measuredWithProblem(chosen, today)).toBeNull();
    expect(measuredWithProblem(chosen, inDays(7))).toMatch(/past its calibration due date/);
    expect(measuredWithProblem(nothingChosen, today)).toBe('Choose how it was measured');
  });

  test('the tap timer is never offered as a choice: only the timer itself sets it', () => {
    for (const methods of Object.values(methodsForKind)) {
      expect(methods).not.toContain('tap_timer');
      expect(methods).not.toContain('typed');
    }
  });
});

describe('the phone’s copy and older records', () => {
  test('each pull replaces the register whole: an instrument the server dropped is no longer offered', async () => {
    expect((await readInstruments(dev)).map((i) => i.serial).sort()).toEqual(
      register.map((i) => i.serial).sort(),
    );
    const api: SyncApi = {
      push: async () => {
        throw new Error('not used');
      },
      putPhoto: async () => {},
      registerKey: async () => {},
      pull: async () => ({ cursor: 'v1:2026-06-04T07:00:00.000Z', instruments: [register[0]] }),
    };
    await pull(api, dev);
    expect((await readInstruments(dev)).map((i) => i.serial)).toEqual(['MC-1']);
    // A pull without the declaration keeps the text the phone has.
    expect((await readDeclarationSetting(dev))?.text).toBe(declarationText);
  });

  test('a record made before methods were asked for reads as it did, and its lack of a declaration is no error', () => {
    expect(measuredWithWords({ method: 'typed' })).toBe('Typed in');
    expect(measuredWithWords({ method: 'dial_indicator' })).toBe('Dial indicator');
    expect(measuredWithWords({ method: 'micrometer', instrument: null })).toBe(
      'Micrometer · none from the register',
    );
    const old = inspectionRecordSchema.parse({
      id: '6f1f2a8e-3c1b-4a55-9d0e-2b7c0c1d9e01',
      rideId: ride.id,
      designVersionId: null,
      templateId: null,
      templateVersion: null,
      type: 'periodic',
      startedAt: '2026-03-01T08:00:00.000Z',
      submittedAt: '2026-03-01T09:00:00.000Z',
      checklist: [],
      readings: [
        {
          id: '6f1f2a8e-3c1b-4a55-9d0e-2b7c0c1d9e02',
          kind: 'clearance',
          joint: 0,
          label: 'Clearance',
          valueSI: 0.0002,
          unit: 'mm',
          method: 'typed',
          takenAt: '2026-03-01T08:30:00.000Z',
        },
      ],
      photos: [],
      preview: null,
    });
    expect(old.declaration).toBeUndefined();
    expect(old.readings[0].instrument).toBeUndefined();
    // The review desk's reading of a stored record without the new fields.
    const recordView = inspectionDetailSchema.shape.record.parse(old);
    expect(recordView.declaration).toBeUndefined();
  });
});
