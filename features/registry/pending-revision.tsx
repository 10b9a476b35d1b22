import { useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { Card } from '@/components/card';
import Feather from '@/components/feather-icon';
import { Text } from '@/components/text';
import { TextField } from '@/components/text-field';
import { colors, space } from '@/components/theme';
import { useDesignDecisionMutation, useDesignPendingQuery } from '@/features/registry/api';
import { DesignComparison } from '@/features/registry/design-comparison';
import type { SessionUser } from '@/features/session/schema';
import { useUnitSystem } from '@/features/settings';
import { ApiRequestError } from '@/lib/api-errors';
import { formatDateTime } from '@/lib/dates';

/**
 * The revision waiting for a second person, compared field by field with the version in force. Another
 * supervisor or admin approves or rejects it with a reason; its proposer only sees that it waits (the
 * server refuses a proposer's decision too).
 */
export function PendingRevision({ rideId, user }: { rideId: string; user: SessionUser }) {
  const [system] = useUnitSystem();
  const query = useDesignPendingQuery(rideId);
  const decide = useDesignDecisionMutation(rideId);
  const [reason, setReason] = useState('');
  const [error, setError] = useState<string | null>(null);
  const pending = query.data?.pending ?? null;
  const current = query.data?.current ?? null;
  if (!pending) return null;
  const own = pending.createdById === user.id;
  const send = async (decision: 'approve' | 'reject') => {
    setError(null);
    if (!reason.trim()) {
      setError(decision === 'approve' ? 'Say why it may be approved' : 'Say why it is rejected');
      return;
    }
    try {
      await decide.mutateAsync({ version: pending.version, decision, reason: reason.trim() });
      setReason('');
    } catch (err) {
      setError(
        err instanceof ApiRequestError
          ? err.message
          : 'The decision could not be sent. Nothing was changed; try again when online.',
      );
    }
  };
  return (
    <Card style={styles.pending} accessibilityLabel={`Version ${pending.version} waits for approval`}>
      <View style={styles.pendingHead}>
        <Feather name="clock" size={20} color={colors.near} />
        <Text variant="heading" role="heading" aria-level={2} style={styles.flex}>
          Version {pending.version} waits for a second person
        </Text>
      </View>
      <Text>
        Proposed by {pending.createdByName}, {formatDateTime(pending.createdAt)}: “{pending.reason}”.{' '}
        {pending.data.source.document}, revision {pending.data.source.revision}.
      </Text>
      <DesignComparison
        before={current?.data ?? null}
        after={pending.data}
        system={system}
        beforeLabel={current ? `version ${current.version}` : 'nothing yet'}
        afterLabel={`version ${pending.version}`}
      />
      {own ? (
        <View style={styles.pendingHead} role="note">
          <Feather name="users" size={18} color={colors.textMuted} />
          <Text muted style={styles.flex}>
            You proposed this version: another supervisor or an admin must approve or reject it.
          </Text>
        </View>
      ) : (
        <View style={styles.decision}>
          <TextField
            label="Your reason"
            hint="Kept with the version and in the audit log, e.g. “Checked against the maker’s letter of 12 May”."
            value={reason}
            onChangeText={setReason}
            error={error ?? undefined}
            multiline
          />
          <View style={styles.buttons}>
            <Button
              label={`Approve version ${pending.version}`}
              tone="accent"
              icon={<Feather name="check" size={18} color={colors.baseText} />}
              busy={decide.isPending && decide.variables?.decision === 'approve'}
              disabled={decide.isPending}
              onPress={() => send('approve')}
            />
            <Button
              label="Reject"
              tone="quiet"
              icon={<Feather name="x" size={18} color={colors.text} />}
              busy={decide.isPending && decide.variables?.decision === 'reject'}
              disabled={decide.isPending}
              onPress={() => send('reject')}
            />
          </View>
        </View>
      )}
    </Card>
  );
}

const styles = StyleSheet.create({
  flex: { flex: 1 },
  buttons: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  pending: { gap: space.md, borderColor: colors.near, borderWidth: 2 },
  pendingHead: { flexDirection: 'row', alignItems: 'center', gap: space.sm },
  decision: { gap: space.md },
});
