import { useQueryClient } from '@tanstack/react-query';
import { useEffect, useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { FullScreenWait } from '@/components/full-screen-wait';
import { Text } from '@/components/text';
import { colors, space } from '@/components/theme';
import { bindDeviceOwner } from '@/features/device-db';
import { useDeviceDb } from '@/features/device-db/ui';

type State =
  { status: 'binding' } | { status: 'bound'; userId: string } | { status: 'failed'; message: string };

/**
 * Binds the phone's database to the signed-in person before any screen reads it. When the person changed
 * (someone signed in after another's token ran out, or after a sign-out whose wipe failed) the shared
 * caches are wiped first and the previous person's unsent work stays sealed (features/device-db/device-owner).
 */
export function DeviceOwnerGate({ userId, children }: { userId: string; children: React.ReactNode }) {
  const dev = useDeviceDb();
  const client = useQueryClient();
  const [state, setState] = useState<State>({ status: 'binding' });
  const [attempt, setAttempt] = useState(0);

  useEffect(() => {
    let live = true;
    bindDeviceOwner(dev, userId).then(
      ({ changed }) => {
        // Reads of the device made for someone else must not be shown from memory either.
        if (changed) client.removeQueries({ predicate: (q) => q.queryKey[0] !== 'auth' });
        if (live) setState({ status: 'bound', userId });
      },
      (err: unknown) => {
        if (live) setState({ status: 'failed', message: err instanceof Error ? err.message : String(err) });
      },
    );
    return () => {
      live = false;
    };
  }, [dev, userId, client, attempt]);

  if (state.status === 'bound' && state.userId === userId) return <>{children}</>;
  if (state.status !== 'failed') return <FullScreenWait />;
  return (
    <View style={styles.root}>
      <View style={styles.box} accessibilityRole="alert">
        <Text variant="title" accessibilityRole="header">
          This phone could not be set up for you
        </Text>
        <Text>{state.message}</Text>
        <Button
          label="Try again"
          onPress={() => {
            setState({ status: 'binding' });
            setAttempt((n) => n + 1);
          }}
        />
      </View>
    </View>
  );
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
