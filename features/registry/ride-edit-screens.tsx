import { router } from 'expo-router';
import { StyleSheet, View } from 'react-native';

import { Card } from '@/components/card';
import { QueryState } from '@/components/query-state';
import { RideStatusMark } from '@/components/status-mark';
import { SubScreen } from '@/components/sub-screen';
import { Text } from '@/components/text';
import { space } from '@/components/theme';
import { ApiRequestError } from '@/lib/api-errors';
import { RoleGate } from '@/features/auth';
import {
  operatorChoices,
  useCompanyListQuery,
  useRideCreateMutation,
  useRideUpdateMutation,
  useSiteListQuery,
  useRideQuery,
} from '@/features/registry/api';
import { RideNotFound, useRideIdParam } from '@/features/registry/ride-route';
import { type Option, RideForm, type RideFormInput } from '@/features/registry/ride-form';
import { StatusForm } from '@/features/registry/status-form';
import { formatDateTime } from '@/lib/dates';
import { rideHref, ridesHref } from '@/features/rides';
import type { RideSummary } from '@/features/rides/schema';

const LOOKUP = { pageSize: 200, sort: 'name' } as const;

/** Operator companies and sites as the ride form offers them. */
function useRideFormOptions() {
  const companies = useCompanyListQuery(LOOKUP);
  const sites = useSiteListQuery(LOOKUP);
  const operators: Option[] = operatorChoices(companies.data?.companies);
  const siteOptions: Option[] = (sites.data?.sites ?? []).map((s) => ({
    value: s.id,
    label: s.name,
    hint: s.locality ?? undefined,
    operatorId: s.operatorCompanyId,
  }));
  return {
    ready: !!companies.data && !!sites.data,
    failed: !!companies.error || !!sites.error,
    operators,
    sites: siteOptions,
  };
}

/** Only administrators add rides to the register (the API's rule). */
export function RideCreateScreen() {
  return <RoleGate roles={['admin']}>{() => <RideCreate />}</RoleGate>;
}

function RideCreate() {
  const options = useRideFormOptions();
  const create = useRideCreateMutation();
  const blank: RideFormInput = {
    name: '',
    rideClass: 'pendulum_swing',
    description: '',
    maker: '',
    model: '',
    serial: '',
    year: null,
    siteId: null,
    operatorCompanyId: '',
    status: 'in_service',
    statusReason: '',
  };
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
            defaultValues={blank}
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

/** Loads the ride of the route; a 404 (unknown or not the caller's) shows "not found". */
export function WithRide({ id, children }: { id: string; children: (ride: RideSummary) => React.ReactNode }) {
  const ride = useRideQuery(id);
  if (ride.error instanceof ApiRequestError && ride.error.status === 404)
    return <RideNotFound back={{ href: ridesHref, label: 'Rides' }} />;
  return <QueryState query={ride}>{(d) => children(d.ride)}</QueryState>;
}

/** Forms keep a readable line length on a desktop. */
export function FormCard({ children }: { children: React.ReactNode }) {
  return <Card style={styles.card}>{children}</Card>;
}

const styles = StyleSheet.create({
  card: { maxWidth: 760, width: '100%', gap: space.lg },
  now: { gap: space.xs },
});
