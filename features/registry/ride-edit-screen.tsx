import { router } from 'expo-router';

import { SubScreen } from '@/components/sub-screen';
import { Text } from '@/components/text';
import { RoleGate } from '@/features/auth/ui';
import { useRideUpdateMutation } from '@/features/registry/api';
import { DeleteAction } from '@/features/registry/delete-action';
import { RideForm, type RideFormInput } from '@/features/registry/ride-form';
import { useRideFormOptions } from '@/features/registry/ride-form-options';
import { useRideIdParam } from '@/features/registry/ride-route';
import { WithRide, FormCard } from '@/features/registry/with-ride';
import { rideHref, ridesHref } from '@/features/rides';
import type { RideSummary } from '@/features/rides/schema';
import type { Role } from '@/features/session/schema';

/** Administrators and supervisors correct a ride's identity and place. */
export function RideEditScreen() {
  const id = useRideIdParam();
  return (
    <RoleGate roles={['admin', 'supervisor']}>
      {(user) => <WithRide id={id}>{(ride) => <RideEdit ride={ride} role={user.role} />}</WithRide>}
    </RoleGate>
  );
}

function RideEdit({ ride, role }: { ride: RideSummary; role: Role }) {
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
      {role === 'admin' ? (
        <FormCard>
          <Text variant="heading">Remove from the register</Text>
          <DeleteAction
            kind="ride"
            id={ride.id}
            noun="ride"
            name={ride.name}
            consequence={
              'The ride leaves the register. Only a ride entered by mistake can go: one with design data, ' +
              'schedules, inspections or notices stays (set it out of service instead). The audit log ' +
              'keeps a record of the removal.'
            }
            listHref={ridesHref}
          />
        </FormCard>
      ) : null}
    </SubScreen>
  );
}
