import { router } from 'expo-router';
import { useState } from 'react';
import { Pressable, StyleSheet } from 'react-native';

import { Spinner } from '@/components/spinner';
import { Button } from '@/components/button';
import { Card } from '@/components/card';
import { Text } from '@/components/text';
import { colors, layout } from '@/components/theme';
import { formatLocalStamp } from '@/lib/dates';
import { useFieldRidesQuery, useStartInspectionMutation } from '@/features/inspections/field-api';
import { inspectHref } from '@/features/inspections/hrefs';
import { InspectionTypeChoice } from '@/features/inspections/inspection-type-choice';
import { type InspectionType, inspectionTypeLabel } from '@/features/records/schema';
import { scheduleSchema } from '@/features/registry/schema';

/**
 * On a ride's page, for an inspector: resume the inspection of this ride already on the phone, or start
 * one (of the type assigned, or of a type chosen here). Read from the phone, like Today, so it answers
 * with no signal once the ride has synced.
 */
export function InspectRideCard({ rideId }: { rideId: string }) {
  const rides = useFieldRidesQuery();
  const start = useStartInspectionMutation();
  const [choosing, setChoosing] = useState(false);
  const entry = rides.data?.find((r) => r.ride.id === rideId) ?? null;
  const schedule = entry?.assignment ? scheduleSchema.safeParse(entry.assignment) : null;
  const assigned = schedule?.success ? schedule.data : null;
  const latest = [...(entry?.drafts ?? [])].sort((a, b) => b.updatedAt.localeCompare(a.updatedAt))[0];
  const begin = (type: InspectionType) =>
    start.mutate({ rideId, type }, { onSuccess: (d) => router.push(inspectHref(d.id)) });

  return (
    <Card accessibilityLabel="Inspect this ride">
      <Text variant="heading">Inspect this ride</Text>
      {rides.isPending ? (
        <Spinner color={colors.base} />
      ) : !entry ? (
        <Text muted>This ride is not on your phone yet. Sync on Today to download it, then start here.</Text>
      ) : latest ? (
        <>
          <Text variant="small" muted>
            An inspection of this ride is in progress on this phone · last change{' '}
            {formatLocalStamp(latest.updatedAt)}
          </Text>
          <Button label="Resume inspection" onPress={() => router.push(inspectHref(latest.id))} />
        </>
      ) : choosing ? (
        <InspectionTypeChoice onChoose={begin} suggested={assigned?.inspectionType} />
      ) : (
        <>
          {assigned ? (
            <Text variant="small">Assigned to you: {inspectionTypeLabel[assigned.inspectionType]}</Text>
          ) : null}
          <Button
            label="Start inspection"
            tone="accent"
            busy={start.isPending}
            onPress={() => (assigned ? begin(assigned.inspectionType) : setChoosing(true))}
          />
          {assigned ? (
            <Pressable onPress={() => setChoosing(true)} accessibilityRole="button" style={styles.other}>
              <Text color={colors.accent}>Another type of inspection…</Text>
            </Pressable>
          ) : null}
        </>
      )}
      {start.isError ? (
        <Text role="alert" color={colors.danger}>
          {start.error.message}
        </Text>
      ) : null}
    </Card>
  );
}

const styles = StyleSheet.create({
  other: { minHeight: layout.touchTarget, justifyContent: 'center', alignSelf: 'flex-start' },
});
