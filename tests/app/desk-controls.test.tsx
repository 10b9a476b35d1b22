/**
 * The desk's controls: the searchable select, the radio group, the date field and the finding's photo
 * picker. The keyboard behaviour checked is the one the WAI-ARIA Authoring Practices Guide (APG 1.2)
 * gives for its Combobox pattern (editable combobox with list autocomplete, and select-only combobox) and
 * its Radio Group pattern; the date's form is HTML's "valid date string" (HTML Living Standard, 2.3.5.2:
 * YYYY-MM-DD), checked against date-fns' own `format`/`parseISO`. Names are the invented demo scenario.
 */
import { fireEvent, render, screen, waitFor } from '@testing-library/react-native';
import { format, parseISO } from 'date-fns';
import { useState } from 'react';

import { DateField } from '@/components/date-field';
import { DateField as WebDateField } from '@/components/date-field.web';
import { RadioGroup, RadioOption, radioStep } from '@/components/radio-option';
import { FILTER_FROM, SelectField, filterOptions } from '@/components/select-field';
import { Text } from '@/components/text';
import { FindingForm, photoLabel } from '@/features/review/finding-form';
import { pickDate } from '@/tests/support/pick-date';

const key = (k: string) => ({ key: k, nativeEvent: { key: k }, preventDefault: jest.fn() });

const sites = [
  'Tamsworth Pier',
  'Lowfield Common fairground',
  'Elmsridge Park',
  'Harbour Green',
  'Corvane winter quarters',
  'Marrow Lane yard',
  'Saltings Promenade',
  'Brackwater Fields',
  'Élan Court',
  'Kestle Bay',
].map((label, i) => ({ value: `s${i}`, label, hint: i % 2 ? 'Corvane Travelling Shows' : undefined }));

function Select({ options, onChange }: { options: typeof sites; onChange: (v: string) => void }) {
  const [value, setValue] = useState<string | null>(null);
  return (
    <SelectField
      label="Site"
      value={value}
      options={options}
      onChange={(v) => {
        setValue(v);
        onChange(v);
      }}
    />
  );
}

const activeOption = () =>
  screen.getAllByRole('option').find((o) => {
    const p = o.props as { 'aria-selected'?: boolean; accessibilityState?: { selected?: boolean } };
    return (p['aria-selected'] ?? p.accessibilityState?.selected) === true;
  })?.props.accessibilityLabel;

