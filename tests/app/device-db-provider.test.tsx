/**
 * The device database provider: children only once the database is open (or at once, on a handle that
 * waits for it, when told to render early); a plain message, and no app,
 * when another tab holds it or it cannot open; "Try again" re-opens after an ordinary failure.
 */
import { act, fireEvent, render, screen } from '@testing-library/react-native';

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

describe('told to render early (a glimpse of Today is there to show)', () => {
  /** A real device database in memory, and a promise the test settles to say when it has "opened". */
  async function slowOpening() {
    const db = await memoryDeviceDb();
    let finish!: (ok: boolean) => void;
    const opened = new Promise<boolean>((resolve) => (finish = resolve));
    const open = async () => {
      if (!(await opened)) throw new DeviceDbLockedError(new Error('NoModificationAllowedError'));
      return db;
    };
    return { db, open, finish };
  }

  function Reader({ onHandle }: { onHandle: (db: DeviceDb) => void }) {
    const handle = useDeviceDb();
    onHandle(handle);
    return <Text>screens drawn</Text>;
  }

  test('draws the screens at once; their statements wait for the database and for prepare', async () => {
    const { db, open, finish } = await slowOpening();
    const order: string[] = [];
    const handles = new Set<DeviceDb>();
    const prepare = async (opened: DeviceDb) => {
      expect(opened).toBe(db);
      order.push('prepare');
    };
    render(
      <DeviceDbProvider open={open} prepare={prepare} early>
        <Reader onHandle={(h) => handles.add(h)} />
      </DeviceDbProvider>,
    );
    expect(screen.getByText('screens drawn')).toBeTruthy();
    expect(screen.queryByLabelText('Loading')).toBeNull();
    const [handle] = [...handles];
    const read = handle.run('SELECT 41 + 1', [], 'get').then((r) => {
      order.push('statement');
      return r.rows;
    });
    await new Promise((resolve) => setTimeout(resolve, 20));
    expect(order).toEqual([]);
    finish(true);
    expect(await read).toEqual([42]);
    expect(order).toEqual(['prepare', 'statement']);
    // Once open, the screens keep the handle they started with (nothing keyed on it starts again).
    await screen.findByText('screens drawn');
    await act(async () => {});
    expect(handles.size).toBe(1);
  });

  test('a database that then cannot open replaces the screens with the plain message', async () => {
    const { open, finish } = await slowOpening();
    render(
      <DeviceDbProvider open={open} early>
        <Reader onHandle={() => undefined} />
      </DeviceDbProvider>,
    );
    expect(screen.getByText('screens drawn')).toBeTruthy();
    finish(false);
    expect(
      await screen.findByText('Pivotwatch is open in another tab. Close it, then reload this one.'),
    ).toBeTruthy();
    expect(screen.queryByText('screens drawn')).toBeNull();
  });
});

test('a failed prepare (binding the phone to the person) says so and can be retried', async () => {
  let calls = 0;
  const prepare = async () => {
    calls++;
    if (calls === 1) throw new Error('The phone’s storage refused the change.');
  };
  render(
    <DeviceDbProvider open={async () => fakeDb} prepare={prepare}>
      <Child />
    </DeviceDbProvider>,
  );
  expect(await screen.findByText('This phone could not be set up for you')).toBeTruthy();
  expect(screen.getByText('The phone’s storage refused the change.')).toBeTruthy();
  expect(screen.queryByText('app with its database')).toBeNull();
  fireEvent.press(screen.getByRole('button', { name: 'Try again' }));
  expect(await screen.findByText('app with its database')).toBeTruthy();
  expect(calls).toBe(2);
});
