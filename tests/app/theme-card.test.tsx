/**
 * Account's Colour theme card on a phone (jest runs the native modules): it shows the stored choice,
 * stores a new one on the device, says it shows at the next start (a phone's styles are built at start),
 * and says so plainly when the device would not store it. The store is stood in for; its web twin is
 * covered in the browser (tests/browser/dark-theme.test.ts).
 */
import { fireEvent, render, screen } from '@testing-library/react-native';

import { ThemeCard } from '@/features/shell/theme-card';

let mockStored: string | null = 'light';
let mockRefuse = false;
jest.mock('@/components/theme-store', () => ({
  readThemeChoice: () => (mockStored === 'light' || mockStored === 'dark' ? mockStored : 'system'),
  writeThemeChoice: (choice: string) => {
    if (mockRefuse) return false;
    mockStored = choice === 'system' ? null : choice;
    return true;
  },
}));

const checked = (name: string) => screen.getByRole('radio', { name }).props.accessibilityState?.checked;

beforeEach(() => {
  mockStored = 'light';
  mockRefuse = false;
});

test('shows the stored choice, stores a new one and says when a phone shows it', () => {
  render(<ThemeCard />);
  expect(checked('Light')).toBe(true);
  expect(checked('System')).toBe(false);
  expect(screen.getByText(/next time Pivotwatch is opened/)).toBeTruthy();

  fireEvent.press(screen.getByRole('radio', { name: 'Dark' }));
  expect(mockStored).toBe('dark');
  expect(checked('Dark')).toBe(true);

  fireEvent.press(screen.getByRole('radio', { name: 'System' }));
  expect(mockStored).toBeNull();
  expect(checked('System')).toBe(true);
  expect(screen.queryByText(/would not store/)).toBeNull();
});

test('a choice the device would not store is said to be lost', () => {
  mockRefuse = true;
  render(<ThemeCard />);
  fireEvent.press(screen.getByRole('radio', { name: 'Dark' }));
  expect(mockStored).toBe('light');
  expect(screen.getByText(/would not store the choice/)).toBeTruthy();
});
