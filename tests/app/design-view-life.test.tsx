/**
 * The design view's pin-check, NDT and fatigue sections, on a phone and on a desktop, in SI and US units.
 * Unit factors from outside definitions: 1 ksi = 6.894757 MPa and 1 kip = 4.448222 kN (NIST SP 811,
 * appendix B), 1 in = 25.4 mm exactly. The rides are the invented demo scenario.
 */
import { render, screen } from '@testing-library/react-native';

import type { DesignData } from '@/features/loads/design-schema';
import { DesignTables } from '@/features/registry/design-view';
import { littleKiteDesign, tidebreakerDesign } from '@/server/seed/demo-design';

let mockWide = false;
jest.mock('@/components/use-wide', () => ({ useWide: () => mockWide }));

const shown = (text: string | RegExp) => screen.getAllByText(text).length > 0;

describe.each([
  ['phone', false],
  ['desktop', true],
])('on a %s', (_name, wide) => {
  beforeEach(() => {
    mockWide = wide;
  });

  test('pin checks: steel grades with f_y and f_u, plates and gap, partial factors with the defaults marked', () => {
    render(<DesignTables data={littleKiteDesign} system="si" />);
    expect(shown('PIN CHECKS (EN 1993-1-8 §3.13)')).toBe(true);
    // Little Kite's 90 mm pin: 42CrMo4+QT at f_y 650 / f_u 900 MPa; S355 plates up to 40 mm: 345 MPa.
    expect(shown('42CrMo4+QT\nf_y 650 MPa · f_u 900 MPa')).toBe(true);
    expect(shown('S355 · f_y 345 MPa')).toBe(true);
    expect(shown('lug 35 mm · cheeks 2 × 25 mm · gap 3 mm')).toBe(true);
    expect(shown('γM0 1* · γM2 1.25* · γM6,ser 1* · γF 1*')).toBe(true);
  });

  test('NDT plans per pivot: method in letters and words, the interval, where', () => {
    render(<DesignTables data={tidebreakerDesign} system="si" />);
    expect(shown('NDT PLANS')).toBe(true);
    expect(screen.getAllByText('MT · Magnetic particle testing')).toHaveLength(3);
    expect(screen.getAllByText('UT · Ultrasonic testing')).toHaveLength(2);
    expect(shown('every 730 days (2 years)')).toBe(true);
    expect(shown('Bracket welds and lug')).toBe(true);
  });

  test('fatigue: ride cycle, stops, and each detail with its load, frame, stress per load, category and factors', () => {
    render(<DesignTables data={littleKiteDesign} system="si" />);
    expect(shown('FATIGUE (EN 1993-1-9)')).toBe(true);
    expect(shown('120 s of the design motion')).toBe(true);
    expect(shown('Weld toe at the tower hub')).toBe(true);
    expect(shown('Vertical force on the ground (global x, y)')).toBe(true);
    expect(shown('Force along Arm and gondola (carried body, its frame)')).toBe(true);
    // A 90 mm pin in double shear: A = π·90²/4 = 6362 mm², 1000 / (2 × 6362) = 0.0786 MPa per kN.
    expect(shown('6362 mm², 2 planes → 0.0786 MPa/kN')).toBe(true);
    expect(shown('100 (Δτ_C 100 MPa)\nShear: m = 5 to 10⁸')).toBe(true);
    expect(shown('71 (Δσ_C 71 MPa)\nDirect: m = 3 to 5×10⁶, then 5 to 10⁸')).toBe(true);
    expect(shown('γFf 1* · γMf 1.15')).toBe(true);
  });
});

test('US units: strengths in ksi, thicknesses in inches, stress per load in ksi per kip', () => {
  mockWide = true;
  render(<DesignTables data={littleKiteDesign} system="us" />);
  // 650 MPa / 6.894757 = 94.27 ksi; 900 MPa = 130.5 ksi; 345 MPa = 50.04 ksi.
  expect(shown('42CrMo4+QT\nf_y 94.27 ksi · f_u 130.5 ksi')).toBe(true);
  expect(shown('S355 · f_y 50.04 ksi')).toBe(true);
  // 35 mm / 25.4 = 1.378 in; 25 mm = 0.9843 in; 3 mm = 0.1181 in.
  expect(shown('lug 1.378 in · cheeks 2 × 0.9843 in · gap 0.1181 in')).toBe(true);
  // 0.8 MPa/kN × 4.448222 / 6.894757 = 0.516 ksi/kip; 6362 mm² / 645.16 = 9.861 in².
  expect(shown('0.516 ksi/kip')).toBe(true);
  expect(shown('9.861 in², 2 planes → 0.0507 ksi/kip')).toBe(true);
  // The category keeps its name (its MPa number) and shows its value converted: 71 MPa = 10.30 ksi (four figures, as every converted value).
  expect(shown(/^71 \(Δσ_C 10\.30 ksi\)\s/)).toBe(true);
});

test('design data without pin checks, NDT plans or fatigue says so instead of an empty table', () => {
  mockWide = false;
  const { fatigue: _fatigue, ...rest } = littleKiteDesign;
  const bare: DesignData = { ...rest, pivots: rest.pivots.map(({ pinCheck: _p, ndt: _n, ...p }) => p) };
  render(<DesignTables data={bare} system="si" />);
  expect(shown('No pin and plate data given: the EN 1993-1-8 pin checks are not made.')).toBe(true);
  expect(shown('No NDT plans given: no NDT falls due.')).toBe(true);
  expect(shown('No fatigue data given: damage per ride cycle and life used are not computed.')).toBe(true);
});