describe('searchable select (APG combobox)', () => {
  test('a long list filters as one types; arrows, Home and End move; Enter chooses and closes', () => {
    expect(sites.length).toBeGreaterThanOrEqual(FILTER_FROM);
    const onChange = jest.fn();
    render(<Select options={sites} onChange={onChange} />);
    const field = screen.getByRole('combobox', { name: 'Site: Choose…' });
    expect(field.props['aria-expanded'] ?? field.props.accessibilityState?.expanded).toBe(false);

    fireEvent.press(field);
    const filter = screen.getByRole('combobox', { name: 'Site: type to filter' });
    expect(screen.getAllByRole('option')).toHaveLength(sites.length);

    // APG: typing filters the listbox to the options that match (here by every word, case and accent free).
    fireEvent.changeText(filter, 'elan');
    expect(screen.getAllByRole('option').map((o) => o.props.accessibilityLabel)).toEqual(['Élan Court']);
    fireEvent.changeText(filter, 'corvane');
    const matches = screen.getAllByRole('option').map((o) => o.props.accessibilityLabel);
    expect(matches).toHaveLength(6); // five by their operator (the hint), one by its own name
    expect(activeOption()).toBe(matches[0]);

    // APG: Down Arrow / Up Arrow move the visual focus; Home and End go to the first and last.
    fireEvent(filter, 'keyPress', key('ArrowDown'));
    expect(activeOption()).toBe(matches[1]);
    fireEvent(filter, 'keyPress', key('End'));
    expect(activeOption()).toBe(matches[5]);
    fireEvent(filter, 'keyPress', key('ArrowDown')); // no wrap past the last
    expect(activeOption()).toBe(matches[5]);
    fireEvent(filter, 'keyPress', key('Home'));
    expect(activeOption()).toBe(matches[0]);
    fireEvent(filter, 'keyPress', key('ArrowDown'));
    fireEvent(filter, 'keyPress', key('ArrowUp'));
    expect(activeOption()).toBe(matches[0]);

    // The filter box points at the active option (aria-activedescendant = its id).
    const active = screen.getAllByRole('option')[0];
    expect(filter.props['aria-activedescendant']).toBe(active.props.nativeID);

    // APG: Enter accepts the focused option and closes the listbox.
    fireEvent(filter, 'keyPress', key('Enter'));
    expect(onChange).toHaveBeenCalledWith('s1'); // Lowfield Common fairground, Corvane's
    expect(screen.queryAllByRole('option')).toHaveLength(0);
    expect(screen.getByRole('combobox', { name: 'Site: Lowfield Common fairground' })).toBeTruthy();
  });

  test('Escape closes without choosing; a filter that matches nothing says so', () => {
    const onChange = jest.fn();
    render(<Select options={sites} onChange={onChange} />);
    fireEvent.press(screen.getByRole('combobox', { name: 'Site: Choose…' }));
    const filter = screen.getByRole('combobox', { name: 'Site: type to filter' });
    fireEvent.changeText(filter, 'zzz');
    expect(screen.queryAllByRole('option')).toHaveLength(0);
    expect(screen.getByText('Nothing matches “zzz”.')).toBeTruthy();
    fireEvent(filter, 'keyPress', key('Escape'));
    expect(onChange).not.toHaveBeenCalled();
    expect(screen.queryByText('Nothing matches “zzz”.')).toBeNull();
    expect(screen.getByRole('combobox', { name: 'Site: Choose…' })).toBeTruthy();
  });

  test('a short list by keyboard (APG select-only): Down opens, a letter jumps, Enter chooses', () => {
    const short = sites.slice(0, 4);
    const onChange = jest.fn();
    render(<Select options={short} onChange={onChange} />);
    const field = screen.getByRole('combobox', { name: 'Site: Choose…' });
    fireEvent(field, 'keyDown', key('ArrowDown'));
    expect(screen.getAllByRole('option')).toHaveLength(4);
    expect(activeOption()).toBe('Tamsworth Pier');
    // APG select-only: a printable character moves to the next option whose name starts with it.
    fireEvent(field, 'keyDown', key('h'));
    expect(activeOption()).toBe('Harbour Green, Corvane Travelling Shows');
    fireEvent(field, 'keyDown', key('ArrowUp'));
    expect(activeOption()).toBe('Elmsridge Park');
    fireEvent(field, 'keyDown', key('Enter'));
    expect(onChange).toHaveBeenCalledWith('s2');
    expect(screen.queryAllByRole('option')).toHaveLength(0);
  });

  test('by touch: press the field, press an option', () => {
    const onChange = jest.fn();
    render(<Select options={sites} onChange={onChange} />);
    fireEvent.press(screen.getByRole('combobox', { name: 'Site: Choose…' }));
    fireEvent.press(screen.getByRole('option', { name: 'Kestle Bay, Corvane Travelling Shows' }));
    expect(onChange).toHaveBeenCalledWith('s9');
  });

  test('the filter matches as a base-letter comparison does (Intl.Collator, sensitivity "base")', () => {
    const collator = new Intl.Collator('en', { sensitivity: 'base' });
    const words = ['elan', 'ÉLAN', 'court', 'tams'];
    for (const w of words) {
      const expected = sites.filter((o) => {
        const hay = `${o.label} ${o.hint ?? ''}`;
        return [...hay].some((_, i) => collator.compare(hay.slice(i, i + w.length), w) === 0);
      });
      expect(filterOptions(sites, w).map((o) => o.value)).toEqual(expected.map((o) => o.value));
    }
  });
});

