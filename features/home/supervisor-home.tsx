import { QueryState } from '@/components/query-state';
import { Screen, SectionTitle } from '@/components/screen';
import { StatRow, StatTile } from '@/components/stat-tile';
import { RideStatusMark } from '@/components/status-mark';
import { RoleGate } from '@/features/auth/role-gate';
import { useRidesQuery } from '@/features/rides/api';
import { RideGrid } from '@/features/rides/ride-grid';
import { type RideSummary, rideStatuses } from '@/features/rides/schema';

const urgency: Record<RideSummary['status'], number> = { out_of_service: 0, restricted: 1, in_service: 2 };

/** Supervisor's start page: rides that need a decision first, then the rest. */
export function SupervisorHome() {
  const rides = useRidesQuery();
  return (
    <RoleGate roles={['supervisor', 'admin']}>
      {() => (
        <Screen title="Review" subtitle="Rides that need a decision come first.">
          <QueryState query={rides} empty={(r) => r.length === 0}>
            {(list) => {
              const sorted = [...list].sort((a, b) => urgency[a.status] - urgency[b.status]);
              const attention = sorted.filter((r) => r.status !== 'in_service');
              const rest = sorted.filter((r) => r.status === 'in_service');
              return (
                <>
                  <StatRow>
                    {[...rideStatuses].reverse().map((s) => (
                      <StatTile
                        key={s}
                        value={list.filter((r) => r.status === s).length}
                        label={s}
                        mark={<RideStatusMark status={s} compact />}
                      />
                    ))}
                  </StatRow>
                  <SectionTitle>{`Needs attention (${attention.length})`}</SectionTitle>
                  <RideGrid rides={attention} />
                  <SectionTitle>{`In service (${rest.length})`}</SectionTitle>
                  <RideGrid rides={rest} />
                </>
              );
            }}
          </QueryState>
        </Screen>
      )}
    </RoleGate>
  );
}
