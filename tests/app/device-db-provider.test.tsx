/**
 * The device database provider: children only once the database is open; a plain message, and no app,
 * when another tab holds it or it cannot open; "Try again" re-opens after an ordinary failure.
 */
import { fireEvent, render, screen } from '@testing-library/react-native';

import type { DeviceDb } from '@/features/device-db/connection';
import { DeviceDbLockedError, DeviceDbOpenError } from '@/features/device-db/errors';
import { DeviceDbProvider, useDeviceDb } from '@/features/device-db/provider';
import { Text } from '@/components/text';

jest.mock('@/features/device-db/open-device-db', () => ({ openDeviceDb: jest.fn() }));

const fakeDb = { db: {}, transaction: jest.fn(), close: jest.fn() } as unknown as DeviceDb;

function Child() {
  const db = useDeviceDb();
  return <Text>{db === fakeDb ? 'app with its database' : 'wrong database'}</Text>;
}

test('renders the app once the database is open', async () => {
  render(
    <DeviceDbProvider open={async () => fakeDb}>
      <Child />
    </DeviceDbProvider>,
  );
  expect(screen.getByLabelText('Loading')).toBeTruthy();
  expect(await screen.findByText('app with its database')).toBeTruthy();
});

test('a second tab gets a plain message instead of the app', async () => {
  render(
    <DeviceDbProvider
      open={() => Promise.reject(new DeviceDbLockedError(new Error('NoModificationAllowedError')))}
    >
      <Child />
    </DeviceDbProvider>,
  );
  expect(
    await screen.findByText('Pivotwatch is open in another tab. Close it, then reload this one.'),
  ).toBeTruthy();
  expect(screen.queryByText('app with its database')).toBeNull();
  expect(screen.queryByRole('button', { name: 'Try again' })).toBeNull();
});

test('another failure shows its reason and can be retried', async () => {
  let calls = 0;
  const open = async () => {
    calls++;
    if (calls === 1) throw new DeviceDbOpenError(new Error('disk full'));
    return fakeDb;
  };
  render(
    <DeviceDbProvider open={open}>
      <Child />
    </DeviceDbProvider>,
  );
  expect(await screen.findByText('The data on this device could not be opened: disk full')).toBeTruthy();
  fireEvent.press(screen.getByRole('button', { name: 'Try again' }));
  expect(await screen.findByText('app with its database')).toBeTruthy();
  expect(calls).toBe(2);
});

test('useDeviceDb outside the provider says what is missing', () => {
  jest.spyOn(console, 'error').mockImplementation(() => {});
  expect(() => render(<Child />)).toThrow('useDeviceDb() needs <DeviceDbProvider> above it.');
});
