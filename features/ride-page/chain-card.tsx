import { useQuery } from '@tanstack/react-query';
import { useLocalSearchParams } from 'expo-router';
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { Card } from '@/components/card';
import { Text } from '@/components/text';
import { colors, space } from '@/components/theme';
import { apiFetch } from '@/features/api';
import { chainCaveat, chainVerdictText, chainVerificationSchema } from '@/features/ledger/schema';
import { formatDate, formatDateTime } from '@/lib/dates';

/**
 * The ride's record chain: **Verify record** asks the server to check it (GET /api/rides/:id/chain/verify)
 * and says in plain words whether it is intact or where it first breaks, and whose phones signed its
 * records (a withdrawn key still vouches for what it signed before). Opened from a notice's QR
 * (`?verify=1`), the check runs at once.
 */
export function ChainCard({ rideId }: { rideId: string }) {
  const { verify } = useLocalSearchParams<{ verify?: string }>();
  const [asked, setAsked] = useState(verify === '1');
  const check = useQuery({
    queryKey: ['ride-chain', rideId],
    queryFn: () =>
      apiFetch(`/api/rides/${encodeURIComponent(rideId)}/chain/verify`, { schema: chainVerificationSchema }),
    enabled: asked,
    gcTime: 0,
  });
  const result = check.data;
  return (
    <Card accessibilityLabel="Record chain">
      <Text variant="heading">Record chain</Text>
      <Text muted>
        Every accepted inspection, decision, finding, NDT record and notice of this ride is kept in a hashed,
        countersigned chain.
      </Text>
      <Button
        label="Verify record"
        tone="quiet"
        busy={check.isFetching}
        onPress={() => (asked ? void check.refetch() : setAsked(true))}
        style={styles.button}
      />
      <View role="status" aria-live="polite">
        {check.error ? (
          <Text color={colors.danger}>The check could not be made: {check.error.message}</Text>
        ) : result ? (
          <>
            <Text color={result.intact ? colors.within : colors.danger}>
              {result.intact ? '✓ ' : '✗ '}
              {chainVerdictText(result)}
            </Text>
            {result.signers.map((s) => (
              <Text key={s.keyId} variant="small">
                {`Signed on the phone by: ${s.personName} (${s.records} ${s.records === 1 ? 'record' : 'records'})`}
                {s.revokedAt ? `, key withdrawn ${formatDate(s.revokedAt)}` : ''}
              </Text>
            ))}
            <Text variant="small" muted>
              Checked {formatDateTime(result.checkedAt)}. {chainCaveat}
            </Text>
          </>
        ) : null}
      </View>
    </Card>
  );
}

const styles = StyleSheet.create({
  button: { alignSelf: 'flex-start', marginVertical: space.sm },
});
