import { StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { type RideStatus, rideStatusLabel } from '@/components/status-mark';
import { Text } from '@/components/text';
import { colors, radius, space } from '@/components/theme';
import { approvalConcerns } from '@/features/review/decision-panel/approval-concerns';
import { sharedStyles } from '@/features/review/decision-panel/styles';
import { severityInfo } from '@/features/notices/finding-schema';

/**
 * What stands against approving, said before the approval is sent: a hard warning when the ride would
 * carry riders on this result, a soft one (which may be overridden) for values near their limits.
 */
export function ApprovalWarning({
  warning,
  concerns,
  rideName,
  after,
  onStop,
  onApproveAnyway,
}: {
  warning: 'hard' | 'soft';
  concerns: ReturnType<typeof approvalConcerns>;
  rideName: string;
  after: RideStatus;
  onStop: () => void;
  onApproveAnyway: () => void;
}) {
  const listed = [
    ...concerns.blocking.map((f) => `Finding ${f.number} (${severityInfo[f.severity].label.toLowerCase()})`),
    ...concerns.over.map((e) => `${e.label}: over its limit`),
    ...(warning === 'soft' ? concerns.near.map((e) => `${e.label}: near its limit`) : []),
  ];

  return (
    <View style={styles.warning} role="alert">
      <Text variant="heading">
        {warning === 'hard' ? '▲ Stop the ride with this approval' : '▲ Values near their limits'}
      </Text>
      <Text>
        {listed.join(', ')}.{' '}
        {warning === 'hard'
          ? `${rideName} must not carry riders on this result, but it would stay ${rideStatusLabel(after).toLowerCase()}. Set it out of service with this decision, or return the inspection if the values are wrong.`
          : `${rideName} would stay ${rideStatusLabel(after).toLowerCase()}.`}
      </Text>
      <View style={sharedStyles.buttons}>
        <Button label="Set out of service with this decision" tone="accent" onPress={onStop} />
        {warning === 'soft' ? <Button label="Approve anyway" tone="quiet" onPress={onApproveAnyway} /> : null}
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  warning: {
    gap: space.sm,
    padding: space.md,
    borderRadius: radius.sm,
    borderLeftWidth: 4,
    borderLeftColor: colors.near,
    backgroundColor: colors.nearSoft,
  },
});