function Radios({ onChange }: { onChange: (v: string) => void }) {
  const [value, setValue] = useState('in_service');
  const values = ['in_service', 'restricted', 'out_of_service'] as const;
  return (
    <RadioGroup
      label="Ride status"
      value={value}
      values={values}
      onChange={(v) => {
        setValue(v);
        onChange(v);
      }}
    >
      {values.map((v) => (
        <RadioOption key={v} value={v} label={v}>
          <Text>{v}</Text>
        </RadioOption>
      ))}
    </RadioGroup>
  );
}

describe('radio group (APG radio group)', () => {
  const checked = () =>
    screen.getAllByRole('radio').map((r) => r.props['aria-checked'] ?? r.props.accessibilityState?.checked);

  test('aria-checked follows the choice; a press chooses', () => {
    const onChange = jest.fn();
    render(<Radios onChange={onChange} />);
    expect(screen.getByLabelText('Ride status').props.role).toBe('radiogroup');
    expect(checked()).toEqual([true, false, false]);
    fireEvent.press(screen.getByRole('radio', { name: 'out_of_service' }));
    expect(checked()).toEqual([false, false, true]);
    expect(onChange).toHaveBeenLastCalledWith('out_of_service');
  });

  test('arrow keys move and choose within the group, wrapping at the ends', () => {
    const onChange = jest.fn();
    render(<Radios onChange={onChange} />);
    const radio = (name: string) => screen.getByRole('radio', { name });
    // APG: Down/Right Arrow moves to the next radio and checks it; from the last it wraps to the first.
    fireEvent(radio('in_service'), 'keyDown', key('ArrowDown'));
    expect(checked()).toEqual([false, true, false]);
    fireEvent(radio('restricted'), 'keyDown', key('ArrowRight'));
    expect(checked()).toEqual([false, false, true]);
    fireEvent(radio('out_of_service'), 'keyDown', key('ArrowDown'));
    expect(checked()).toEqual([true, false, false]);
    // Up/Left Arrow: the previous one; from the first it wraps to the last.
    fireEvent(radio('in_service'), 'keyDown', key('ArrowUp'));
    expect(checked()).toEqual([false, false, true]);
    fireEvent(radio('out_of_service'), 'keyDown', key('ArrowLeft'));
    expect(checked()).toEqual([false, true, false]);
    expect(onChange.mock.calls.map((c) => c[0])).toEqual([
      'restricted',
      'out_of_service',
      'in_service',
      'out_of_service',
      'restricted',
    ]);
  });

  test('only the checked radio is a Tab stop (APG: roving tab index)', () => {
    render(<Radios onChange={() => {}} />);
    const focusable = screen.getAllByRole('radio').map((r) => r.props.focusable);
    expect(focusable).toEqual([true, false, false]);
    expect(radioStep('Home', 2, 3)).toBe(0);
    expect(radioStep('End', 0, 3)).toBe(2);
    expect(radioStep('a', 0, 3)).toBeNull();
  });
});

