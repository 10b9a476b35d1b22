/**
 * Checklist values checked at entry on the phone. The test rod's design data (invented) gives its main
 * pin a nominal 60 mm and a minimum 58 mm: with the inclusive-limit and share-of-allowance rules (common
 * practice for pin wear limits; from memory) 58.5 mm uses 75 % of the allowance (within), 58.1 mm 95 %
 * (near, from the project's 90 % margin), 57.9 mm is beyond the minimum (over). Such a value cannot be
 * marked Pass without a written reason, and a pin value is the pivot's reading as well: entered once.
 */
import { act, fireEvent, render, screen } from '@testing-library/react-native';
import { useEffect, useState } from 'react';

import { ChecklistSection } from '@/features/inspections/checklist-section';
import { type Draft, answerItem, draftProblems, newDraft } from '@/features/records/draft';
import { ReadingsSection } from '@/features/inspections/readings-section';
import type { ChecklistTemplate } from '@/features/registry/schema';
import { rodDesign } from '@/tests/support/rod-design';

jest.mock('expo-crypto', () => ({
  ...jest.requireActual('expo-crypto'),
  randomUUID: () => jest.requireActual('node:crypto').randomUUID(),
}));

const design = rodDesign(100, 2);
const template: ChecklistTemplate = {
  id: 'tpl-1',
  name: 'Rod',
  rideClass: 'other',
  inspectionType: null,
  createdAt: '2026-01-01T00:00:00Z',
  archivedAt: null,
  currentVersion: 1,
  updatedAt: '2026-01-01T00:00:00Z',
  updatedByName: 'Admin',
  areaCount: 1,
  itemCount: 1,
  version: {
    version: 1,
    createdAt: '2026-01-01T00:00:00Z',
    createdByName: 'Admin',
    reason: 'New',
    content: {
      areas: [
        {
          id: 'pins',
          title: 'Pins',
          items: [
            {
              id: 'pin',
              text: 'Main pin outside diameter',
              guidance: null,
              photoRequired: false,
              measurementRequired: true,
              measurementKind: 'lengthSmall',
              measurementLabel: 'Smallest reading',
              limit: { source: 'design', joint: 0, quantity: 'pin_diameter' },
            },
          ],
        },
      ],
    },
  },
};

/** The harness's draft after the last render (set in an effect, so rendering stays pure). */
const seen: { draft: Draft | null } = { draft: null };
function Harness() {
  const [d, setD] = useState(() =>
    newDraft({
      id: '00000000-0000-4000-8000-000000000002',
      ride: { id: 'ride-rod', name: 'Test Rod' },
      designVersionId: 'dv-1',
      template,
      type: 'periodic',
      now: new Date('2026-12-03T08:00:00Z'),
    }),
  );
  useEffect(() => {
    seen.draft = d;
  });
  return (
    <ChecklistSection
      draft={d}
      template={template}
      system="si"
      design={design}
      instruments={[]}
      onAnswer={(itemId, patch) => setD((x) => answerItem(x, itemId, patch, new Date()))}
      onDraft={(fn) => setD((x) => fn(x))}
      onPhoto={() => {}}
    />
  );
}

const latest = (): Draft => seen.draft as Draft;
const passRadio = () => screen.getByRole('radio', { name: 'Pass: Main pin outside diameter' });

test('the status shows at once as the value is typed, with mark, words and limit', () => {
  render(<Harness />);
  expect(screen.getByText(/Limit ≥ 58 mm \(design data: Main pivot\)/)).toBeTruthy();
  fireEvent.changeText(screen.getByLabelText(/^Smallest reading/), '58.5');
  expect(screen.getByLabelText('Within')).toBeTruthy();
  expect(latest().checklist[0].measurement).toMatchObject({ entered: '58.5', status: 'within' });
  fireEvent.changeText(screen.getByLabelText(/^Smallest reading/), '58.1');
  expect(screen.getByLabelText('Near limit')).toBeTruthy();
  fireEvent.changeText(screen.getByLabelText(/^Smallest reading/), '57.9');
  expect(screen.getByLabelText('Over limit')).toBeTruthy();
  expect(screen.getByText(/against ≥ 58 mm/)).toBeTruthy();
  expect(latest().checklist[0].measurement?.status).toBe('over');
});

