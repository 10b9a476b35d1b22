/**
 * The phone keeps what the inspector typed: a reading or a checklist value is stored in SI for the
 * analysis and, beside it, as the text typed (normalised: decimal comma read as a point), which every
 * display echoes — "0.40 mm", never "0.4000 mm" or "0.40000". Ride and values are invented demo data.
 */
import { fireEvent, render, screen } from '@testing-library/react-native';

import { ChecklistSection } from '@/features/inspections/checklist-section';
import { type Draft, newDraft } from '@/features/records/draft';
import { ReadingsSection } from '@/features/inspections/readings-section';
import type { Reading } from '@/features/records/schema';
import { readingSchema } from '@/features/records/schema';
import type { ChecklistTemplate } from '@/features/registry/schema';
import { rodDesign } from '@/tests/support/rod-design';

jest.mock('expo-crypto', () => ({
  ...jest.requireActual('expo-crypto'),
  randomUUID: () => jest.requireActual('node:crypto').randomUUID(),
}));

const draft = (): Draft =>
  newDraft({
    id: '00000000-0000-4000-8000-000000000001',
    ride: { id: 'ride-rod', name: 'Test Rod' },
    designVersionId: 'dv-1',
    template: null,
    type: 'periodic',
    now: new Date('2026-12-03T08:00:00Z'),
  });

describe('typed values on the phone', () => {
  test('a reading keeps the typed text beside its SI value, and the recorded list echoes it', () => {
    const onAdd = jest.fn<void, [Reading]>();
    const d = draft();
    const view = render(
      <ReadingsSection draft={d} design={rodDesign(100, 2)} system="si" onAdd={onAdd} onRemove={() => {}} />,
    );
    fireEvent.changeText(screen.getByLabelText(/^Bushing clearance/), ' 0,40 ');
    fireEvent.press(screen.getByRole('radio', { name: 'Gauge (feeler, caliper, angle)' }));
    fireEvent.press(screen.getByRole('radio', { name: 'None from the register' }));
    fireEvent.press(screen.getByRole('button', { name: 'Add bushing clearance (diametral) for Rod' }));
    expect(onAdd).toHaveBeenCalledTimes(1);
    const reading = onAdd.mock.calls[0][0];
    expect(reading.entered).toBe('0.40');
    expect(reading.unit).toBe('mm');
    expect(reading.valueSI).toBeCloseTo(0.0004, 12);
    expect(readingSchema.parse(reading).entered).toBe('0.40');

    view.rerender(
      <ReadingsSection
        draft={{ ...d, readings: [reading] }}
        design={rodDesign(100, 2)}
        system="si"
        onAdd={onAdd}
        onRemove={() => {}}
      />,
    );
    expect(screen.getByText('0.40 mm')).toBeTruthy();
    // The pivot's design limits are shown as stated, not padded with zeros.
    expect(screen.getByText(/clearance limit 0\.5 mm/)).toBeTruthy();
  });

  test('a checklist value keeps the typed text and shows it again as typed when reopened', () => {
    const template = {
      id: 'tpl-1',
      version: {
        version: 1,
        content: {
          areas: [
            {
              title: 'Main pivot',
              items: [
                {
                  id: 'gap',
                  text: 'Bushing clearance, feeler gauge',
                  measurementRequired: true,
                  measurementKind: 'lengthSmall',
                  measurementLabel: 'Clearance',
                },
              ],
            },
          ],
        },
      },
    } as unknown as ChecklistTemplate;
    const d = {
      ...draft(),
      checklist: [
        { itemId: 'gap', area: 'Main pivot', text: 'Bushing clearance, feeler gauge', result: null },
      ],
    };
    const onAnswer = jest.fn();
    const view = render(
      <ChecklistSection draft={d} template={template} system="si" onAnswer={onAnswer} onPhoto={() => {}} />,
    );
    fireEvent.changeText(screen.getByLabelText(/^Clearance/), '0.40');
    const patch = onAnswer.mock.calls.at(-1)?.[1];
    expect(patch.measurement.entered).toBe('0.40');
    expect(patch.measurement.valueSI).toBeCloseTo(0.0004, 12);
    view.unmount();

    render(
      <ChecklistSection
        draft={{ ...d, checklist: [{ ...d.checklist[0], measurement: patch.measurement }] }}
        template={template}
        system="si"
        onAnswer={onAnswer}
        onPhoto={() => {}}
      />,
    );
    expect(screen.getByDisplayValue('0.40')).toBeTruthy();
  });
});
