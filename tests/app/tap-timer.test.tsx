/**
 * The TapTimer component: taps on the pad give the live period, the set-aside list explains itself,
 * "Use this value" hands over the numbers and Reset clears. Expected values worked by hand: intervals
 * 2, 2, 4, 2, 2 s → the 4 s one is a missed tap; the rest give period 2 s, 30 rpm, SD 0.
 */
import { fireEvent, render, screen } from '@testing-library/react-native';

import { TapTimer } from '@/features/tap-timer/tap-timer';

function tapAt(times: number[]) {
  const pad = screen.getByRole('button', { name: 'Tap at each revolution' });
  const spy = jest.spyOn(Date, 'now');
  for (const t of times) {
    spy.mockReturnValueOnce(t);
    fireEvent(pad, 'pressIn');
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
  const pad = screen.getByRole('button', { name: 'Tap at each swing' });
  expect(pad).toBeTruthy();
  const spy = jest.spyOn(Date, 'now');
  spy.mockReturnValueOnce(0);
  fireEvent(pad, 'pressIn');
  spy.mockReturnValueOnce(3000);
  fireEvent(pad, 'pressIn');
  spy.mockRestore();
  expect(screen.getByText(/checks start at four taps/)).toBeTruthy();
  expect(screen.getByRole('button', { name: 'Use this value' })).toBeDisabled();
  fireEvent.press(screen.getByRole('button', { name: 'Reset' }));
  expect(screen.getByText('Start when the arm passes your mark')).toBeTruthy();
});
