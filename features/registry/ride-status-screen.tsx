import { router } from 'expo-router';
import { StyleSheet, View } from 'react-native';

import { RideStatusMark } from '@/components/status-mark';
import { SubScreen } from '@/components/sub-screen';
import { Text } from '@/components/text';
import { space } from '@/components/theme';
import { RoleGate } from '@/features/auth/ui';
import { useRideUpdateMutation } from '@/features/registry/api';
import { useRideIdParam } from '@/features/registry/ride-route';
import { StatusForm } from '@/features/registry/status-form';
import { WithRide, FormCard } from '@/features/registry/with-ride';
import { rideHref } from '@/features/rides';
import type { RideSummary } from '@/features/rides/schema';
import { formatDateTime } from '@/lib/dates';

/** Administrators and supervisors set a ride's status, always with a reason when it is not in service. */
export function RideStatusScreen() {
  const id = useRideIdParam();
  return (
    <RoleGate roles={['admin', 'supervisor']}>
      {() => <WithRide id={id}>{(ride) => <RideStatus ride={ride} />}</WithRide>}
    </RoleGate>
  );
}

function RideStatus({ ride }: { ride: RideSummary }) {
  const update = useRideUpdateMutation(ride.id);
  return (
    <SubScreen
      title={`Status of ${ride.name}`}
      subtitle="The operator sees the status and its reason."
      back={{ href: rideHref(ride.id), label: ride.name }}
    >
      <FormCard>
        <View style={styles.now}>
          <Text variant="label" muted>
            NOW
          </Text>
          <RideStatusMark status={ride.status} />
          {ride.statusReason ? <Text>{ride.statusReason}</Text> : null}
          {ride.statusSince ? (
            <Text variant="small" muted>
              Since {formatDateTime(ride.statusSince)}
            </Text>
          ) : null}
        </View>
        <StatusForm
          defaultValues={{ status: ride.status, statusReason: ride.statusReason ?? '', statusSince: '' }}
          onSubmit={async (values) => {
            await update.mutateAsync(values);
            router.replace(rideHref(ride.id));
          }}
          onCancel={() => router.back()}
        />
      </FormCard>
    </SubScreen>
  );
}

const styles = StyleSheet.create({
  now: { gap: space.xs },
});
