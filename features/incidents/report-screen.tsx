import { router } from 'expo-router';
import { StyleSheet, View } from 'react-native';

import { QueryState } from '@/components/query-state';
import { SubScreen } from '@/components/sub-screen';
import { Text } from '@/components/text';
import { RoleGate } from '@/features/auth/ui';
import { useRideIncidents } from '@/features/incidents/api';
import { incidentHref } from '@/features/incidents/hrefs';
import { IncidentReportForm } from '@/features/incidents/report-form';
import { RideNotFound, useRideIdParam } from '@/features/registry/ui';
import { rideIncidentsHref } from '@/features/rides';
import { ApiRequestError } from '@/lib/api-errors';
import { space } from '@/components/theme';

/**
 * `/rides/:id/incidents/new`: the operator reports an incident on one of their rides (phone first: one
 * column, the send button at the end under the thumb). Sent, it opens the stored report.
 */
export function IncidentReportScreen() {
  const id = useRideIdParam();
  return <RoleGate roles={['operator']}>{() => <Report rideId={id} />}</RoleGate>;
}

function Report({ rideId }: { rideId: string }) {
  const ride = useRideIncidents(rideId);
  const back = { href: rideIncidentsHref(rideId), label: 'Incident reports' };
  if (ride.error instanceof ApiRequestError && ride.error.status === 404) return <RideNotFound back={back} />;
  return (
    <SubScreen title="Report an incident" subtitle={ride.data?.rideName} back={back}>
      <QueryState query={ride}>
        {(data) => (
          <View style={styles.column}>
            <Text muted>
              Someone hurt or something damaged, a near miss, or the ride stopping when nobody meant it to.
              The inspection body sees every report on its review desk. Sending needs a connection.
            </Text>
            <IncidentReportForm ride={data} onSent={(c) => router.replace(incidentHref(c.incident.id))} />
          </View>
        )}
      </QueryState>
    </SubScreen>
  );
}

const styles = StyleSheet.create({ column: { gap: space.lg } });
