/**
 * The review desk's checklist results: each measured value beside its limit and status (from the server's
 * envelope), a Pass over the limit shown first with the inspector's reason, and an old record's checklist
 * value that disagrees with its pivot's reading shown as a disagreement. Values are invented; the
 * statuses follow the inclusive-limit rule (common practice for wear limits; from memory).
 */
import { QueryClientProvider } from '@tanstack/react-query';
import { render, screen, within } from '@testing-library/react-native';

import { makeQueryClient } from '@/features/api/query-client';
import { checklistItemId } from '@/features/records/checklist-limits';
import type { ChecklistAnswer } from '@/features/records/schema';
import type { EnvelopeItem } from '@/features/loads/engine';
import { registryKeys } from '@/features/registry/api';
import type { ChecklistTemplate } from '@/features/registry/schema';
import { ChecklistResults } from '@/features/review/checklist-results';
import type { InspectionReading } from '@/features/review/inspection-schema';

const mm = (v: number) => v / 1000;

const checklist: ChecklistAnswer[] = [
  {
    itemId: 'pin',
    area: 'Pins',
    text: 'Main pin outside diameter',
    result: 'pass',
    measurement: { valueSI: mm(57.9), unit: 'mm', entered: '57.90', status: 'over' },
    overLimitReason: 'Spare pin fitted after the reading; re-measured in the readings',
  },
  {
    itemId: 'gap',
    area: 'Drive',
    text: 'Brake air gap',
    result: 'pass',
    measurement: { valueSI: mm(0.5), unit: 'mm', entered: '0.50' },
  },
  {
    itemId: 'clear',
    area: 'Pins',
    text: 'Main pivot clearance',
    result: 'pass',
    // An old record: the clearance typed here and again in the readings, with different values.
    measurement: { valueSI: mm(0.42), unit: 'mm', entered: '0.42' },
  },
];
const envelope: EnvelopeItem[] = [
  {
    id: checklistItemId('pin'),
    label: 'Checklist: Main pin outside diameter',
    quantity: 'lengthSmall',
    value: mm(57.9),
    limit: { kind: 'lower', min: mm(58), nominal: mm(60) },
    ratio: 1.05,
    status: 'over',
  },
  {
    id: checklistItemId('gap'),
    label: 'Checklist: Brake air gap',
    quantity: 'lengthSmall',
    value: mm(0.5),
    limit: { kind: 'range', min: mm(0.25), max: mm(0.75) },
    ratio: 0,
    status: 'within',
  },
];
const readings: InspectionReading[] = [
  {
    id: 'r1',
    kind: 'clearance',
    joint: 0,
    label: 'Rod: bushing clearance (diametral)',
    valueSI: mm(0.55),
    unit: 'mm',
    entered: '0.55',
    method: 'dial_indicator',
    spreadSI: null,
    takenAt: '2026-12-01T09:00:00Z',
    note: null,
  },
];
const template = {
  id: 'tpl-1',
  version: {
    version: 1,
    content: {
      areas: [
        {
          id: 'pins',
          title: 'Pins',
          items: [
            {
              id: 'clear',
              text: 'Main pivot clearance',
              guidance: null,
              photoRequired: false,
              measurementRequired: true,
              measurementKind: 'lengthSmall',
              measurementLabel: null,
              limit: { source: 'design', joint: 0, quantity: 'clearance' },
            },
          ],
        },
      ],
    },
  },
} as unknown as ChecklistTemplate;

test('values with their limits and statuses; a Pass over its limit comes first with its reason', () => {
  const client = makeQueryClient();
  client.setQueryData(registryKeys.checklistVersion('tpl-1', 1), template);
  render(
    <QueryClientProvider client={client}>
      <ChecklistResults
        checklist={checklist}
        photos={[]}
        onOpenPhoto={() => {}}
        envelope={envelope}
        readings={readings}
        template={{ id: 'tpl-1', version: 1 }}
      />
    </QueryClientProvider>,
  );
  const over = screen.getByLabelText('Item over its limit: Main pin outside diameter');
  expect(within(over).getByLabelText('Over limit')).toBeTruthy();
  // Typed text echoed; the limit as stated.
  expect(within(over).getByText(/Measured 57\.90 mm against ≥ 58 mm/)).toBeTruthy();
  expect(within(over).getByText(/Inspector’s reason: Spare pin fitted/)).toBeTruthy();

  const disagree = screen.getByLabelText('Item over its limit: Main pivot clearance');
  expect(
    within(disagree).getByText(/Disagrees with the reading “Rod: bushing clearance \(diametral\)”: 0\.55 mm/),
  ).toBeTruthy();
  expect(within(disagree).getByText(/no limit checked/)).toBeTruthy();
  expect(screen.getByText('0 failed · 3 passed · 1 over its limit')).toBeTruthy();
  // The cache's garbage-collection timers would otherwise keep jest running for minutes.
  client.clear();
});
