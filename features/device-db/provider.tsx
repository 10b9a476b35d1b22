/**
 * Opens the device database once, before any screen uses it, and hands it down. While it opens the app
 * shows the usual wait; when it can't open, a plain message instead of a half-working app — above all
 * when another browser tab holds the database.
 */
import { createContext, useContext, useEffect, useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { FullScreenWait } from '@/components/full-screen-wait';
import { Text } from '@/components/text';
import { colors, space } from '@/components/theme';
import { type DeviceDb, createGatedDeviceDb } from '@/features/device-db/connection';
import { exposeDiagnostics } from '@/features/device-db/diagnostics';
import { DeviceDbLockedError } from '@/features/device-db/errors';
import { openDeviceDb } from '@/features/device-db/open-device-db';
import { requestPersistentStorage } from '@/features/device-db/storage-space';

const DeviceDbContext = createContext<DeviceDb | null>(null);

type State =
  | { status: 'opening'; gated?: ReturnType<typeof createGatedDeviceDb> }
  | { status: 'ready'; db: DeviceDb }
  | { status: 'locked'; message: string }
  | { status: 'failed'; message: string };

type Props = {
  children: React.ReactNode;
  /** Replaced in tests. */
  open?: () => Promise<DeviceDb>;
  /** Run on the opened database before anyone else may use it (binding it to its person). */
  prepare?: (db: DeviceDb) => Promise<void>;
  /**
   * Render the children at once, while the database opens, with a handle whose statements wait until it
   * is open and prepared (connection.ts, createGatedDeviceDb): for a screen that can show something of
   * its own meanwhile (Today's snapshot). A failure then replaces the children with its message.
   */
  early?: boolean;
};

const openingState = (early: boolean): State =>
  early ? { status: 'opening', gated: createGatedDeviceDb() } : { status: 'opening' };

export function DeviceDbProvider({ children, open = openDeviceDb, prepare, early = false }: Props) {
  const [state, setState] = useState<State>(() => openingState(early));
  const [attempt, setAttempt] = useState(0);
  const gated = state.status === 'opening' ? state.gated : undefined;

  useEffect(() => {
    let live = true;
    open()
      .then(async (db) => {
        if (prepare) await prepare(db);
        return db;
      })
      .then(
        (db) => {
          const handle = gated ? gated.dev : db;
          gated?.open(db);
          exposeDiagnostics(handle);
          // Unsent inspections live here: ask the browser not to clear them when the disk fills.
          void requestPersistentStorage();
          if (live) setState({ status: 'ready', db: handle });
        },
        (err: unknown) => {
          gated?.fail(err);
          if (!live) return;
          const message = err instanceof Error ? err.message : String(err);
          setState(
            err instanceof DeviceDbLockedError
              ? { status: 'locked', message }
              : { status: 'failed', message },
          );
        },
      );
    return () => {
      live = false;
    };
    // `gated` belongs to this attempt (it is made anew with each); `prepare` is read once per attempt.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [open, attempt]);

  if (state.status === 'opening') {
    if (!state.gated) return <FullScreenWait />;
    return <DeviceDbContext.Provider value={state.gated.dev}>{children}</DeviceDbContext.Provider>;
  }
  if (state.status === 'ready')
    return <DeviceDbContext.Provider value={state.db}>{children}</DeviceDbContext.Provider>;
  return (
    <View style={styles.root}>
      <View style={styles.box} accessibilityRole="alert">
        <Text variant="title" accessibilityRole="header">
          {state.status === 'locked'
            ? 'Already open in another tab'
            : 'The data on this device could not be opened'}
        </Text>
        <Text>{state.message}</Text>
        {state.status === 'failed' ? (
          <Button
            label="Try again"
            onPress={() => {
              setState(openingState(early));
              setAttempt((n) => n + 1);
            }}
          />
        ) : null}
      </View>
    </View>
  );
}

/** The open device database; only inside <DeviceDbProvider>, which renders children only once it is open. */
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
