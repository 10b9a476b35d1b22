/**
 * Opens the device database once, before any screen uses it, and hands it down. While it opens the app
 * shows the usual wait (or, told to render early, the screens on a handle that waits for it); when it
 * can't open, a plain message instead of a half-working app — above all when another browser tab holds
 * the database.
 */
import { createContext, useContext, useEffect, useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { FullScreenWait } from '@/components/full-screen-wait';
import { Text } from '@/components/text';
import { colors, space } from '@/components/theme';
import { type DeviceDb, deferredDeviceDb } from '@/features/device-db/connection';
import { exposeDiagnostics } from '@/features/device-db/diagnostics';
import { DeviceDbLockedError } from '@/features/device-db/errors';
import { openDeviceDb } from '@/features/device-db/open-device-db';
import { requestPersistentStorage } from '@/features/device-db/storage-space';

const DeviceDbContext = createContext<DeviceDb | null>(null);

type State =
  | { status: 'opening' }
  | { status: 'ready'; db: DeviceDb }
  | { status: 'locked'; message: string }
  | { status: 'failed'; message: string }
  | { status: 'unprepared'; message: string };

/** One attempt at opening: the database once open and prepared, and a handle that waits for it. */
type Opening = { ready: Promise<DeviceDb>; handle: DeviceDb };

function startOpening(open: () => Promise<DeviceDb>, prepare?: (db: DeviceDb) => Promise<void>): Opening {
  const ready = open().then(async (db) => {
    try {
      await prepare?.(db);
    } catch (err) {
      throw new PrepareError(err);
    }
    return db;
  });
  ready.catch(() => undefined);
  return { ready, handle: deferredDeviceDb(ready) };
}

type Props = {
  children: React.ReactNode;
  /** Replaced in tests. */
  open?: () => Promise<DeviceDb>;
  /**
   * Runs on the open database before any screen's statement does (binding the phone to the signed-in
   * person); when it fails the app shows its reason and a "Try again" instead of the screens.
   */
  prepare?: (db: DeviceDb) => Promise<void>;
  /**
   * Render the screens while the database opens, on a handle whose statements wait for it (and for
   * `prepare`): for a page that already has something to show, e.g. the phone's last Today from memory.
   */
  early?: boolean;
};

export function DeviceDbProvider({ children, open = openDeviceDb, prepare, early = false }: Props) {
  const [opening, setOpening] = useState(() => startOpening(open, prepare));
  const [state, setState] = useState<State>({ status: 'opening' });

  useEffect(() => {
    let live = true;
    opening.ready.then(
      (db) => {
        exposeDiagnostics(db);
        // Unsent inspections live here: ask the browser not to clear them when the disk fills.
        void requestPersistentStorage();
        // Early screens keep the handle they started with, so nothing keyed on it starts again.
        if (live) setState({ status: 'ready', db: early ? opening.handle : db });
      },
      (err: unknown) => {
        if (!live) return;
        const message = messageOf(err instanceof PrepareError ? err.cause : err);
        setState(
          err instanceof PrepareError
            ? { status: 'unprepared', message }
            : err instanceof DeviceDbLockedError
              ? { status: 'locked', message }
              : { status: 'failed', message },
        );
      },
    );
    return () => {
      live = false;
    };
  }, [opening, early]);

  const provide = (db: DeviceDb) => (
    <DeviceDbContext.Provider value={db}>{children}</DeviceDbContext.Provider>
  );
  if (state.status === 'ready') return provide(state.db);
  if (state.status === 'opening') return early ? provide(opening.handle) : <FullScreenWait />;
  return (
    <View style={styles.root}>
      <View style={styles.box} accessibilityRole="alert">
        <Text variant="title" accessibilityRole="header">
          {state.status === 'locked'
            ? 'Already open in another tab'
            : state.status === 'unprepared'
              ? 'This phone could not be set up for you'
              : 'The data on this device could not be opened'}
        </Text>
        <Text>{state.message}</Text>
        {state.status !== 'locked' ? (
          <Button
            label="Try again"
            onPress={() => {
              setState({ status: 'opening' });
              setOpening(startOpening(open, prepare));
            }}
          />
        ) : null}
      </View>
    </View>
  );
}

/** `prepare` failed: the database opened, but is not fit for this person yet. */
class PrepareError extends Error {
  constructor(readonly cause: unknown) {
    super(messageOf(cause));
  }
}

const messageOf = (err: unknown) => (err instanceof Error ? err.message : String(err));

/**
 * The device database; only inside <DeviceDbProvider>, which renders children once it is open (or, when
 * told to render early, with a handle whose statements wait for it).
 */
export function useDeviceDb(): DeviceDb {
  const db = useContext(DeviceDbContext);
  if (!db) throw new Error('useDeviceDb() needs <DeviceDbProvider> above it.');
  return db;
}

/** The open device database, or null where none is open (desk roles keep nothing on the device). */
export function useOptionalDeviceDb(): DeviceDb | null {
  return useContext(DeviceDbContext);
}

const styles = StyleSheet.create({
  root: {
    flex: 1,
    alignItems: 'center',
    justifyContent: 'center',
    backgroundColor: colors.bg,
    padding: space.xl,
  },
  box: { maxWidth: 480, gap: space.md },
});
