/**
 * How a load check was made, as the review desk and the inspector's phone show it: each joint's model,
 * a free swing's period against the measured one (a mark and words, not colour alone), the load cases
 * with the governing one; an analysis from before models were recorded says so. The numbers are the shared
 * analysis's own (tests/engine/inspection-analysis.test.ts checks them against closed forms).
 */
import { render, screen } from '@testing-library/react-native';

import type { DesignData } from '@/features/loads/design-schema';
import { analyseInspection } from '@/features/records/analysis';
import { LoadCheckBasis } from '@/features/records/load-check-basis';
import type { Reading } from '@/features/records/schema';

import { rodDesign } from '@/tests/support/rod-design';

const pendulum: DesignData = {
  ...rodDesign(300, 6, 'Free pendulum'),
  parts: [{ kind: 'rod', body: 0, name: 'Arm', massKg: 300, fromM: [0, 0], toM: [0, -6] }],
  motion: [
    {
      joint: 0,
      kind: 'swing',
      amplitudeRad: 1.2,
      periodS: 4.5,
      freeSwing: true,
      serviceDecelRadS2: 1.5,
      emergencyDecelRadS2: 2.5,
    },
  ],
};
const reading = (kind: 'amplitude' | 'period', valueSI: number): Reading => ({
  id: kind === 'amplitude' ? '0b6c3c4e-5a7d-4e1b-9a51-0d1f7a1b2c31' : '0b6c3c4e-5a7d-4e1b-9a51-0d1f7a1b2c32',
  kind,
  joint: 0,
  label: kind,
  valueSI,
  unit: kind === 'amplitude' ? '°' : 's',
  method: 'typed',
  takenAt: '2026-12-01T10:00:00Z',
});

test('models, a period that differs and the load cases with the governing one', () => {
  const r = analyseInspection(pendulum, [reading('amplitude', 1.3), reading('period', 6.5)]);
  render(
    <LoadCheckBasis
      models={r.models}
      periodChecks={r.periodChecks}
      loadCases={r.loadCases}
      governingCase={r.governingCase}
      envelope={r.envelope}
      engineVersion="1.1.0"
      system="si"
    />,
  );
  expect(screen.getByText('P1 · Rod: free swing, from the readings')).toBeTruthy();
  expect(screen.getByText('Rod: differs by more than 5 %')).toBeTruthy();
  expect(
    screen.getByText(/A dragging bearing, a drive fault or wrong design data show up here/),
  ).toBeTruthy();
  expect(screen.getByLabelText('Load cases')).toBeTruthy();
  for (const c of r.loadCases) expect(screen.getAllByText(new RegExp(c.label)).length).toBeGreaterThan(0);
  const governing = r.loadCases.find((c) => c.kind === r.governingCase);
  expect(screen.getByText(`${governing?.label} (governs)`)).toBeTruthy();
  expect(screen.getByText(new RegExp(`Governing case: ${governing?.label}`))).toBeTruthy();
  // The line also names the item that makes that case govern: the one using most of its allowance.
  const top = [...r.envelope].sort((a, b) => b.ratio - a.ratio)[0];
  expect(top.loadCase ?? 'operating').toBe(r.governingCase);
  expect(screen.getByText(new RegExp(`\\(${top.label} at \\d`))).toBeTruthy();
});

test('an analysis made before models were recorded says so', () => {
  render(<LoadCheckBasis engineVersion="1.0.0" system="si" />);
  expect(screen.getByText('Model not recorded (engine 1.0.0)')).toBeTruthy();
  expect(screen.queryByLabelText('Load cases')).toBeNull();
});
