/**
 * The TapTimer component: taps on the pad (counted when the finger lands, touchStart) give the live
 * period, the set-aside list explains itself, "Use this value" hands over the numbers and Reset clears. Expected values worked by hand: intervals
 * 2, 2, 4, 2, 2 s → the 4 s one is a missed tap; the rest give period 2 s, 30 rpm, SD 0.
 */
import { fireEvent, render, screen } from '@testing-library/react-native';

import { TapTimer } from '@/features/tap-timer/tap-timer';

function tapAt(times: number[]) {
  const pad = screen.getByRole('button', { name: 'Tap once per revolution' });
  const spy = jest.spyOn(Date, 'now');
  for (const t of times) {
    spy.mockReturnValueOnce(t);
    fireEvent(pad, 'touchStart');
  }
  spy.mockRestore();
}

test('shows period, rpm and the set-aside tap, and hands over the value', () => {
  const onUse = jest.fn();
  render(<TapTimer onUse={onUse} />);
  const use = screen.getByRole('button', { name: 'Use this value' });
  expect(use).toBeDisabled();
  tapAt([0, 2000, 4000, 8000, 10000, 12000]);
  expect(screen.getByText('6 taps')).toBeTruthy();
  expect(screen.getByText('2.00')).toBeTruthy();
  expect(screen.getByText('30.00')).toBeTruthy();
  expect(screen.getByText(/Tap 3→4: 4\.00 s is about twice the usual 2\.00 s: a missed tap\?/)).toBeTruthy();
  expect(screen.getByText('4 intervals used, 1 set aside.')).toBeTruthy();
  fireEvent.press(use);
  expect(onUse).toHaveBeenCalledWith({ periodS: 2, rpm: 30, spreadS: 0, used: 4, discarded: 1 });
});

test('Reset clears the taps and no value can be used before enough taps', () => {
  render(<TapTimer per="swing" />);
  // Swing mode says what one swing is: there and back, the same mark passed in the same direction.
  expect(screen.getByText('One swing = there and back')).toBeTruthy();
  const pad = screen.getByRole('button', { name: 'Tap once per full swing' });
  expect(pad).toBeTruthy();
  const spy = jest.spyOn(Date, 'now');
  spy.mockReturnValueOnce(0);
  fireEvent(pad, 'touchStart');
  spy.mockReturnValueOnce(3000);
  fireEvent(pad, 'touchStart');
  spy.mockRestore();
  expect(screen.getByText(/checks start at four taps/)).toBeTruthy();
  expect(screen.getByRole('button', { name: 'Use this value' })).toBeDisabled();
  fireEvent.press(screen.getByRole('button', { name: 'Reset' }));
  expect(
    screen.getByText(
      'Tap each time the arm passes your mark going the same way (there and back is one swing)',
    ),
  ).toBeTruthy();
});

test('a screen reader activation counts as a tap, and a tap at the same instant as the last is one tap', () => {
  render(<TapTimer />);
  const pad = screen.getByRole('button', { name: 'Tap once per revolution' });
  const spy = jest.spyOn(Date, 'now');
  spy.mockReturnValueOnce(1000);
  fireEvent(pad, 'accessibilityAction', { nativeEvent: { actionName: 'activate' } });
  spy.mockReturnValueOnce(1000);
  fireEvent(pad, 'touchStart');
  spy.mockReturnValueOnce(3500);
  fireEvent(pad, 'touchStart');
  spy.mockRestore();
  expect(screen.getByText('2 taps')).toBeTruthy();
  // One interval of 2.5 s: period 2.50 s, 24.00 rpm (60 / 2.5).
  expect(screen.getByText('2.50')).toBeTruthy();
  expect(screen.getByText('24.00')).toBeTruthy();
});
