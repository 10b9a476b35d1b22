/**
 * The pin checks of EN 1993-1-8 Table 3.10 in the design-envelope table the phone's load check and the
 * review desk both show: each check on its own line naming the standard and the partial factor, its
 * design effect against its design resistance, the share used and the case it comes from. The values are
 * the engine's (tests/engine/pin-checks.test.ts checks them against a hand-worked example); the merged
 * envelope holds each check at the peak force over the load cases.
 */
import { render, screen, within } from '@testing-library/react-native';

import { designToCycleInput, type DesignData } from '@/features/loads/design-schema';
import { EnvelopeTable } from '@/features/loads/envelope-table';
import { analyseLoadCases, designStops } from '@/features/loads/load-cases';

import { rodDesign } from '@/tests/support/rod-design';

test('each Table 3.10 check is a line with the standard, its effect against its resistance and its case', () => {
  const d: DesignData = rodDesign(400, 5);
  d.pivots[0] = {
    ...d.pivots[0],
    pinCheck: {
      pinGrade: 'pin steel',
      pinFyPa: 460e6,
      pinFuPa: 600e6,
      plateGrade: 'S355',
      plateFyPa: 355e6,
      innerPlateM: 0.04,
      outerPlateM: 0.025,
      gapM: 0.005,
    },
  };
  d.motion[0] = { ...d.motion[0], emergencyDecelRadS2: 2 };
  const cases = analyseLoadCases(designToCycleInput(d), designStops(d));
  render(<EnvelopeTable items={cases.envelope} system="si" />);
  const table = screen.getByLabelText('Design envelope');
  for (const words of [
    'Rod: pin shear per plane, γM2 (EN 1993-1-8 Table 3.10)',
    'Rod: pin bearing, inner plate, γM0 (EN 1993-1-8 Table 3.10)',
    'Rod: pin bending, γM0 (EN 1993-1-8 Table 3.10)',
    'Rod: pin shear + bending interaction, as load (EN 1993-1-8 Table 3.10)',
  ])
    expect(within(table).getByText(words)).toBeTruthy();
  // Not replaceable: no serviceability lines.
  expect(within(table).queryByText(/serviceability/)).toBeNull();
  // The bending resistance 1.5·W_el·f_yp/γM0 = 1.5 · π·0.06³/32 · 460 MPa = 14.63 kN·m.
  expect(within(table).getByText('≤ 14.63 kN·m')).toBeTruthy();
  // Each check comes from the emergency stop, whose force is the highest.
  const bending = cases.envelope.find((e) => e.id === 'joints.0.pin.en1993.bending')!;
  expect(bending.loadCase).toBe('emergency_stop');
});
