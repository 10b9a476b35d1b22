/**
 * The readings entry asks before a motion reading far from the design motion counts (outside 0.5×–1.5×
 * of the joint's design rate or amplitude: the product owner's rule, issue 11). The ride is the demo
 * pendulum Skylark (design swing 9.5 s, 110° each side; invented demo data); the period of 2.42 s is the
 * issue's own case, 9.5 / 2.42 = 3.93 × the design rate.
 */
import { fireEvent, render, screen } from '@testing-library/react-native';
import { Pressable, Text } from 'react-native';

import type { Draft } from '@/features/records/draft';
import { ReadingsSection } from '@/features/inspections/readings-section';
import type { Reading } from '@/features/records/schema';
import { storedAnalysisSchema } from '@/features/review/inspection-schema';
import { ConfirmedOutOfRange } from '@/features/review/readings-table';
import { skylarkDesign } from '@/server/seed/demo-design';

jest.mock('expo-crypto', () => {
  let n = 0;
  return { randomUUID: () => `00000000-0000-4000-8000-${String(++n).padStart(12, '0')}` };
});

const draft: Draft = {
  id: 'd1',
  rideId: 'r1',
  rideName: 'Skylark',
  designVersionId: 'v1',
  templateId: null,
  templateVersion: null,
  type: 'periodic',
  startedAt: '2026-12-03T08:00:00.000Z',
  updatedAt: '2026-12-03T08:00:00.000Z',
  checklist: [],
  readings: [],
  photos: [],
  notes: '',
};

/** A stand-in for the tap timer: hands over a fixed period, as "Use this value" would. */
function renderWithTimer(periodS: number) {
  const onAdd = jest.fn<void, [Reading]>();
  render(
    <ReadingsSection
      draft={draft}
      design={skylarkDesign}
      system="si"
      onAdd={onAdd}
      onRemove={() => undefined}
      renderTimer={(onUse) => (
        <Pressable accessibilityRole="button" onPress={() => onUse(periodS, 0.03)}>
          <Text>Use the timed period</Text>
        </Pressable>
      )}
    />,
  );
  fireEvent.press(screen.getAllByRole('button', { name: 'Time it with taps' })[0]);
  fireEvent.press(screen.getByRole('button', { name: 'Use the timed period' }));
  return onAdd;
}

test('the period entry shows what one swing is', () => {
  renderWithTimer(9.4);
  expect(screen.getAllByText('One swing = there and back').length).toBeGreaterThan(0);
});

test('a timed period near the design goes straight in, with no question', () => {
  const onAdd = renderWithTimer(9.4);
  expect(onAdd).toHaveBeenCalledTimes(1);
  expect(onAdd.mock.calls[0][0].plausibility).toBeUndefined();
  expect(screen.queryByText(/Far from the design motion/)).toBeNull();
});

test('a timed period far from the design waits for an answer; kept, it carries the confirmation', () => {
  const onAdd = renderWithTimer(2.42);
  expect(onAdd).not.toHaveBeenCalled();
  expect(screen.getByText('Far from the design motion: check before it counts')).toBeTruthy();
  expect(screen.getByText(/3\.93 × the design rate \(design period 9\.50 s\)/)).toBeTruthy();

  fireEvent.changeText(
    screen.getByLabelText('Why this value is right (optional)'),
    '  Operator had the ride on its short test programme ',
  );
  fireEvent.press(screen.getByRole('button', { name: 'Keep this value' }));
  expect(onAdd).toHaveBeenCalledTimes(1);
  const r = onAdd.mock.calls[0][0];
  expect(r).toMatchObject({ kind: 'period', joint: 0, valueSI: 2.42, method: 'tap_timer' });
  expect(r.plausibility).toMatchObject({
    designSI: 9.5,
    note: 'Operator had the ride on its short test programme',
  });
  expect(r.plausibility!.ratio).toBeCloseTo(9.5 / 2.42, 12);
  expect(Number.isNaN(Date.parse(r.plausibility!.confirmedAt))).toBe(false);
  expect(screen.queryByText(/Far from the design motion/)).toBeNull();
});

