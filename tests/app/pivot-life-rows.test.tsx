/**
 * A pivot's wear rows and pin-check rows as the ride page shows them. The numbers come from the engine
 * (features/fatigue/wear-trend.ts, features/loads/engine/pin-checks.ts) on the hand-worked examples of
 * tests/engine/wear-trend.test.ts (least squares and its prediction interval, Montgomery & Runger §11.7,
 * from memory) and tests/engine/pin-checks.test.ts (EN 1993-1-8 Table 3.10); here they must read right, in
 * words as well as marks.
 */
import { render, screen } from '@testing-library/react-native';

import { checkPin, pinUtilisations } from '@/features/loads/engine';
import { projectWear } from '@/features/fatigue/wear-trend';
import { PinCheckRows } from '@/features/pivot-life/pin-check-rows';
import { WearRows } from '@/features/pivot-life/wear-rows';

const dates = ['2026-01-05', '2026-02-04', '2026-03-06', '2026-04-05', '2026-05-05'];
const w = [0, 10, 25, 32, 50];
const readings = dates.map((on, i) => ({ on, valueM: 0.06 - w[i] * 1e-6, cycles: null }));
const base = {
  quantity: 'pin_diameter' as const,
  readings,
  limitM: 0.0599,
  today: '2026-05-10',
  nextInspectionOn: '2026-09-01',
};

test('a flagged diameter trend: latest against its minimum, trend, projected and cautious dates, the flag in words', () => {
  render(<WearRows trends={[projectWear(base)]} system="si" />);
  expect(screen.getByText('Pin diameter')).toBeTruthy();
  // Latest 59.950 mm on 5 May 2026 against the 59.900 mm minimum.
  expect(screen.getByText(/59\.95 mm on 5 May 2026 · minimum 59\.9 ?mm/)).toBeTruthy();
  // −0.406667 µm a day = −0.0004067 mm.
  expect(screen.getByText(/−0\.0004067 mm a day/)).toBeTruthy();
  expect(screen.getByText(/10 Sept? 2026/)).toBeTruthy();
  expect(screen.getByText(/31 Jul 2026 \(95 % prediction bound\)/)).toBeTruthy();
  expect(screen.getByText('▲ FLAGGED')).toBeTruthy();
  expect(
    screen.getByText(
      /limit may be reached before the next inspection \(1 Sept? 2026\)\. Inspect by 17 Jul 2026\./,
    ),
  ).toBeTruthy();
});

test('two readings: the line’s date, and no interval said in words; a trend away from the limit has no dates', () => {
  const two = projectWear({ ...base, readings: [readings[0], readings[4]], nextInspectionOn: '2026-08-01' });
  const away = projectWear({
    ...base,
    quantity: 'clearance',
    limitM: 0.0008,
    readings: readings.map((r) => ({ ...r, valueM: 0.0006 - (0.06 - r.valueM) })),
  });
  render(<WearRows trends={[two, away]} system="si" />);
  expect(screen.getByText(/no interval from two readings/)).toBeTruthy();
  // Reached on 2 Sep 2026 by the line, after the inspection on 1 Aug: not flagged.
  expect(screen.getByText(/2 Sept? 2026/)).toBeTruthy();
  expect(screen.queryByText('▲ FLAGGED')).toBeNull();
  expect(screen.getByText('The trend runs away from the limit: no date projected.')).toBeTruthy();
});

test('no readings yet', () => {
  render(<WearRows trends={[]} system="si" />);
  expect(screen.getByText('No pin diameter or clearance readings yet.')).toBeTruthy();
});

test('pin checks: each utilisation with its mark and formula, the standard and the partial factors named', () => {
  const MPa = 1e6;
  const pinCheck = {
    pinGrade: 'pin steel',
    pinFyPa: 460 * MPa,
    pinFuPa: 600 * MPa,
    plateGrade: 'S355',
    plateFyPa: 355 * MPa,
    innerPlateM: 0.04,
    outerPlateM: 0.025,
    gapM: 0.005,
    replaceable: true,
  };
  const pin = pinUtilisations(checkPin(400_000, 0.06, 'double', pinCheck));
  render(<PinCheckRows pin={pin} pinCheck={pinCheck} system="si" />);
  expect(screen.getByText('PIN CHECKS · EN 1993-1-8 TABLE 3.10')).toBeTruthy();
  // Hand values (tests/engine/pin-checks.test.ts): 0.245609, 0.312989, 0.375889, 0.201617, 0.782473, 0.704792.
  for (const [key, shown] of [
    ['shear', '24.6 %'],
    ['bearing', '31.3 %'],
    ['bending', '37.6 %'],
    ['combined', '20.2 %'],
    ['bearing_ser', '78.2 %'],
    ['bending_ser', '70.5 %'],
  ])
    expect(screen.getByTestId(`pin-check-${key}`)).toHaveTextContent(
      new RegExp(`${shown.replace('.', '\\.')}Within`),
    );
  expect(screen.getByText(/0\.6·A·f_up \/ γM2/)).toBeTruthy();
  // The envelope's form of the combined check: the load at √0.201617 = 44.9 % of the load that reaches 1.
  expect(screen.getByText(/the load is at 44\.9 % of the load that brings it to 1/)).toBeTruthy();
  expect(screen.getByText(/Partial factors γM0 = 1, γM2 = 1\.25, γM6,ser = 1, γF = 1\./)).toBeTruthy();
  expect(screen.getByText(/400\.0 kN, pin diameter 60 mm/)).toBeTruthy();
});

test('a pin over its bending resistance reads Over limit in words', () => {
  const pin = pinUtilisations(
    checkPin(100_000, 0.04, 'single', {
      pinGrade: 'S355',
      pinFyPa: 355e6,
      pinFuPa: 510e6,
      plateGrade: 'S275',
      plateFyPa: 275e6,
      innerPlateM: 0.03,
      outerPlateM: 0.02,
      gapM: 0.002,
      gammaF: 1.5,
    }),
  );
  render(<PinCheckRows pin={pin} system="si" />);
  // 1.210474 (tests/engine/pin-checks.test.ts, single shear).
  expect(screen.getByTestId('pin-check-bending')).toHaveTextContent(/121 %Over limit/);
  expect(screen.getByText(/\(the standard’s recommended values\)/)).toBeTruthy();
});
