import { Card } from '@/components/card';
import { QueryState } from '@/components/query-state';
import { SubScreen } from '@/components/sub-screen';
import { Text } from '@/components/text';
import { RoleGate } from '@/features/auth/ui';
import { useRideQuery } from '@/features/registry/api';
import { DesignPage } from '@/features/registry/design-page';
import { RideNotFound, useRideIdParam } from '@/features/registry/ride-route';
import { staff } from '@/features/registry/screen-access';
import { rideHref, ridesHref } from '@/features/rides';
import type { SessionUser } from '@/features/session/schema';
import { ApiRequestError } from '@/lib/api-errors';

/** A ride's current design data in full: drawing, peaks, every table, export, and its version history. */
export function DesignScreen() {
  const id = useRideIdParam();
  return <RoleGate roles={staff}>{(user) => <CurrentDesign id={id} user={user} />}</RoleGate>;
}

function CurrentDesign({ id, user }: { id: string; user: SessionUser }) {
  const ride = useRideQuery(id);
  if (ride.error instanceof ApiRequestError && ride.error.status === 404)
    return <RideNotFound back={{ href: ridesHref, label: 'Rides' }} />;
  return (
    <QueryState query={ride}>
      {({ ride: r, design }) =>
        design ? (
          <DesignPage ride={r} design={design} currentVersion={design.version} user={user} />
        ) : (
          <SubScreen title="Design data" subtitle={r.name} back={{ href: rideHref(r.id), label: r.name }}>
            <Card>
              <Text variant="heading">No design data yet</Text>
              <Text muted>Import it from the maker’s design document.</Text>
            </Card>
          </SubScreen>
        )
      }
    </QueryState>
  );
}
