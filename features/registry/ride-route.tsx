import { type Href, useLocalSearchParams } from 'expo-router';

import { Card } from '@/components/card';
import { SubScreen } from '@/components/sub-screen';
import { Text } from '@/components/text';
import type { Role } from '@/features/session/schema';

/** Who may change a ride's register entry, design data, checklists and schedules. */
export const canEditRides = (role: Role) => role === 'admin' || role === 'supervisor';

/** The ride's id from the route, one string whatever the router hands over. */
export function useRideIdParam(): string {
  const { id } = useLocalSearchParams<{ id: string }>();
  return Array.isArray(id) ? (id[0] ?? '') : (id ?? '');
}

/** The register's answer to a ride id it does not show this person (missing, or another company's). */
export function RideNotFound({ back }: { back: { href: Href; label: string } }) {
  return (
    <SubScreen title="Ride not found" back={back}>
      <Card role="alert">
        <Text variant="heading">There is no ride here for you.</Text>
        <Text muted>
          The link may be old, the ride may have been removed, or it belongs to a company whose rides you do
          not see.
        </Text>
      </Card>
    </SubScreen>
  );
}
