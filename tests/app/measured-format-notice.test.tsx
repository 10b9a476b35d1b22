/**
 * The app prints a value at its limit with the same string as the notice's e-mail and PDF
 * (tests/server/measured-format-notice.test.ts): the notice view renders the frozen document's strings,
 * and the load check's envelope table formats the same values to the same strings.
 */
import { QueryClientProvider } from '@tanstack/react-query';
import { fireEvent, render, screen, within } from '@testing-library/react-native';

import { makeQueryClient } from '@/features/api/query-client';
import { EnvelopeTable } from '@/features/loads/envelope-table';
import { measuredSources } from '@/features/loads/format';
import { NoticeDocumentView } from '@/features/notices/notice-document-view';
import { limitEnvelope, limitReadings, limitStrings } from '@/tests/support/limit-values';
import { fixtureNotice } from '@/scripts/sample-notice';

const rowOf = (label: string) => {
  let node = screen.getByText(label).parent;
  while (node && !within(node).queryAllByLabelText(/Within|Near limit|Over limit/).length) node = node.parent;
  if (!node) throw new Error(`No row holds ${label}`);
  return node;
};

test('the envelope table prints each value, limit and share as the rule gives them', () => {
  render(
    <EnvelopeTable
      items={limitEnvelope}
      system="si"
      sources={measuredSources({ readings: limitReadings })}
    />,
  );
  for (const s of limitStrings) {
    const row = rowOf(s.label);
    expect(within(row).getByText(s.value)).toBeTruthy();
    expect(within(row).getByText(s.limit)).toBeTruthy();
    expect(within(row).getByText(s.ratio)).toBeTruthy();
  }
  expect(screen.getByText('139.05 mm')).toBeTruthy();
  expect(screen.getByText('139.0 mm (at the limit)')).toBeTruthy();
  expect(screen.queryByText('139.1 mm')).toBeNull();
});

test('the notice view prints the document’s strings, the share of the limit by the same rule', () => {
  const results = limitStrings.map((s) => ({
    label: s.label,
    value: s.value,
    limit: s.limit,
    ratio: limitEnvelope.find((i) => i.label === s.label)?.ratio ?? null,
    status: s.status,
  }));
  render(
    <QueryClientProvider client={makeQueryClient()}>
      <NoticeDocumentView document={{ ...fixtureNotice, findings: [], results }} />
    </QueryClientProvider>,
  );
  // On a phone the results are folded below what the notice asks; open them as the operator would.
  fireEvent.press(screen.getByRole('button', { name: /^Show the full results/ }));
  for (const s of limitStrings) {
    const row = rowOf(s.label);
    expect(within(row).getByText(s.value)).toBeTruthy();
    expect(within(row).getByText(s.limit)).toBeTruthy();
    expect(within(row).getByText(s.ratio)).toBeTruthy();
  }
  // 210.0003 kN of 210 kN is past 100 %, and says so.
  expect(screen.getByText('100.0001 %')).toBeTruthy();
});
