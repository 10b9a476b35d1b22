/**
 * The checklist template editor: items are added, reordered and removed, the photo and measurement flags
 * are set, the API's schema judges the result (messages from features/registry/schema.ts), and kept items
 * keep their ids so inspections still point at them.
 */
import { fireEvent, render, screen, waitFor } from '@testing-library/react-native';

import { ChecklistForm, type ChecklistFormInput } from '@/features/registry/checklist-form';
import { ApiRequestError } from '@/lib/api-errors';

const start: ChecklistFormInput = {
  name: 'Pendulum swing — periodic',
  inspectionType: 'periodic',
  reason: '',
  content: {
    areas: [
      {
        id: 'area-pins',
        title: 'Pins and bushings',
        items: [
          {
            id: 'item-retainer',
            text: 'Pin retainers present and secure',
            guidance: '',
            photoRequired: false,
            measurementRequired: false,
            measurementKind: null,
            measurementLabel: '',
          },
          {
            id: 'item-pin',
            text: 'Main pin outside diameter',
            guidance: '',
            photoRequired: true,
            measurementRequired: true,
            measurementKind: 'lengthSmall',
            measurementLabel: 'pin Ø',
          },
        ],
      },
    ],
  },
};

test('add, flag, reorder and remove items; the saved content keeps the ids of kept items', async () => {
  const onSubmit = jest.fn().mockResolvedValue(undefined);
  render(<ChecklistForm defaultValues={start} submitLabel="Save as version 2" onSubmit={onSubmit} />);

  fireEvent.press(screen.getByRole('button', { name: 'Add an item' }));
  fireEvent.changeText(screen.getByLabelText('Item 3'), 'Bushing clearance, load reversed');
  fireEvent.press(screen.getAllByRole('checkbox', { name: 'Measurement required' })[2]);
  fireEvent.changeText(
    screen.getByLabelText('Why this change'),
    'Clearance check added after the maker’s bulletin',
  );

  // A measurement item must say what is measured (the schema's superRefine).
  fireEvent.press(screen.getByRole('button', { name: 'Save as version 2' }));
  expect(await screen.findByText('Say what kind of measurement')).toBeTruthy();
  expect(onSubmit).not.toHaveBeenCalled();

  fireEvent.press(screen.getAllByRole('combobox', { name: /^What is measured:/ })[1]);
  fireEvent.press(screen.getByRole('option', { name: 'Small length (mm or in): pins, clearances, wear' }));
  fireEvent.press(screen.getAllByRole('checkbox', { name: 'Photo required' })[2]);
  fireEvent.press(screen.getByRole('button', { name: 'Move item 3 of area 1 up' }));
  fireEvent.press(screen.getByRole('button', { name: 'Remove item 1 of area 1' }));

  fireEvent.press(screen.getByRole('button', { name: 'Save as version 2' }));
  await waitFor(() => expect(onSubmit).toHaveBeenCalled());
  const saved = onSubmit.mock.calls[0][0];
  expect(saved.reason).toBe('Clearance check added after the maker’s bulletin');
  expect(saved.content.areas).toHaveLength(1);
  expect(saved.content.areas[0].id).toBe('area-pins');
  expect(saved.content.areas[0].items).toEqual([
    {
      text: 'Bushing clearance, load reversed',
      guidance: null,
      photoRequired: true,
      measurementRequired: true,
      measurementKind: 'lengthSmall',
      measurementLabel: null,
    },
    {
      id: 'item-pin',
      text: 'Main pin outside diameter',
      guidance: null,
      photoRequired: true,
      measurementRequired: true,
      measurementKind: 'lengthSmall',
      measurementLabel: 'pin Ø',
    },
  ]);
});

test('a new version needs a reason, and an area needs an item', async () => {
  const onSubmit = jest.fn();
  render(<ChecklistForm defaultValues={start} submitLabel="Save" onSubmit={onSubmit} />);
  fireEvent.press(screen.getByRole('button', { name: 'Remove item 1 of area 1' }));
  fireEvent.press(screen.getByRole('button', { name: 'Remove item 1 of area 1' }));
  fireEvent.press(screen.getByRole('button', { name: 'Save' }));
  expect(await screen.findByText('Required')).toBeTruthy();
  expect(screen.getByText('Give at least one item')).toBeTruthy();
  expect(onSubmit).not.toHaveBeenCalled();
});

test('a server problem on an item is shown on that item', async () => {
  const onSubmit = jest
    .fn()
    .mockRejectedValue(
      new ApiRequestError(400, 'validation_failed', 'Some fields are missing or invalid.', [
        { path: 'content.areas.0.items.1.text', message: 'At most 300 characters' },
      ]),
    );
  render(
    <ChecklistForm
      defaultValues={{ ...start, reason: 'Tidy wording' }}
      submitLabel="Save"
      onSubmit={onSubmit}
    />,
  );
  fireEvent.press(screen.getByRole('button', { name: 'Save' }));
  expect(await screen.findByText('At most 300 characters')).toBeTruthy();
  expect(screen.getByText('Nothing was saved. Look at the fields marked below.')).toBeTruthy();
});

test("the template's inspection type is chosen from every type or any type, and saved with it", async () => {
  const onSubmit = jest.fn().mockResolvedValue(undefined);
  render(<ChecklistForm defaultValues={start} submitLabel="Save as version 2" onSubmit={onSubmit} />);
  fireEvent.press(screen.getByRole('combobox', { name: 'Inspection type: Periodic' }));
  // Every type of lib/vocabulary.ts, and the general choice.
  expect(screen.getAllByRole('option')).toHaveLength(7);
  expect(screen.getByRole('option', { name: 'Any type (general)' })).toBeTruthy();
  fireEvent.press(screen.getByRole('option', { name: 'After repair' }));
  fireEvent.changeText(screen.getByLabelText('Why this change'), 'Used after repairs only');
  fireEvent.press(screen.getByRole('button', { name: 'Save as version 2' }));
  await waitFor(() => expect(onSubmit).toHaveBeenCalled());
  expect(onSubmit.mock.calls[0][0].inspectionType).toBe('after_repair');
});
