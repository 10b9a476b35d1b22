import { QueryState } from '@/components/query-state';
import { Screen, SectionTitle } from '@/components/screen';
import { StatRow, StatTile } from '@/components/stat-tile';
import { RoleGate } from '@/features/auth/role-gate';
import { firstName, greeting, longDate } from '@/features/home/greeting';
import { useRidesQuery } from '@/features/rides/api';
import { RideGrid } from '@/features/rides/ride-grid';

/** Inspector's start page: the rides they work on, with each ride's current status. */
export function InspectorHome() {
  const rides = useRidesQuery();
  return (
    <RoleGate roles={['inspector']}>
      {(user) => (
        <Screen title={`${greeting()}, ${firstName(user.name)}`} subtitle={longDate()}>
          <QueryState query={rides} empty={(r) => r.length === 0}>
            {(list) => (
              <>
                <StatRow>
                  <StatTile value={list.length} label="Rides on your round" />
                  <StatTile value={new Set(list.map((r) => r.siteId)).size} label="Sites" />
                  <StatTile
                    value={list.filter((r) => r.status !== 'in_service').length}
                    label="Not fully in service"
                  />
                </StatRow>
                <SectionTitle>Rides</SectionTitle>
                <RideGrid rides={list} />
              </>
            )}
          </QueryState>
        </Screen>
      )}
    </RoleGate>
  );
}
