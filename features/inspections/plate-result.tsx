import { Link, router } from 'expo-router';
import { useEffect, useState } from 'react';
import { Pressable, StyleSheet, View } from 'react-native';

import { Card } from '@/components/card';
import { Spinner } from '@/components/spinner';
import { RideStatusMark } from '@/components/status-mark';
import { Text } from '@/components/text';
import { colors, layout, space } from '@/components/theme';
import { useDeviceDb } from '@/features/device-db/ui';
import { useStartInspectionMutation } from '@/features/inspections/field-api';
import { inspectPivotHref } from '@/features/inspections/hrefs';
import { InspectRideCard } from '@/features/inspections/inspect-ride-card';
import { type PlateOutcome, openPlate } from '@/features/inspections/plate-open';
import { InspectionTypeChoice } from '@/features/inspections/inspection-type-choice';
import type { InspectionType } from '@/features/records/schema';
import { type PlateTarget, rideHref } from '@/features/rides';
import { rideClassLabel } from '@/features/rides/schema';

/**
 * What a plate opens, read from the phone: a pivot's plate goes straight to that pivot's readings (the
 * inspection in progress, or a new one); a ride's plate shows the ride with its Resume or Start. A plate
 * the phone cannot place is handed back to `onRefused` with the words to show.
 */
export function PlateResult({
  target,
  onRefused,
}: {
  target: PlateTarget;
  onRefused: (message: string) => void;
}) {
  const dev = useDeviceDb();
  const start = useStartInspectionMutation();
  const [outcome, setOutcome] = useState<PlateOutcome | null>(null);

  useEffect(() => {
    let live = true;
    openPlate(dev, target)
      .then((o) => live && setOutcome(o))
      .catch(
        (err: unknown) =>
          live && setOutcome({ kind: 'refused', message: err instanceof Error ? err.message : String(err) }),
      );
    return () => {
      live = false;
    };
  }, [dev, target]);

  const begin = (rideId: string, joint: number, type: InspectionType) =>
    start.mutate({ rideId, type }, { onSuccess: (d) => router.replace(inspectPivotHref(d.id, joint)) });

  useEffect(() => {
    if (!outcome) return;
    if (outcome.kind === 'refused') onRefused(outcome.message);
    else if (outcome.kind === 'continue') router.replace(inspectPivotHref(outcome.draftId, outcome.joint));
    else if (outcome.kind === 'start' && outcome.type) begin(outcome.ride.id, outcome.joint, outcome.type);
    // begin and onRefused are the same work on every render; the outcome alone decides.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [outcome]);

  if (start.isError)
    return (
      <Text role="alert" color={colors.danger}>
        {start.error.message}
      </Text>
    );
  if (
    !outcome ||
    outcome.kind === 'refused' ||
    outcome.kind === 'continue' ||
    (outcome.kind === 'start' && outcome.type)
  )
    return (
      <View style={styles.wait} accessibilityLiveRegion="polite">
        <Spinner color={colors.base} />
        <Text muted>Opening…</Text>
      </View>
    );
  if (outcome.kind === 'start')
    return (
      <Card accessibilityLabel={`Start an inspection of ${outcome.ride.name}`}>
        <Text variant="heading">{outcome.ride.name}</Text>
        <Text>
          Pivot {outcome.joint + 1} · {outcome.pivotName}. No inspection of this ride is in progress on your
          phone: choose the type to start one at this pivot’s readings.
        </Text>
        <InspectionTypeChoice
          disabled={start.isPending}
          onChoose={(t) => begin(outcome.ride.id, outcome.joint, t)}
        />
      </Card>
    );
  const ride = outcome.ride;
  return (
    <>
      <Card accessibilityLabel={`Ride ${ride.name}`}>
        <View style={styles.head}>
          <View style={styles.grow}>
            <Text variant="heading">{ride.name}</Text>
            <Text variant="small" muted>
              {rideClassLabel[ride.rideClass]} · {ride.siteName ?? 'No site'}
            </Text>
          </View>
          <RideStatusMark status={ride.status} compact />
        </View>
        <Link href={rideHref(ride.id)} asChild>
          <Pressable role="link" style={styles.link}>
            <Text color={colors.accent}>The ride’s page (needs signal) ›</Text>
          </Pressable>
        </Link>
      </Card>
      <InspectRideCard rideId={ride.id} />
    </>
  );
}

const styles = StyleSheet.create({
  wait: { flexDirection: 'row', alignItems: 'center', gap: space.sm, minHeight: layout.touchTarget },
  head: { flexDirection: 'row', gap: space.md, alignItems: 'flex-start' },
  grow: { flex: 1, gap: 2 },
  link: { minHeight: layout.touchTarget, justifyContent: 'center', alignSelf: 'flex-start' },
});
