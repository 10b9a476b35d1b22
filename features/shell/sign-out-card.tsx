import { router } from 'expo-router';
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { Card } from '@/components/card';
import { FormAlert } from '@/components/form-alert';
import { Text } from '@/components/text';
import { colors, radius, space } from '@/components/theme';
import { signInHref, useSignOutMutation } from '@/features/auth';
import { type UnsentWork, countUnsentWork, releaseDeviceOwner } from '@/features/device-db';
import { useDeviceDb } from '@/features/device-db/ui';
import { sendable, unsentWorkLines } from '@/features/shell/unsent-work';
import { useOnline, useSyncStatus } from '@/features/sync/ui';

const goToSignIn = () => router.replace(signInHref());

/** Sign-out for desk roles: their phone keeps nothing of theirs, so there is nothing to warn about. */
export function SignOutButton() {
  const signOut = useSignOutMutation();
  return (
    <Button
      label="Sign out"
      tone="danger"
      busy={signOut.isPending}
      onPress={() => signOut.mutate(undefined, { onSettled: goToSignIn })}
    />
  );
}

/**
 * Sign-out on an inspector's phone. With work not yet on the server it first says what and how much, and
 * offers to send it now (when online) or to sign out and keep it sealed to this person on the phone.
 * Either way the shared caches are wiped (features/device-db/device-owner).
 */
export function InspectorSignOut() {
  const dev = useDeviceDb();
  const sync = useSyncStatus();
  const online = useOnline();
  const signOut = useSignOutMutation();
  const [unsent, setUnsent] = useState<UnsentWork | null>(null);
  const [checking, setChecking] = useState(false);
  const [problem, setProblem] = useState<string | null>(null);

  const leave = () =>
    signOut.mutate({ beforeClear: () => releaseDeviceOwner(dev) }, { onSettled: goToSignIn });

  const start = async () => {
    setChecking(true);
    setProblem(null);
    try {
      const work = await countUnsentWork(dev);
      if (unsentWorkLines(work).length === 0) leave();
      else setUnsent(work);
    } catch (err) {
      setProblem(err instanceof Error ? err.message : String(err));
    } finally {
      setChecking(false);
    }
  };

  const sendNow = async () => {
    setProblem(null);
    await sync.syncNow();
    const work = await countUnsentWork(dev);
    setUnsent(work);
    if (unsentWorkLines(work).length === 0) return;
    if (sendable(work))
      setProblem('Not everything went through. You can try again or keep it on this phone.');
  };

  if (!unsent)
    return (
      <>
        <FormAlert problem={problem ? { message: problem } : null} />
        <Button
          label="Sign out"
          tone="danger"
          busy={checking || signOut.isPending}
          onPress={() => void start()}
        />
      </>
    );

  const lines = unsentWorkLines(unsent);
  return (
    <Card style={styles.warning} role="alert" testID="sign-out-warning">
      <Text variant="heading" accessibilityRole="header">
        {lines.length === 0 ? 'Everything is on the server' : 'Not yet on the server'}
      </Text>
      {lines.map((line) => (
        <Text key={line}>• {line}</Text>
      ))}
      {lines.length > 0 ? (
        <Text>
          If you sign out now, it stays on this phone locked to you: nobody else who signs in here sees it,
          and it is sent when you sign in again.
        </Text>
      ) : null}
      {problem ? <Text color={colors.danger}>{problem}</Text> : null}
      {sendable(unsent) ? (
        online ? (
          <Button label="Send now" busy={sync.running} onPress={() => void sendNow()} />
        ) : (
          <Text muted>No connection: it cannot be sent from here now.</Text>
        )
      ) : null}
      <View style={styles.actions}>
        <Button
          label={lines.length === 0 ? 'Sign out' : 'Sign out and keep it for me here'}
          tone="danger"
          busy={signOut.isPending}
          disabled={sync.running}
          onPress={leave}
        />
        <Button label="Stay signed in" tone="quiet" onPress={() => setUnsent(null)} />
      </View>
    </Card>
  );
}

const styles = StyleSheet.create({
  warning: {
    borderLeftWidth: 4,
    borderLeftColor: colors.near,
    backgroundColor: colors.nearSoft,
    borderRadius: radius.md,
  },
  actions: { gap: space.sm },
});
