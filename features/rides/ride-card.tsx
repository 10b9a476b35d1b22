import { StyleSheet, View } from 'react-native';

import { Card } from '@/components/card';
import { LinkCard } from '@/components/link-card';
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
  const rest = (
    <>
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
  const head = (title: React.ReactNode) => (
    <View style={styles.head}>
      <View style={styles.titles}>
        {title}
        <Text variant="small" muted>
          {rideClassLabel[ride.rideClass]} · {ride.siteName ?? 'No site'}
        </Text>
      </View>
      <RideStatusMark status={ride.status} compact />
    </View>
  );
  const name = <Text variant="heading">{ride.name}</Text>;
  if (!link)
    return (
      <Card accessibilityLabel={`Ride ${ride.name}`}>
        {head(name)}
        {rest}
      </Card>
    );
  return (
    <LinkCard href={rideHref(ride.id)} label={`Ride ${ride.name}`} title={name}>
      {(titleLink) => (
        <>
          {head(titleLink)}
          {rest}
          <View style={styles.open}>
            <Text variant="label" color={colors.accent}>
              Open ride
            </Text>
            <Feather name="chevron-right" size={16} color={colors.accent} />
          </View>
        </>
      )}
    </LinkCard>
  );
}

const styles = StyleSheet.create({
  head: { flexDirection: 'row', justifyContent: 'space-between', alignItems: 'flex-start', gap: space.md },
  titles: { flexShrink: 1, gap: 2 },
  open: { flexDirection: 'row', alignItems: 'center', alignSelf: 'flex-end', gap: 2 },
});