test('Pass on a value over its limit asks for a reason first; Fail needs none', () => {
  render(<Harness />);
  fireEvent.changeText(screen.getByLabelText(/^Smallest reading/), '57.9');
  fireEvent.press(passRadio());
  // Not marked: the reason prompt comes first.
  expect(latest().checklist[0].result).toBeNull();
  expect(screen.getByText('Over its limit')).toBeTruthy();
  const passWithReason = screen.getByRole('button', { name: 'Pass with this reason' });
  expect(passWithReason.props.accessibilityState?.disabled ?? passWithReason.props['aria-disabled']).toBe(
    true,
  );
  fireEvent.changeText(
    screen.getByLabelText(/^Reason for passing a value over its limit/),
    'Pin replaced during the visit; new pin measured at 59.98 mm',
  );
  fireEvent.press(screen.getByRole('button', { name: 'Pass with this reason' }));
  expect(latest().checklist[0]).toMatchObject({
    result: 'pass',
    overLimitReason: 'Pin replaced during the visit; new pin measured at 59.98 mm',
  });
  expect(draftProblems(latest(), template).filter((p) => /Over its limit/.test(p.message))).toEqual([]);
  // Clearing the reason of a Pass leaves the draft unsubmittable, said in words.
  fireEvent.changeText(screen.getByLabelText(/^Reason for passing a value over its limit/), ' ');
  expect(screen.getByText('A reason is needed')).toBeTruthy();
  expect(draftProblems(latest(), template).map((p) => p.message)).toContain(
    'Over its limit — mark Fail or give a reason: Main pin outside diameter',
  );
  fireEvent.press(screen.getByRole('button', { name: 'Mark Fail' }));
  expect(latest().checklist[0].result).toBe('fail');
});

test('the pin value is the pivot’s reading: created once measured-with is said, then kept equal', () => {
  render(<Harness />);
  fireEvent.changeText(screen.getByLabelText(/^Smallest reading/), '58.5');
  expect(latest().readings).toEqual([]);
  const unsaid = 'Say how it was measured: Main pin outside diameter';
  expect(draftProblems(latest(), template, design).map((p) => p.message)).toContain(unsaid);
  fireEvent.press(screen.getByRole('radio', { name: 'Micrometer' }));
  fireEvent.press(screen.getByRole('radio', { name: 'None from the register' }));
  expect(latest().readings).toHaveLength(1);
  const reading = latest().readings[0];
  expect(reading).toMatchObject({ kind: 'pin_diameter', joint: 0, entered: '58.5', method: 'micrometer' });
  expect(latest().checklist[0].measurement?.readingId).toBe(reading.id);
  expect(draftProblems(latest(), template, design).map((p) => p.message)).not.toContain(unsaid);
  expect(screen.getByText(/Kept as the reading “Rod: pin diameter”/)).toBeTruthy();

  act(() => {
    fireEvent.changeText(screen.getByLabelText(/^Smallest reading/), '58.45');
  });
  expect(latest().readings).toHaveLength(1);
  expect(latest().readings[0]).toMatchObject({ id: reading.id, entered: '58.45', method: 'micrometer' });
  expect(latest().readings[0].valueSI).toBe(latest().checklist[0].measurement?.valueSI);

  const final = latest();
  // Clearing the value clears the reading with it.
  fireEvent.changeText(screen.getByLabelText(/^Smallest reading/), '');
  expect(latest().readings).toEqual([]);

  // The readings show it once, as the checklist's, with no second place to change it.
  const view = render(
    <ReadingsSection draft={final} design={design} system="si" onAdd={() => {}} onRemove={() => {}} />,
  );
  expect(view.getByText(/From the checklist: Main pin outside diameter/)).toBeTruthy();
  expect(view.queryByRole('button', { name: 'Remove Rod: pin diameter' })).toBeNull();
});
