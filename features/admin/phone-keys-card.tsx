import { useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { Card } from '@/components/card';
import { FormAlert, type FormProblem } from '@/components/form-alert';
import { QueryState } from '@/components/query-state';
import { Text } from '@/components/text';
import { colors, space } from '@/components/theme';
import { usePhoneKeysQuery, useRevokePhoneKeyMutation } from '@/features/admin/api';
import type { Person } from '@/features/admin/schema';
import type { DeviceKey } from '@/features/ledger/schema';
import { ApiRequestError, OfflineError } from '@/lib/api-errors';
import { formatDate, formatDateTime } from '@/lib/dates';

function problemOf(err: unknown): FormProblem {
  if (err instanceof OfflineError)
    return { message: 'No connection to the server. Nothing changed; try again online.' };
  if (err instanceof ApiRequestError) return { message: err.message };
  return { message: 'Something went wrong. Nothing changed; try again.' };
}

/**
 * The person's phone keys: each sign-in on a phone makes one, and it signs every inspection that phone
 * sends. A lost phone's key is withdrawn here (asked once more in words): the server then refuses anything
 * new signed with it, while what it signed before stays verifiable in the record chain.
 */
export function PhoneKeysCard({ person: p }: { person: Person }) {
  const keys = usePhoneKeysQuery(p.id);
  const revoke = useRevokePhoneKeyMutation(p.id);
  const [asking, setAsking] = useState<DeviceKey | null>(null);
  const [problem, setProblem] = useState<FormProblem | null>(null);
  const run = (key: DeviceKey) => {
    setProblem(null);
    revoke.mutate(key.keyId, {
      onSuccess: () => setAsking(null),
      onError: (err) => {
        setAsking(null);
        setProblem(problemOf(err));
      },
    });
  };
  return (
    <Card accessibilityLabel="Phone keys">
      <Text variant="heading">Phone keys</Text>
      <Text muted>
        Each sign-in on a phone makes a key that signs the inspections it sends. If a phone is lost, withdraw
        its key: nothing new signed with it is accepted, and what it signed before stays verifiable.
      </Text>
      <QueryState query={keys}>
        {(list) => (
          <>
            {list.length === 0 ? <Text muted>No phone keys yet.</Text> : null}
            {list.map((k) => (
              <View key={k.keyId} style={styles.entry}>
                <Text>{k.label ?? 'Phone'}</Text>
                <Text variant="small" muted>
                  {`Key ${k.keyId} · registered ${formatDateTime(k.createdAt)}`}
                  {k.revokedAt ? ` · withdrawn ${formatDate(k.revokedAt)}` : ' · in use'}
                </Text>
                {k.revokedAt ? null : asking?.keyId === k.keyId ? (
                  <View style={styles.ask} role="alert">
                    <Text>
                      {`${p.name}'s phone "${k.label ?? 'Phone'}" will no longer be able to send inspections; ` +
                        'they sign in again on it (or another phone) to make a new key.'}
                    </Text>
                    <View style={styles.buttons}>
                      <Button
                        label="Yes, withdraw key"
                        tone="danger"
                        busy={revoke.isPending}
                        onPress={() => run(k)}
                      />
                      <Button label="Cancel" tone="quiet" onPress={() => setAsking(null)} />
                    </View>
                  </View>
                ) : (
                  <View style={styles.buttons}>
                    <Button label="Withdraw key" tone="quiet" onPress={() => setAsking(k)} />
                  </View>
                )}
              </View>
            ))}
          </>
        )}
      </QueryState>
      <FormAlert problem={problem} />
    </Card>
  );
}

const styles = StyleSheet.create({
  ask: { gap: space.md },
  buttons: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  entry: { gap: 2, paddingVertical: space.xs, borderTopWidth: 1, borderTopColor: colors.border },
});
