import { router } from 'expo-router';

import { SubScreen } from '@/components/sub-screen';
import { Text } from '@/components/text';
import { RoleGate } from '@/features/auth/ui';
import { useRideUpdateMutation } from '@/features/registry/api';
import { RideForm, type RideFormInput } from '@/features/registry/ride-form';
import { useRideFormOptions } from '@/features/registry/ride-form-options';
import { useRideIdParam } from '@/features/registry/ride-route';
import { WithRide, FormCard } from '@/features/registry/with-ride';
import { rideHref } from '@/features/rides';
import type { RideSummary } from '@/features/rides/schema';

/** Administrators and supervisors correct a ride's identity and place. */
export function RideEditScreen() {
  const id = useRideIdParam();
  return (
    <RoleGate roles={['admin', 'supervisor']}>
      {() => <WithRide id={id}>{(ride) => <RideEdit ride={ride} />}</WithRide>}
    </RoleGate>
  );
}

function RideEdit({ ride }: { ride: RideSummary }) {
  const options = useRideFormOptions();
  const update = useRideUpdateMutation(ride.id);
  const values: RideFormInput = {
    name: ride.name,
    rideClass: ride.rideClass,
    description: ride.description ?? '',
    maker: ride.maker ?? '',
    model: ride.model ?? '',
    serial: ride.serial ?? '',
    year: ride.year,
    siteId: ride.siteId,
    operatorCompanyId: ride.operatorCompanyId,
    status: ride.status,
    statusReason: ride.statusReason,
  };
  return (
    <SubScreen
      title={`Edit ${ride.name}`}
      subtitle="Identity and place. The status has its own page, with its reason."
      back={{ href: rideHref(ride.id), label: ride.name }}
    >
      <FormCard>
        {options.ready ? (
          <RideForm
            mode="edit"
            defaultValues={values}
            operators={options.operators}
            sites={options.sites}
            onSubmit={async ({ status: _s, statusReason: _r, statusSince: _t, ...identity }) => {
              await update.mutateAsync(identity);
              router.replace(rideHref(ride.id));
            }}
            onCancel={() => router.back()}
          />
        ) : (
          <Text muted>{options.failed ? 'Companies and sites could not be loaded.' : 'Loading…'}</Text>
        )}
      </FormCard>
    </SubScreen>
  );
}
