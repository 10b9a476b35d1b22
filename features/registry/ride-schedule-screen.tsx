import { Link } from 'expo-router';
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { Spinner } from '@/components/spinner';
import { Button } from '@/components/button';
import { Card } from '@/components/card';
import { QueryState } from '@/components/query-state';
import { SubScreen } from '@/components/sub-screen';
import { Text } from '@/components/text';
import { colors, layout, space } from '@/components/theme';
import { useWide } from '@/components/use-wide';
import { RoleGate } from '@/features/auth/ui';
import {
  useInspectorsQuery,
  useRideSchedulesQuery,
  useScheduleCreateMutation,
  useScheduleUpdateMutation,
} from '@/features/registry/api';
import { DeleteAction } from '@/features/registry/delete-action';
import { DueMark, dueInWords } from '@/features/registry/due-mark';
import { WithRide } from '@/features/registry/with-ride';
import { useRideIdParam } from '@/features/registry/ride-route';
import { ScheduleForm, type ScheduleFormInput } from '@/features/registry/schedule-form';
import { type InspectionType, inspectionTypeLabel, inspectionTypes } from '@/features/registry/schema';
import { planners } from '@/features/registry/screen-access';
import { rideHref, rideNdtHref } from '@/features/rides';
import type { RideSummary } from '@/features/rides/schema';
import { formatDate } from '@/lib/dates';

/** One ride's inspections: each type with its interval, dates, due state and inspector; add or change. */
export function RideScheduleScreen() {
  const id = useRideIdParam();
  return (
    <RoleGate roles={planners}>
      {() => <WithRide id={id}>{(ride) => <RideSchedule ride={ride} />}</WithRide>}
    </RoleGate>
  );
}

function RideSchedule({ ride }: { ride: RideSummary }) {
  const wide = useWide();
  const schedules = useRideSchedulesQuery(ride.id);
  const inspectors = useInspectorsQuery();
  const [editing, setEditing] = useState<InspectionType | null>(null);
  const create = useScheduleCreateMutation();
  const update = useScheduleUpdateMutation();
  const [removed, setRemoved] = useState<string | null>(null);
  return (
    <SubScreen
      title={`Schedule of ${ride.name}`}
      subtitle="Inspection types, their intervals, when each is due, and who does it."
      back={{ href: rideHref(ride.id), label: ride.name }}
    >
      {removed ? (
        <Text role="status" color={colors.within}>
          ✓ {removed}
        </Text>
      ) : null}
      <QueryState query={schedules}>
        {(list) => (
          <View style={wide ? styles.grid : styles.list}>
            {inspectionTypes.map((type) => {
              const s = list.find((x) => x.inspectionType === type) ?? null;
              const open = editing === type;
              const defaults: ScheduleFormInput = {
                intervalDays: s?.intervalDays ?? null,
                lastDoneOn: s?.lastDoneOn ?? '',
                dueOn: s?.dueOn ?? '',
                assignedTo: s?.assignedTo?.id ?? null,
                notes: s?.notes ?? '',
              };
              return (
                <Card
                  key={type}
                  accessibilityLabel={inspectionTypeLabel[type]}
                  style={wide ? (open ? styles.cellOpen : styles.cell) : undefined}
                >
                  <View style={styles.head}>
                    <View style={styles.flex}>
                      <Text variant="heading">{inspectionTypeLabel[type]}</Text>
                      <Text variant="small" muted>
                        {s
                          ? [
                              s.intervalDays ? `every ${s.intervalDays} days` : 'no interval',
                              s.lastDoneOn ? `last done ${formatDate(s.lastDoneOn)}` : 'not done yet',
                              s.nextDueOn
                                ? `next ${formatDate(s.nextDueOn)} (${dueInWords(s.daysUntilDue)})`
                                : 'no date',
                            ].join(' · ')
                          : 'Not planned for this ride'}
                      </Text>
                      {s ? (
                        <Text variant="small">
                          {s.assignedTo ? `Assigned to ${s.assignedTo.name}` : 'Not assigned'}
                        </Text>
                      ) : null}
                    </View>
                    {s ? <DueMark status={s.dueStatus} /> : null}
                  </View>
                  {open ? (
                    inspectors.data ? (
                      <ScheduleForm
                        defaultValues={defaults}
                        inspectors={inspectors.data}
                        submitLabel={s ? 'Save' : 'Plan it'}
                        onCancel={() => setEditing(null)}
                        onSubmit={async (values) => {
                          if (s) await update.mutateAsync({ id: s.id, patch: values });
                          else await create.mutateAsync({ rideId: ride.id, inspectionType: type, ...values });
                          setEditing(null);
                        }}
                      />
                    ) : (
                      <Spinner color={colors.base} />
                    )
                  ) : null}
                  {open && s ? (
                    <DeleteAction
                      kind="schedule"
                      id={s.id}
                      noun="schedule"
                      name={`${inspectionTypeLabel[type]} schedule of ${ride.name}`}
                      consequence={
                        'This inspection is no longer planned for the ride: no due date, no reminders, no ' +
                        'assignment. Inspections already made stay. The audit log keeps a record.'
                      }
                      onDeleted={(message) => {
                        setEditing(null);
                        setRemoved(message);
                      }}
                    />
                  ) : null}
                  {open ? null : (
                    <Button
                      label={s ? 'Change or assign' : 'Plan this inspection'}
                      tone="quiet"
                      onPress={() => setEditing(type)}
                      style={styles.start}
                    />
                  )}
                </Card>
              );
            })}
          </View>
        )}
      </QueryState>
      <Card accessibilityLabel="NDT due dates">
        <Text variant="heading">NDT</Text>
        <Text muted>
          The tests the design data plans at each pivot fall due on dates of their own, from each test’s last
          record.
        </Text>
        <Link href={rideNdtHref(ride.id)} style={styles.ndtLink}>
          <Text variant="heading" color={colors.accent}>
            NDT due dates and records ›
          </Text>
        </Link>
      </Card>
    </SubScreen>
  );
}

const styles = StyleSheet.create({
  ndtLink: { minHeight: layout.touchTarget, paddingVertical: space.sm },
  list: { gap: space.md },
  grid: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md, alignItems: 'flex-start' },
  cell: { flexBasis: 420, flexGrow: 1 },
  // An open form takes the whole row: its three date fields need the width.
  cellOpen: { flexBasis: '100%' },
  head: { flexDirection: 'row', justifyContent: 'space-between', alignItems: 'flex-start', gap: space.md },
  flex: { flex: 1, minWidth: 0, gap: 2 },
  start: { alignSelf: 'flex-start' },
});
