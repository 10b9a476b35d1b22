import { useLocalSearchParams } from 'expo-router';

import { Card } from '@/components/card';
import { QueryState } from '@/components/query-state';
import { SubScreen } from '@/components/sub-screen';
import { Text } from '@/components/text';
import { RoleGate } from '@/features/auth/ui';
import { useDesignVersionQuery, useRideQuery } from '@/features/registry/api';
import { DesignPage } from '@/features/registry/design-page';
import { RideNotFound, useRideIdParam } from '@/features/registry/ride-route';
import { staff } from '@/features/registry/screen-access';
import { rideDesignHref, ridesHref } from '@/features/rides';
import type { SessionUser } from '@/features/session/schema';
import { ApiRequestError } from '@/lib/api-errors';

/** One earlier (or the current) version, as it was: versions never change once made. */
export function DesignVersionScreen() {
  const id = useRideIdParam();
  const { version } = useLocalSearchParams<{ version: string }>();
  const n = Number(Array.isArray(version) ? version[0] : version);
  return <RoleGate roles={staff}>{(user) => <OldDesign id={id} version={n} user={user} />}</RoleGate>;
}

function OldDesign({ id, version, user }: { id: string; version: number; user: SessionUser }) {
  const ride = useRideQuery(id);
  const design = useDesignVersionQuery(id, version);
  if (ride.error instanceof ApiRequestError && ride.error.status === 404)
    return <RideNotFound back={{ href: ridesHref, label: 'Rides' }} />;
  if (design.error instanceof ApiRequestError && design.error.status === 404)
    return (
      <SubScreen title="No such version" back={{ href: rideDesignHref(id), label: 'Design data' }}>
        <Card role="alert">
          <Text>This ride has no design data version {String(version)}.</Text>
        </Card>
      </SubScreen>
    );
  return (
    <QueryState query={ride}>
      {({ ride: r, design: current }) => (
        <QueryState query={design}>
          {(d) => <DesignPage ride={r} design={d} currentVersion={current?.version ?? null} user={user} />}
        </QueryState>
      )}
    </QueryState>
  );
}
