/**
 * The template editor ties a measured item to a limit: a pivot's design limit (offered only for the kind
 * of value that fits it) or a minimum and maximum typed in the admin's units and saved in SI (1 mm =
 * 0.001 m, SI definition). The API's schema judges the range (messages from features/registry/schema.ts).
 */
import { fireEvent, render, screen, waitFor } from '@testing-library/react-native';

import { ChecklistForm, type ChecklistFormInput } from '@/features/registry/checklist-form';

const start: ChecklistFormInput = {
  name: 'Rotating arm — periodic',
  inspectionType: 'periodic',
  reason: 'Limits added',
  content: {
    areas: [
      {
        id: 'pins',
        title: 'Pins',
        items: [
          {
            id: 'pin',
            text: 'Main pin outside diameter',
            guidance: '',
            photoRequired: false,
            measurementRequired: true,
            measurementKind: 'lengthSmall',
            measurementLabel: '',
          },
          {
            id: 'gap',
            text: 'Brake air gap',
            guidance: '',
            photoRequired: false,
            measurementRequired: true,
            measurementKind: 'lengthSmall',
            measurementLabel: '',
          },
        ],
      },
    ],
  },
};

test('a design limit of a pivot and a written range are saved with the item', async () => {
  const onSubmit = jest.fn().mockResolvedValue(undefined);
  render(<ChecklistForm defaultValues={start} submitLabel="Save" onSubmit={onSubmit} />);

  const against = () => screen.getAllByRole('combobox', { name: /^Checked against:/ });
  fireEvent.press(against()[0]);
  // Only the limits a small length can meet are offered.
  expect(screen.queryByRole('option', { name: 'Speed limit (design data)' })).toBeNull();
  fireEvent.press(screen.getByRole('option', { name: 'Pin minimum diameter (design data)' }));
  fireEvent.press(screen.getAllByRole('combobox', { name: /^Pivot:/ })[0]);
  fireEvent.press(screen.getByRole('option', { name: 'Pivot 2' }));

  fireEvent.press(against()[1]);
  fireEvent.press(screen.getByRole('option', { name: 'A limit written here (min and/or max)' }));
  fireEvent.changeText(screen.getByLabelText('Minimum'), '0.75');
  fireEvent.changeText(screen.getByLabelText('Maximum'), '0.25');
  fireEvent.press(screen.getByRole('button', { name: 'Save' }));
  expect(await screen.findByText('Must be above the minimum')).toBeTruthy();
  expect(onSubmit).not.toHaveBeenCalled();

  fireEvent.changeText(screen.getByLabelText('Minimum'), '0,25');
  fireEvent.changeText(screen.getByLabelText('Maximum'), '0.75');
  fireEvent.press(screen.getByRole('button', { name: 'Save' }));
  await waitFor(() => expect(onSubmit).toHaveBeenCalled());
  const [pin, gap] = onSubmit.mock.calls[0][0].content.areas[0].items;
  expect(pin.limit).toEqual({ source: 'design', joint: 1, quantity: 'pin_diameter' });
  expect(gap.limit.source).toBe('template');
  expect(gap.limit.joint).toBeNull();
  expect(gap.limit.min).toBeCloseTo(0.00025, 15);
  expect(gap.limit.max).toBeCloseTo(0.00075, 15);
});
