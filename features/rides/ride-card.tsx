import { StyleSheet, View } from 'react-native';

import { Card } from '@/components/card';
import { RideStatusMark } from '@/components/status-mark';
import { Text } from '@/components/text';
import { space } from '@/components/theme';
import { type RideSummary, rideClassLabel } from '@/features/rides/schema';

export function RideCard({ ride, showOperator = true }: { ride: RideSummary; showOperator?: boolean }) {
  const makerLine = [ride.maker, ride.model, ride.serial ? `s/n ${ride.serial}` : null]
    .filter(Boolean)
    .join(' · ');
  return (
    <Card accessibilityLabel={`Ride ${ride.name}`}>
      <View style={styles.head}>
        <View style={styles.titles}>
          <Text variant="heading">{ride.name}</Text>
          <Text variant="small" muted>
            {rideClassLabel[ride.rideClass]} · {ride.siteName ?? 'No site'}
          </Text>
        </View>
        <RideStatusMark status={ride.status} compact />
      </View>
      {ride.description ? <Text variant="small">{ride.description}</Text> : null}
      {makerLine ? (
        <Text variant="small" muted>
          {makerLine}
        </Text>
      ) : null}
      {showOperator ? <Text variant="small">{ride.operatorName}</Text> : null}
      {ride.status !== 'in_service' && ride.statusReason ? (
        <Text variant="small">Reason: {ride.statusReason}</Text>
      ) : null}
    </Card>
  );
}

const styles = StyleSheet.create({
  head: { flexDirection: 'row', justifyContent: 'space-between', alignItems: 'flex-start', gap: space.md },
  titles: { flexShrink: 1, gap: 2 },
});
