import { StyleSheet, View } from 'react-native';

import { Caution } from '@/components/caution';
import { Text } from '@/components/text';
import { space } from '@/components/theme';
import { MeasuredRiderTable, RateTrace } from '@/features/motion-recording/ui';
import type { InspectionDetail } from '@/features/review/inspection-schema';
import { formatQuantity, type UnitSystem } from '@/lib/units';

/**
 * What the inspector recorded with the phone's motion sensors: each record's rate over its whole cycles,
 * and the rider accelerations it measured beside the ones the server computed for that seat, with their
 * limits. Nothing when the inspection has no record.
 */
export function MotionRecordSection({
  inspection,
  system,
}: {
  inspection: InspectionDetail;
  system: UnitSystem;
}) {
  const records = inspection.record.motionRecords ?? [];
  const measured = inspection.analysis?.measuredRider ?? [];
  if (!records.length && !measured.length) return null;
  return (
    <View style={styles.wrap}>
      {records.map((r) => (
        <View key={r.id} style={styles.record}>
          <Text variant="label">
            Pivot {r.joint + 1}: {r.cycles} whole cycle{r.cycles === 1 ? '' : 's'} ·{' '}
            {formatQuantity(r.timeS[r.timeS.length - 1] ?? 0, 'time', system).text} ·{' '}
            {formatQuantity(r.sampleRateHz, 'frequency', system).text}
          </Text>
          <RateTrace
            timeS={r.timeS}
            values={r.rateRadS}
            height={140}
            summary={`Recorded rate of pivot ${r.joint + 1}`}
          />
        </View>
      ))}
      <MeasuredRiderTable measured={measured} computed={inspection.analysis?.seats ?? []} system={system} />
      <Caution />
    </View>
  );
}

const styles = StyleSheet.create({
  wrap: { gap: space.md },
  record: { gap: space.sm },
});
