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
import type { DeviceDb } from '@/features/device-db/connection';
import { exposeDiagnostics } from '@/features/device-db/diagnostics';
import { DeviceDbLockedError } from '@/features/device-db/errors';
import { openDeviceDb } from '@/features/device-db/open-device-db';
import { requestPersistentStorage } from '@/features/device-db/storage-space';

const DeviceDbContext = createContext<DeviceDb | null>(null);

type State =
  | { status: 'opening' }
  | { status: 'ready'; db: DeviceDb }
  | { status: 'locked'; message: string }
  | { status: 'failed'; message: string };

type Props = {
  children: React.ReactNode;
  /** Replaced in tests. */
  open?: () => Promise<DeviceDb>;
};

export function DeviceDbProvider({ children, open = openDeviceDb }: Props) {
  const [state, setState] = useState<State>({ status: 'opening' });
  const [attempt, setAttempt] = useState(0);

  useEffect(() => {
    let live = true;
    open().then(
      (db) => {
        exposeDiagnostics(db);
        // Unsent inspections live here: ask the browser not to clear them when the disk fills.
        void requestPersistentStorage();
        if (live) setState({ status: 'ready', db });
      },
      (err: unknown) => {
        if (!live) return;
        const message = err instanceof Error ? err.message : String(err);
        setState(
          err instanceof DeviceDbLockedError ? { status: 'locked', message } : { status: 'failed', message },
        );
      },
    );
    return () => {
      live = false;
    };
  }, [open, attempt]);

  if (state.status === 'opening') return <FullScreenWait />;
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
              setState({ status: 'opening' });
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
