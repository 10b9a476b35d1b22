import { Link, router } from 'expo-router';
import { memo, useEffect, useMemo, useRef, useState } from 'react';
import { Pressable, StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { Card } from '@/components/card';
import Feather from '@/components/feather-icon';
import { QueryState } from '@/components/query-state';
import { Screen, SectionTitle } from '@/components/screen';
import { RideStatusMark } from '@/components/status-mark';
import { Text } from '@/components/text';
import { colors, layout, space } from '@/components/theme';
import { useWide } from '@/components/use-wide';
import { RoleGate } from '@/features/auth/ui';
import { formatDate, formatLocalStamp, localDay, longDate } from '@/lib/dates';
import { firstName, greeting } from '@/lib/greeting';
import {
  useFieldRidesQuery,
  useSentInspectionsQuery,
  useStartInspectionMutation,
} from '@/features/inspections/field-api';
import { type InspectionType, inspectionTypeLabel } from '@/features/records/schema';
import { dueStatusOn, scheduleSchema, setupPendingWords } from '@/features/registry/schema';
import { rideHref } from '@/features/rides';
import { rideClassLabel } from '@/features/rides/schema';
import { inspectHref, scanHref } from '@/features/inspections/hrefs';
import { SentInspections } from '@/features/inspections/sent-inspections';
import { InspectionTypeChoice } from '@/features/inspections/inspection-type-choice';
import { SyncPanel } from '@/features/inspections/sync-panel';
import { useSyncStatus } from '@/features/sync/ui';
import { useFirstScreenSettled } from '@/components/first-screen';

/**
 * The inspector's day, read from the phone: inspections a supervisor returned for correction, drafts to
 * resume, assigned rides, and what was sent with the supervisors' decisions. Works with no signal once
 * the phone has synced.
 */
export function TodayScreen() {
  const rides = useFieldRidesQuery();
  const sent = useSentInspectionsQuery();
  // Kept while the list is the same, so a sync's progress redraws the panel and not every card below it.
  const returned = useMemo(() => sent.data?.filter((s) => s.needsAction) ?? [], [sent.data]);
  const others = useMemo(() => sent.data?.filter((s) => !s.needsAction) ?? [], [sent.data]);
  const sync = useSyncStatus();
  const wide = useWide();
  // First visit on a fresh phone: fetch the round while there is a connection. Only once the phone's own
  // record of the last sync has been read: before that every opening of Today looks like a first visit.
  const firstSync = useRef(false);
  useEffect(() => {
    if (firstSync.current || !sync.loaded || sync.lastSuccessAt) return;
    firstSync.current = true;
    void sync.syncNow();
  }, [sync]);
  // Today has its content once the rides are read and a first sync (on a fresh phone) has ended.
  useFirstScreenSettled(
    rides.isSuccess && sync.loaded && !sync.running && (sync.lastSuccessAt ?? sync.lastAttemptAt) != null,
  );

  return (
    <RoleGate roles={['inspector']}>
      {(user) => (
        <Screen
          title={`${greeting()}, ${firstName(user.name)}`}
          subtitle={longDate()}
          actions={
            <Button
              label="Scan a plate"
              tone="accent"
              icon={<Feather name="camera" size={20} color={colors.baseText} />}
              accessibilityLabel="Scan a plate: open a ride or a pivot’s readings from its QR code"
              onPress={() => router.push(scanHref)}
            />
          }
        >
          <SyncPanel status={sync} />
          {/* Returned inspections come before anything else: they wait on this inspector. */}
          <SentInspections list={returned} />
          <QueryState query={rides}>{(list) => <TodayRides list={list} wide={wide} />}</QueryState>
          <SentInspections list={others} />
        </Screen>
      )}
    </RoleGate>
  );
}

type Entry = NonNullable<ReturnType<typeof useFieldRidesQuery>['data']>[number];

/** The round: drafts in progress, then every ride on the phone (redrawn only when the list changes). */
const TodayRides = memo(function TodayRides({ list, wide }: { list: Entry[]; wide: boolean }) {
  if (list.length === 0)
    return (
      <Card>
        <Text muted>
          No rides on this phone yet. Connect and sync to download your round; after that it works offline.
        </Text>
      </Card>
    );
  return (
    <>
      {list.some((r) => r.drafts.length > 0) ? (
        <>
          <SectionTitle>In progress</SectionTitle>
          {list.flatMap((r) =>
            r.drafts.map((d) => (
              <Card key={d.id} style={styles.draft}>
                <View style={styles.grow}>
                  <Text variant="heading">{r.ride.name}</Text>
                  <Text variant="small" muted>
                    Last change {formatLocalStamp(d.updatedAt)}
                  </Text>
                </View>
                <Button label="Resume" onPress={() => router.push(inspectHref(d.id))} />
              </Card>
            )),
          )}
        </>
      ) : null}
      <SectionTitle>{`Your rides (${list.length})`}</SectionTitle>
      <View style={wide ? styles.gridWide : styles.grid}>
        {list.map((r) => (
          <View key={r.ride.id} style={wide ? styles.cellWide : undefined}>
            <RideToInspect entry={r} />
          </View>
        ))}
      </View>
    </>
  );
});

function RideToInspect({ entry }: { entry: Entry }) {
  const start = useStartInspectionMutation();
  const [choosing, setChoosing] = useState(false);
  const schedule = entry.assignment ? scheduleSchema.safeParse(entry.assignment) : null;
  const assigned = schedule?.success ? schedule.data : null;
  // Due and overdue on the site's clock, worked out now (offline too), not as of the last pull.
  const siteToday = localDay(new Date(), entry.ride.siteTimeZone);
  const dueStatus = assigned ? dueStatusOn(assigned.inspectionType, assigned.nextDueOn, siteToday) : null;
  const begin = (type: InspectionType) =>
    start.mutate({ rideId: entry.ride.id, type }, { onSuccess: (d) => router.push(inspectHref(d.id)) });
  return (
    <Card accessibilityLabel={`Ride ${entry.ride.name}`}>
      <View style={styles.head}>
        <View style={styles.grow}>
          {/* The ride's name opens its page (status, schedule, its own Start inspection). */}
          <Link href={rideHref(entry.ride.id)} asChild>
            <Pressable role="link" style={styles.name}>
              <Text variant="heading" color={colors.accent}>
                {entry.ride.name} ›
              </Text>
            </Pressable>
          </Link>
          <Text variant="small" muted>
            {rideClassLabel[entry.ride.rideClass]} · {entry.ride.siteName ?? 'No site'}
          </Text>
        </View>
        <RideStatusMark status={entry.ride.status} compact />
      </View>
      {assigned ? (
        <Text variant="small" color={dueStatus === 'overdue' ? colors.over : colors.text}>
          Assigned: {inspectionTypeLabel[assigned.inspectionType]}
          {assigned.nextDueOn ? ` · due ${formatDate(assigned.nextDueOn)}` : ''}
          {dueStatus === 'overdue' ? ' · overdue' : ''}
        </Text>
      ) : null}
      {assigned?.plannedOn ? (
        <Text variant="small">
          Round: {formatDate(assigned.plannedOn)}
          {assigned.roundPosition != null ? ` · stop ${assigned.roundPosition + 1}` : ''}
        </Text>
      ) : null}
      {assigned?.inspectionType === 'setup_after_assembly' && entry.ride.status !== 'in_service' ? (
        <View style={styles.pending}>
          <Feather name="alert-triangle" size={16} color={colors.over} />
          <Text variant="small" color={colors.over} style={styles.grow}>
            {setupPendingWords(entry.ride.siteName ?? 'its new site')}
          </Text>
        </View>
      ) : null}
      {choosing ? (
        <InspectionTypeChoice onChoose={begin} suggested={assigned?.inspectionType} />
      ) : (
        <Button
          label="Start inspection"
          busy={start.isPending}
          onPress={() => (assigned ? begin(assigned.inspectionType) : setChoosing(true))}
        />
      )}
      {assigned && !choosing ? (
        <Pressable onPress={() => setChoosing(true)} accessibilityRole="button" style={styles.other}>
          <Text color={colors.accent}>Another type of inspection…</Text>
        </Pressable>
      ) : null}
      {start.isError ? (
        <Text role="alert" color={colors.danger}>
          {(start.error as Error).message}
        </Text>
      ) : null}
    </Card>
  );
}

const styles = StyleSheet.create({
  grow: { flex: 1, gap: 2 },
  pending: { flexDirection: 'row', gap: space.xs, alignItems: 'flex-start' },
  head: { flexDirection: 'row', gap: space.md, alignItems: 'flex-start' },
  draft: { flexDirection: 'row', alignItems: 'center', gap: space.md },
  grid: { gap: space.md },
  gridWide: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md },
  cellWide: { flexBasis: 360, flexGrow: 1, maxWidth: 560 },
  other: { minHeight: layout.touchTarget, justifyContent: 'center', alignSelf: 'flex-start' },
  name: { minHeight: layout.touchTarget, justifyContent: 'center', alignSelf: 'flex-start' },
});