test('"Measure again" drops the value and opens the timer again', () => {
  const onAdd = renderWithTimer(4.75);
  // 4.75 s is half the design period: one pass timed instead of there and back.
  expect(screen.getByText(/2\.00 × the design rate/)).toBeTruthy();
  fireEvent.press(screen.getByRole('button', { name: 'Measure again' }));
  expect(onAdd).not.toHaveBeenCalled();
  expect(screen.queryByText(/Far from the design motion/)).toBeNull();
  expect(screen.getByRole('button', { name: 'Use the timed period' })).toBeTruthy();
});

test('a typed amplitude far from the design asks too (30° against 110° each side = 0.27×)', () => {
  const onAdd = jest.fn<void, [Reading]>();
  render(
    <ReadingsSection
      draft={draft}
      design={skylarkDesign}
      system="si"
      onAdd={onAdd}
      onRemove={() => undefined}
    />,
  );
  fireEvent.changeText(screen.getAllByLabelText('Swing amplitude (each side)')[0], '30');
  fireEvent.press(screen.getAllByRole('radio', { name: /^Gauge/ })[0]);
  fireEvent.press(screen.getAllByRole('radio', { name: 'None from the register' })[0]);
  fireEvent.press(screen.getAllByRole('button', { name: /^Add swing amplitude/ })[0]);
  expect(onAdd).not.toHaveBeenCalled();
  expect(screen.getByText(/0\.27 × the design amplitude \(design amplitude 110\.0°\)/)).toBeTruthy();
  fireEvent.press(screen.getByRole('button', { name: 'Keep this value' }));
  expect(onAdd).toHaveBeenCalledTimes(1);
  expect(onAdd.mock.calls[0][0]).toMatchObject({ kind: 'amplitude', method: 'gauge' });
  expect(onAdd.mock.calls[0][0].plausibility?.ratio).toBeCloseTo(30 / 110, 12);
});

describe('on the review desk', () => {
  const base = {
    engineVersion: '1',
    designVersionId: 'v1',
    designVersion: 1,
    status: null,
    durationS: 9.5,
    samples: 360,
    joints: [],
    seats: [],
    envelope: [],
    server: { engineVersion: '1', status: null, peakForceN: [] },
    device: null,
    differences: [],
  };
  const confirmed = {
    readingId: 'r1',
    label: 'Main arm: period',
    kind: 'period' as const,
    valueSI: 2.42,
    designSI: 9.5,
    ratio: 9.5 / 2.42,
    confirmedAt: '2026-12-03T08:11:00.000Z',
    note: 'Short test programme',
    usedByLoadCheck: true,
  };

  test('analyses stored before the rule parse without the list; a damaged list is dropped, not fatal', () => {
    expect(storedAnalysisSchema.parse(base).confirmedOutOfRange).toBeUndefined();
    expect(
      storedAnalysisSchema.parse({ ...base, confirmedOutOfRange: 'x' }).confirmedOutOfRange,
    ).toBeUndefined();
    expect(
      storedAnalysisSchema.parse({ ...base, confirmedOutOfRange: [confirmed] }).confirmedOutOfRange,
    ).toEqual([confirmed]);
  });

  test('the supervisor sees which kept value the load check rests on, how far off it is, and why it was kept', () => {
    render(
      <ConfirmedOutOfRange items={[confirmed, { ...confirmed, readingId: 'r0', usedByLoadCheck: false }]} />,
    );
    expect(screen.getByText('The inspector kept 2 readings far from the design motion')).toBeTruthy();
    expect(
      screen.getByText(
        'Main arm: period: 3.93 × the design rate (design period 9.50 s) · used by this load check · “Short test programme”',
      ),
    ).toBeTruthy();
    expect(screen.getByText(/replaced by a later reading/)).toBeTruthy();
  });
});