describe('date field', () => {
  // Days that test the calendar's edges: a leap day, the ends of a year and of a short month.
  const days = ['2028-02-29', '2026-12-31', '2027-01-01', '2026-04-30'];

  test('on a phone: the picked day comes back as YYYY-MM-DD and shows in the one date format', () => {
    for (const day of days) {
      const onChange = jest.fn();
      const view = render(<DateField label="Due date" value={null} onChange={onChange} />);
      pickDate('Due date', day);
      // date-fns' own reading and writing of the same day (outside reference).
      expect(onChange).toHaveBeenCalledWith(format(parseISO(day), 'yyyy-MM-dd'));
      view.rerender(<DateField label="Due date" value={day} onChange={onChange} />);
      expect(
        screen.getByRole('button', { name: `Due date: ${format(parseISO(day), 'd MMM yyyy')}` }),
      ).toBeTruthy();
      view.unmount();
    }
  });

  test('on a phone: a day outside min..max is refused with its reason and not passed on', () => {
    const onChange = jest.fn();
    render(<DateField label="To" value={null} min="2026-05-01" onChange={onChange} />);
    pickDate('To', '2026-04-30');
    expect(onChange).not.toHaveBeenCalled();
    expect(screen.getByText('Must be on or after 1 May 2026')).toBeTruthy();
    pickDate('To', '2026-05-01');
    expect(onChange).toHaveBeenCalledWith('2026-05-01');
    expect(screen.queryByText('Must be on or after 1 May 2026')).toBeNull();
  });

  test('in a browser: the date input holds YYYY-MM-DD both ways; emptied is null', () => {
    for (const day of days) {
      const onChange = jest.fn();
      const view = render(<WebDateField label="Due date" value={day} onChange={onChange} max="2030-01-01" />);
      const input = view.UNSAFE_root.findAll((n) => n.type === 'input')[0];
      expect(input.props.type).toBe('date');
      expect(input.props.value).toBe(format(parseISO(day), 'yyyy-MM-dd'));
      expect(input.props['aria-label']).toBe('Due date');
      fireEvent(input, 'change', { currentTarget: { value: '2026-06-30' } });
      expect(onChange).toHaveBeenLastCalledWith('2026-06-30');
      fireEvent(input, 'change', { currentTarget: { value: '' } });
      expect(onChange).toHaveBeenLastCalledWith(null);
      fireEvent(input, 'change', { currentTarget: { value: '2031-01-01' } });
      expect(onChange).toHaveBeenCalledTimes(2);
      expect(screen.getByText('Must be on or before 1 Jan 2030')).toBeTruthy();
      view.unmount();
    }
  });
});

describe('the finding’s photo picker', () => {
  // One picture attached to two checklist items: the same bytes, so the same SHA-256, two photos.
  const SAME = 'c'.repeat(64);
  const photos = [
    {
      id: 'p-1',
      sha256: SAME,
      caption: '',
      about: 'P2 · Checklist: Main pin',
      takenAt: '2026-05-04T09:15:00Z',
    },
    {
      id: 'p-2',
      sha256: SAME,
      caption: '',
      about: 'P3 · Checklist: Arm bushing',
      takenAt: '2026-05-04T09:20:00Z',
    },
    { id: 'p-3', sha256: 'd'.repeat(64), caption: '', takenAt: '2026-05-04T09:25:00Z' },
  ];

  test('each photo has its own name, and ticking one ticks only that one', async () => {
    const labels = photos.map((_, i) => photoLabel(photos, i));
    expect(new Set(labels).size).toBe(photos.length);
    expect(labels[0]).toMatch(/^Photo 1 — P2 · Checklist: Main pin, 4 May 2026, \d\d:\d\d$/);
    expect(labels[2]).toMatch(/^Photo 3 — 4 May 2026, \d\d:\d\d$/);

    const onSubmit = jest.fn().mockResolvedValue(undefined);
    render(<FindingForm photos={photos} onSubmit={onSubmit} onCancel={() => {}} />);
    const chip = (n: number) =>
      screen.getByRole('checkbox', { name: new RegExp(`^Refers to: Photo ${n} — `) });
    const ticked = () =>
      [1, 2, 3].map((n) => chip(n).props['aria-checked'] ?? chip(n).props.accessibilityState?.checked);
    fireEvent.press(chip(2));
    expect(ticked()).toEqual([false, true, false]);

    fireEvent.press(screen.getByRole('radio', { name: 'Note' }));
    fireEvent.changeText(screen.getByLabelText('What was found'), 'Grease nipple missing');
    fireEvent.press(screen.getByRole('button', { name: 'Add finding' }));
    await waitFor(() => expect(onSubmit).toHaveBeenCalled());
    expect(onSubmit.mock.calls[0][0].photoShas).toEqual([SAME]);
  });
});
