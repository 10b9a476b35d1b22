import { StyleSheet, View } from 'react-native';

import { space } from '@/components/theme';
import { useWide } from '@/components/use-wide';
import { RideCard } from '@/features/rides/ride-card';
import type { RideSummary } from '@/features/rides/schema';

/** Ride cards: one column on a phone, a grid on a desktop. Each card opens its ride's page. */
export function RideGrid({
  rides,
  showOperator,
  link = true,
}: {
  rides: RideSummary[];
  showOperator?: boolean;
  link?: boolean;
}) {
  const wide = useWide();
  return (
    <View style={[styles.grid, wide && styles.gridWide]}>
      {rides.map((ride) => (
        <View key={ride.id} style={wide ? styles.cellWide : undefined}>
          <RideCard ride={ride} showOperator={showOperator} link={link} />
        </View>
      ))}
    </View>
  );
}

const styles = StyleSheet.create({
  grid: { gap: space.md },
  gridWide: { flexDirection: 'row', flexWrap: 'wrap' },
  cellWide: { flexBasis: 340, flexGrow: 1, maxWidth: 560 },
});
