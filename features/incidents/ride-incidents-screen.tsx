import { router } from 'expo-router';
import { StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { Card } from '@/components/card';
import Feather from '@/components/feather-icon';
import { QueryState } from '@/components/query-state';
import { SubScreen } from '@/components/sub-screen';
import { Text } from '@/components/text';
import { colors, space } from '@/components/theme';
import { RoleGate } from '@/features/auth/ui';
import { useRideIncidents } from '@/features/incidents/api';
import { IncidentRow } from '@/features/incidents/incident-row';
import { RideNotFound, useRideIdParam } from '@/features/registry/ui';
import { rideHref, rideIncidentNewHref } from '@/features/rides';
import { ApiRequestError } from '@/lib/api-errors';

/**
 * `/rides/:id/incidents`: a ride's incident reports, newest first. The ride's operator reports a new one
 * from here; staff read them (supervisors review them from the queue or the report).
 */
export function RideIncidentsScreen() {
  const id = useRideIdParam();
  return (
    <RoleGate roles={['admin', 'supervisor', 'inspector', 'operator']}>
      {(user) => <RideIncidents rideId={id} operator={user.role === 'operator'} />}
    </RoleGate>
  );
}

function RideIncidents({ rideId, operator }: { rideId: string; operator: boolean }) {
  const list = useRideIncidents(rideId);
  const back = { href: rideHref(rideId), label: 'Ride' };
  if (list.error instanceof ApiRequestError && list.error.status === 404) return <RideNotFound back={back} />;
  return (
    <SubScreen title="Incident reports" subtitle={list.data?.rideName} back={back}>
      {operator ? (
        <Button
          label="Report an incident"
          tone="accent"
          icon={<Feather name="alert-triangle" size={18} color={colors.baseText} />}
          onPress={() => router.push(rideIncidentNewHref(rideId))}
        />
      ) : null}
      <QueryState query={list}>
        {(data) =>
          data.incidents.length === 0 ? (
            <Card>
              <Text muted>No incident reports on this ride.</Text>
            </Card>
          ) : (
            <View style={styles.list} role="list" accessibilityLabel="Incident reports">
              {data.incidents.map((i) => (
                <View key={i.id} role="listitem">
                  <IncidentRow incident={i} />
                </View>
              ))}
            </View>
          )
        }
      </QueryState>
    </SubScreen>
  );
}

const styles = StyleSheet.create({ list: { gap: space.sm } });
