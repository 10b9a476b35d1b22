import DateTimePicker from '@react-native-community/datetimepicker';
import { act, fireEvent, screen, within } from '@testing-library/react-native';

type Scope = ReturnType<typeof within> | typeof screen;

/**
 * Chooses a calendar date in a `DateField` as a person does on a phone: presses the field (named
 * "<label>: …"), then answers the platform picker it opened with that day ('set', as the picker reports
 * a chosen date), then closes it. The day goes in as noon on the device's clock.
 */
export function pickDate(label: string, day: string, scope: Scope = screen) {
  const field = () => {
    const found = scope.getAllByRole('button').find((b) => {
      const name = b.props.accessibilityLabel as string | undefined;
      return name?.startsWith(`${label}: `);
    });
    if (!found) throw new Error(`No date field "${label}"`);
    return found;
  };
  const expanded = () => {
    const props = field().props as { 'aria-expanded'?: boolean; accessibilityState?: { expanded?: boolean } };
    return (props['aria-expanded'] ?? props.accessibilityState?.expanded) === true;
  };
  if (!expanded()) fireEvent.press(field());
  const pickers = screen.UNSAFE_getAllByType(DateTimePicker);
  const picker = pickers[pickers.length - 1];
  const [y, m, d] = day.split('-').map(Number);
  const date = new Date(y, m - 1, d, 12);
  act(() => {
    picker.props.onValueChange(
      { type: 'set', nativeEvent: { timestamp: date.getTime(), utcOffset: 0 } },
      date,
    );
  });
  // iOS keeps its calendar open under the field until it is pressed again; close it, as Done does.
  if (expanded()) fireEvent.press(field());
}
