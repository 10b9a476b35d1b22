import { Link } from 'expo-router';
import { Pressable, StyleSheet, View } from 'react-native';

import { Card, cardLook } from '@/components/card';
import Feather from '@/components/feather-icon';
import { RideStatusMark } from '@/components/status-mark';
import { Text } from '@/components/text';
import { colors, space } from '@/components/theme';
import { rideHref } from '@/features/rides/hrefs';
import { type RideSummary, rideClassLabel } from '@/features/rides/schema';

/** A ride at a glance. With `link`, the whole card opens the ride's page. */
export function RideCard({
  ride,
  showOperator = true,
  link = false,
}: {
  ride: RideSummary;
  showOperator?: boolean;
  link?: boolean;
}) {
  const makerLine = [ride.maker, ride.model, ride.serial ? `s/n ${ride.serial}` : null]
    .filter(Boolean)
    .join(' · ');
  const body = (
    <>
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
    </>
  );
  if (!link) return <Card accessibilityLabel={`Ride ${ride.name}`}>{body}</Card>;
  return (
    <Link href={rideHref(ride.id)} asChild>
      <Pressable
        role="link"
        accessibilityLabel={`Ride ${ride.name}`}
        // Link (asChild) hands its style to the DOM node as-is on web: one flat object.
        style={cardLook}
      >
        {body}
        <View style={styles.open}>
          <Text variant="label" color={colors.accent}>
            Open ride
          </Text>
          <Feather name="chevron-right" size={16} color={colors.accent} />
        </View>
      </Pressable>
    </Link>
  );
}

const styles = StyleSheet.create({
  head: { flexDirection: 'row', justifyContent: 'space-between', alignItems: 'flex-start', gap: space.md },
  titles: { flexShrink: 1, gap: 2 },
  open: { flexDirection: 'row', alignItems: 'center', alignSelf: 'flex-end', gap: 2 },
});
