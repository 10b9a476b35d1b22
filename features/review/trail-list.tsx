import { StyleSheet, View } from 'react-native';

import { Spinner } from '@/components/spinner';
import { Button } from '@/components/button';
import { Text } from '@/components/text';
import { colors, space } from '@/components/theme';
import { useWide } from '@/components/use-wide';
import { auditEntityLabel } from '@/features/registry/ui';
import type { AuditAction } from '@/features/registry/schema/audit';
import { formatDateTime } from '@/lib/dates';
import { useInspectionTrail } from '@/features/review/inspection-api';

/** An inspection's trail only ever holds create/update/delete; the people words read sensibly anyway. */
const actionWord: Record<AuditAction, string> = {
  create: 'Added',
  update: 'Changed',
  delete: 'Removed',
  invite: 'Invited',
  password_set: 'Password set for',
  password_change: 'Password changed for',
  password_reset: 'Password reset for',
  disable: 'Disabled',
  enable: 'Re-enabled',
  sign_out: 'Signed out',
  sign_in_failed: 'Failed sign-in for',
};

/** Who did what to this inspection and its findings, and when: newest first, as the server keeps it. */
export function TrailList({ inspectionId }: { inspectionId: string }) {
  const wide = useWide();
  const trail = useInspectionTrail(inspectionId);
  if (trail.isPending) return <Spinner color={colors.base} />;
  if (trail.error || !trail.data) {
    return (
      <View style={styles.problem} role="alert">
        <Text muted>The history of this inspection could not be loaded.</Text>
        <Button label="Try again" tone="quiet" onPress={() => trail.refetch()} />
      </View>
    );
  }
  if (trail.data.length === 0) return <Text muted>Nothing has been recorded about this inspection yet.</Text>;
  return (
    <View style={styles.list} role="list" accessibilityLabel="History of this inspection">
      {trail.data.map((e) => (
        <View key={e.id} style={wide ? styles.rowWide : styles.row} role="listitem">
          <Text variant="figure" style={wide ? styles.when : undefined}>
            {formatDateTime(e.at)}
          </Text>
          <Text variant="heading" style={wide ? styles.who : undefined}>
            {e.userName ?? 'Unknown'}
          </Text>
          <Text style={wide ? styles.what : undefined}>
            <Text variant="label" muted>
              {`${actionWord[e.action]} ${auditEntityLabel[e.entity].toLowerCase()} · `}
            </Text>
            {e.summary}
          </Text>
        </View>
      ))}
    </View>
  );
}

const styles = StyleSheet.create({
  problem: { gap: space.sm, alignItems: 'flex-start' },
  list: { gap: 0 },
  row: { gap: 2, paddingVertical: space.sm, borderTopWidth: 1, borderTopColor: colors.surfaceSunk },
  rowWide: {
    flexDirection: 'row',
    alignItems: 'baseline',
    gap: space.md,
    paddingVertical: space.sm,
    borderTopWidth: 1,
    borderTopColor: colors.surfaceSunk,
  },
  when: { width: 170 },
  who: { width: 160 },
  what: { flex: 1 },
});
