/**
 * The load calculator with real motion: a measured record pasted for the arm (a rate record in rpm with
 * seeded noise, as a phone's gyroscope gives), a free gondola let go from 20°, and an emergency stop. The
 * record is read as it is pasted (a bad line is named before anything runs), the result shows the
 * engine's notes (the period the gondola swings at) with the caution, and the stop appears as its own
 * case. The physics behind the numbers is checked in tests/engine/calculator-model.test.ts; the bodies are
 * the calculator's own example (round numbers, not a real ride).
 */
import { fireEvent, screen, within } from 'expo-router/testing-library';

import { CalculatorScreen } from '@/features/calculator/calculator-screen';
import type { SessionUser } from '@/features/session/schema';

import { renderScreens, sessionClient } from '@/tests/support/app-screens';
import { ok, standInApi } from '@/tests/support/stand-in-api';

jest.setTimeout(60_000);

jest.mock('@/features/session/token-store', () => ({
  tokenStore: { get: async () => null, set: async () => {}, clear: async () => {} },
}));

const inspector: SessionUser = {
  id: 'u-ins',
  email: 'tobin.reyes@halvard.example',
  name: 'Tobin Reyes',
  role: 'inspector',
  companyId: null,
  companyName: null,
};

/** A steady 8 rpm with a little seeded noise (mulberry32 + Box–Muller), 10 s at 50 Hz, as a logger writes it. */
function noisyRateRecord(): string {
  let s = 7;
  const uniform = () => {
    s = (s + 0x6d2b79f5) >>> 0;
    let t = s;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  const noise = () => Math.sqrt(-2 * Math.log(1 - uniform())) * Math.cos(2 * Math.PI * uniform());
  const lines = ['time_s;rate_rpm'];
  for (let k = 0; k <= 500; k++) lines.push(`${(k / 50).toFixed(2)};${(8 + 0.1 * noise()).toFixed(3)}`);
  return lines.join('\n');
}

afterEach(() => jest.restoreAllMocks());

function open() {
  standInApi({ '/api/rides': () => ok({ rides: [] }) });
  renderScreens(sessionClient(inspector), { loads: CalculatorScreen }, '/loads');
  fireEvent.press(screen.getByRole('radio', { name: 'Enter bodies' }));
}

test('a pasted record with a bad line is refused by line before the check runs', async () => {
  open();
  const arm = screen.getByLabelText('Joint 1 · Arm motion');
  fireEvent.press(within(arm).getByRole('radio', { name: 'Measured' }));
  fireEvent.changeText(screen.getByLabelText('Record: time (s), then the value'), 't,a\n0,1\n0.1,2\n0.2,x\n');
  expect(screen.getByText('Line 4 is not two numbers: “0.2,x”')).toBeTruthy();
  fireEvent.press(screen.getByRole('button', { name: 'Run load check' }));
  expect(await screen.findByText('Check these inputs')).toBeTruthy();
  expect(screen.getByText(/^Joint 1 · measured record: Line 4 is not two numbers/)).toBeTruthy();
  expect(screen.queryByText(/pivot loads over the cycle/i)).toBeNull();
});

test('a measured arm, a free gondola and an emergency stop: notes, the period and the stop case are shown', async () => {
  open();
  const arm = screen.getByLabelText('Joint 1 · Arm motion');
  fireEvent.press(within(arm).getByRole('radio', { name: 'Measured' }));
  fireEvent.press(screen.getByRole('radio', { name: 'Rate (rpm)' }));
  fireEvent.changeText(screen.getByLabelText('Record: time (s), then the value'), noisyRateRecord());
  // The record is read as pasted: 501 samples over 10 s, one header line skipped.
  expect(
    screen.getByText(/^501 samples over 10(\.0+)? s, about 50(\.0+)? Hz · 1 header line skipped$/),
  ).toBeTruthy();
  fireEvent.changeText(screen.getAllByLabelText('Emergency stop')[0], '0.5');

  const gondola = screen.getByLabelText('Joint 2 · Gondola motion');
  fireEvent.press(within(gondola).getByRole('radio', { name: 'Free swing' }));
  fireEvent.changeText(screen.getByLabelText('Start angle'), '20');

  fireEvent.press(screen.getByRole('button', { name: 'Run load check' }));
  expect(await screen.findByText(/pivot loads over the cycle/i, {}, { timeout: 30_000 })).toBeTruthy();
  expect(screen.queryByText('Check these inputs')).toBeNull();
  // The engine's notes on how it computed this (at least the free swing's period) come with the result.
  expect(screen.getByLabelText('How this result was computed')).toBeTruthy();
  expect(screen.getByText(/^Pivot 2 · Gondola swings freely: /)).toBeTruthy();
  // A free pin carries no torque: said in words, not as the integrator's round-off (peak and range).
  expect(screen.getAllByText('None: free pin')).toHaveLength(2);
  // The stop is its own case beside the ride cycle.
  expect(screen.getByText(/ride cycle and stops/i)).toBeTruthy();
  expect(screen.getAllByText(/Emergency stop/).length).toBeGreaterThan(0);
  expect(screen.getByText(/SAFETY CAUTION/)).toBeTruthy();
});
