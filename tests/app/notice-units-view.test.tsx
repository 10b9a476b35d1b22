/**
 * The notice view shows a notice in the units it was issued with: a document frozen in US customary units
 * prints its inches and kips and says so, one in SI (or from before the choice) says SI. The strings are
 * the one rule's (lib/measured-format.ts) for invented values at their limits (tests/support/limit-values);
 * the conversions behind them are checked against the 1959 and CGPM 1901 definitions in
 * tests/server/notice-units.test.ts.
 */
import { QueryClientProvider } from '@tanstack/react-query';
import { fireEvent, render, screen } from '@testing-library/react-native';

import { makeQueryClient } from '@/features/api/query-client';
import { formatEnvelopeItem, measuredSources } from '@/features/loads/format';
import { NoticeDocumentView } from '@/features/notices/notice-document-view';
import type { NoticeDocument } from '@/features/notices/schema';
import type { UnitSystem } from '@/lib/units';
import { limitEnvelope, limitReadings } from '@/tests/support/limit-values';
import { fixtureNotice } from '@/scripts/sample-notice';

function resultsIn(system: UnitSystem): NoticeDocument['results'] {
  const sources = measuredSources({ readings: limitReadings });
  return limitEnvelope.map((i) => {
    const shown = formatEnvelopeItem(i, system, sources.get(i.id));
    return { label: i.label, value: shown.value, limit: shown.limit, ratio: i.ratio, status: i.status };
  });
}

function show(document: NoticeDocument) {
  render(
    <QueryClientProvider client={makeQueryClient()}>
      <NoticeDocumentView document={document} />
    </QueryClientProvider>,
  );
  // On a phone the results are folded below what the notice asks; open them as the operator would.
  fireEvent.press(screen.getByRole('button', { name: /^Show the full results/ }));
}

test('a notice issued in US customary units shows inches and kips and says so', () => {
  show({
    ...fixtureNotice,
    units: 'us',
    paper: 'LETTER',
    findings: [],
    results: resultsIn('us'),
    loadSummary: [{ pivot: 'Main pivot', peakForce: '47.210 kip', limit: '≤ 47.2099 kip' }],
  });
  expect(
    screen.getByText('Figures in US customary units (lbf and kip, lbf·ft and kip·ft, in, lb, ksi).'),
  ).toBeTruthy();
  // 139.05 mm typed to 0.01 mm: 5.4744 in (25.4 mm to the inch, exact since 1959).
  expect(screen.getByText('5.4744 in')).toBeTruthy();
  expect(screen.getAllByText('47.210 kip').length).toBeGreaterThan(0);
  expect(screen.queryByText('139.05 mm')).toBeNull();
  // The caution is on every notice, whatever its units.
  expect(screen.getAllByText(/qualified engineer/).length).toBeGreaterThan(0);
});

test('a notice in SI, or issued before the choice existed, says SI', () => {
  // The fixture, like every notice issued before the choice, has neither `units` nor `paper`.
  expect(fixtureNotice.units).toBeUndefined();
  show({ ...fixtureNotice, findings: [], results: resultsIn('si') });
  expect(screen.getByText('Figures in SI units (kN, kN·m, mm, kg, MPa).')).toBeTruthy();
  expect(screen.getByText('139.05 mm')).toBeTruthy();
  expect(screen.queryByText('5.4744 in')).toBeNull();
});
