/**
 * Lazy screens (features/shell/lazy-screen.tsx): a screen whose bundle has not arrived shows the wait and
 * then the screen; one whose bundle was loaded ahead (as a reload of a signed-in page does) draws on its
 * first render, with no wait in between — through React.lazy alone it would suspend for a moment, and
 * React would then hold it back behind the wait (React 19 throttles revealed Suspense content, 300 ms).
 * Either way the screen mounts once: a bundle arriving later does not start it over.
 */
import { act, fireEvent, render, screen } from '@testing-library/react-native';
import { useState } from 'react';
import { Pressable } from 'react-native';

import { Text } from '@/components/text';
import { lazyScreen, loadBundle } from '@/features/shell/lazy-screen';

function Counter() {
  const [n, setN] = useState(0);
  return (
    <Pressable accessibilityRole="button" onPress={() => setN(n + 1)}>
      <Text>{`pressed ${n} times`}</Text>
    </Pressable>
  );
}

test('a bundle still to come: the wait, then the screen', async () => {
  let arrive!: () => void;
  const arrived = new Promise<void>((resolve) => (arrive = resolve));
  const Screen = lazyScreen(async () => {
    await arrived;
    return { Counter };
  }, 'Counter');
  render(<Screen />);
  expect(screen.getByLabelText('Loading')).toBeTruthy();
  await act(async () => arrive());
  expect(await screen.findByText('pressed 0 times')).toBeTruthy();
});

test('a bundle loaded ahead: the screen on the first render, no wait', async () => {
  const load = async () => ({ Counter });
  const Screen = lazyScreen(load, 'Counter');
  await loadBundle(load);
  render(<Screen />);
  // Synchronously, in the very first render.
  expect(screen.getByText('pressed 0 times')).toBeTruthy();
  expect(screen.queryByLabelText('Loading')).toBeNull();
});

test('a screen drawn through the wait keeps its state when drawn again after its bundle arrived', async () => {
  const load = async () => ({ Counter });
  const Screen = lazyScreen(load, 'Counter');
  const view = render(<Screen />);
  fireEvent.press(await screen.findByRole('button'));
  expect(screen.getByText('pressed 1 times')).toBeTruthy();
  view.rerender(<Screen />);
  expect(screen.getByText('pressed 1 times')).toBeTruthy();
});
