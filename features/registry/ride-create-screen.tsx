import { router } from 'expo-router';

import { SubScreen } from '@/components/sub-screen';
import { Text } from '@/components/text';
import { RoleGate } from '@/features/auth/ui';
import { useRideCreateMutation } from '@/features/registry/api';
import { RideForm, blankRide } from '@/features/registry/ride-form';
import { useRideFormOptions } from '@/features/registry/ride-form-options';
import { FormCard } from '@/features/registry/with-ride';
import { rideHref, ridesHref } from '@/features/rides';

/** Only administrators add rides to the register (the API's rule). */
export function RideCreateScreen() {
  return <RoleGate roles={['admin']}>{() => <RideCreate />}</RoleGate>;
}

function RideCreate() {
  const options = useRideFormOptions();
  const create = useRideCreateMutation();
  return (
    <SubScreen
      title="New ride"
      subtitle="Add a ride to the register."
      back={{ href: ridesHref, label: 'Rides' }}
    >
      <FormCard>
        {options.ready ? (
          <RideForm
            mode="create"
            defaultValues={blankRide}
            operators={options.operators}
            sites={options.sites}
            onSubmit={async (values) => {
              const { ride } = await create.mutateAsync(values);
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
