import { StyleSheet } from 'react-native';

import { Card } from '@/components/card';
import { QueryState } from '@/components/query-state';
import { space } from '@/components/theme';
import { useRideQuery } from '@/features/registry/api';
import { RideNotFound } from '@/features/registry/ride-route';
import { ridesHref } from '@/features/rides';
import type { RideSummary } from '@/features/rides/schema';
import { ApiRequestError } from '@/lib/api-errors';

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
});
