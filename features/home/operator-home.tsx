import { QueryState } from '@/components/query-state';
import { Screen, SectionTitle } from '@/components/screen';
import { StatRow, StatTile } from '@/components/stat-tile';
import { RoleGate } from '@/features/auth/role-gate';
import { useRidesQuery } from '@/features/rides/api';
import { RideGrid } from '@/features/rides/ride-grid';

/** Operator's start page: their company's rides and the status the inspection body has set. */
export function OperatorHome() {
  const rides = useRidesQuery();
  return (
    <RoleGate roles={['operator']}>
      {(user) => (
        <Screen title="My rides" subtitle={user.companyName ?? undefined}>
          <QueryState query={rides} empty={(r) => r.length === 0}>
            {(list) => (
              <>
                <StatRow>
                  <StatTile value={list.length} label="Rides" />
                  <StatTile value={list.filter((r) => r.status === 'in_service').length} label="In service" />
                  <StatTile
                    value={list.filter((r) => r.status !== 'in_service').length}
                    label="Restricted or stopped"
                  />
                </StatRow>
                <SectionTitle>Rides and their status</SectionTitle>
                <RideGrid rides={list} showOperator={false} />
              </>
            )}
          </QueryState>
        </Screen>
      )}
    </RoleGate>
  );
}
