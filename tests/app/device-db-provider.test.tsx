/**
 * The device database provider: children only once the database is open; a plain message, and no app,
 * when another tab holds it or it cannot open; "Try again" re-opens after an ordinary failure. Early mode
 * (Today drawn from its snapshot meanwhile): children at once, every statement after the opening and the
 * binding.
 */
import { fireEvent, render, screen } from '@testing-library/react-native';
import { sql } from 'drizzle-orm';

import type { DeviceDb } from '@/features/device-db/connection';
import { DeviceDbLockedError, DeviceDbOpenError } from '@/features/device-db/errors';
import { DeviceDbProvider, useDeviceDb } from '@/features/device-db/provider';
import { Text } from '@/components/text';

import { memoryDeviceDb } from '@/tests/support/memory-device-db';

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

describe('early (a snapshot of Today to draw meanwhile)', () => {
  function EarlyChild() {
    const db = useDeviceDb();
    return <Text>{db === fakeDb ? 'the raw database' : 'a handle that waits'}</Text>;
  }

  test('children render at once with a waiting handle; it stays the same object once open', async () => {
    let finishOpen!: (db: DeviceDb) => void;
    const order: string[] = [];
    const real = await memoryDeviceDb();
    const open = () =>
      new Promise<DeviceDb>((resolve) => {
        finishOpen = resolve;
      });
    const prepare = async () => {
      order.push('prepared');
    };
    let seen: DeviceDb | null = null;
    function Reader() {
      const db = useDeviceDb();
      seen ??= db;
      return <Text>{db === seen ? 'same handle' : 'handle changed'}</Text>;
    }
    render(
      <DeviceDbProvider open={open} prepare={prepare} early>
        <EarlyChild />
        <Reader />
      </DeviceDbProvider>,
    );
    // No wait: the children are there before the database has opened.
    expect(screen.queryByLabelText('Loading')).toBeNull();
    expect(screen.getByText('a handle that waits')).toBeTruthy();
    const read = seen!.db.all<{ one: number }>(sql`SELECT 1 AS one`).then((rows) => {
      order.push('read');
      return rows;
    });
    finishOpen(real);
    expect(await read).toEqual([[1]]);
    // The read ran only after the database was prepared (bound to its person).
    expect(order).toEqual(['prepared', 'read']);
    expect(await screen.findByText('same handle')).toBeTruthy();
    await real.close();
  });

  test('a second tab still gets the plain message instead of the app', async () => {
    render(
      <DeviceDbProvider
        open={() => Promise.reject(new DeviceDbLockedError(new Error('NoModificationAllowedError')))}
        early
      >
        <EarlyChild />
      </DeviceDbProvider>,
    );
    expect(
      await screen.findByText('Pivotwatch is open in another tab. Close it, then reload this one.'),
    ).toBeTruthy();
    expect(screen.queryByText('a handle that waits')).toBeNull();
  });
});
