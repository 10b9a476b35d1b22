import { router } from 'expo-router';
import { useState } from 'react';
import { ActivityIndicator, StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { Card } from '@/components/card';
import { QueryState } from '@/components/query-state';
import { Screen } from '@/components/screen';
import { SelectField } from '@/components/select-field';
import { SortableTable } from '@/components/sortable-table';
import { RideStatusMark } from '@/components/status-mark';
import { SubScreen } from '@/components/sub-screen';
import { Text } from '@/components/text';
import { TextField } from '@/components/text-field';
import { ToggleChips } from '@/components/toggle-chips';
import { colors, space } from '@/components/theme';
import { useWide } from '@/components/use-wide';
import { RoleGate } from '@/features/auth';
import type { SessionUser } from '@/features/session/schema';
import {
  useInspectorsQuery,
  useRideSchedulesQuery,
  useScheduleCreateMutation,
  useScheduleListQuery,
  useScheduleUpdateMutation,
} from '@/features/registry/api';
import { DueMark, dueInWords, dueStatusLabel } from '@/features/registry/due-mark';
import { FilterGroup, FilterGroups, FilterPanel } from '@/components/filter-panel';
import { PagedList } from '@/components/paged-list';
import { RegisterTabs } from '@/features/registry/register-tabs';
import { WithRide } from '@/features/registry/ride-edit-screens';
import { useRideIdParam } from '@/features/registry/ride-route';
import { ScheduleForm, type ScheduleFormInput } from '@/features/registry/schedule-form';
import {
  type InspectionType,
  type Schedule,
  dueStatuses,
  inspectionTypeLabel,
  inspectionTypes,
  scheduleListQuerySchema,
  scheduleSortKeys,
} from '@/features/registry/schema';
import { formatDate } from '@/lib/dates';
import { useListParams, useSearchText } from '@/components/use-list-params';
import { rideHref, rideScheduleHref } from '@/features/rides';
import type { RideSummary } from '@/features/rides/schema';

const planners = ['admin', 'supervisor'] as const;

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
  return (
    <SubScreen
      title={`Schedule of ${ride.name}`}
      subtitle="Inspection types, their intervals, when each is due, and who does it."
      back={{ href: rideHref(ride.id), label: ride.name }}
    >
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
                      <ActivityIndicator color={colors.base} />
                    )
                  ) : (
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
    </SubScreen>
  );
}

const PAGE_SIZE = 25;
const LIST_KEYS = ['q', 'dueStatus', 'inspectionType', 'assignedTo', 'sort', 'page'] as const;
const ANYONE = '__anyone';

/** Every planned inspection across the register, soonest first: filter by due state, type and inspector. */
export function SchedulesListScreen() {
  return <RoleGate roles={planners}>{(user) => <SchedulesList user={user} />}</RoleGate>;
}

function SchedulesList({ user }: { user: SessionUser }) {
  const wide = useWide();
  const [query, setQuery] = useListParams(scheduleListQuerySchema, LIST_KEYS);
  const schedules = useScheduleListQuery({ ...query, pageSize: PAGE_SIZE, sort: query.sort ?? 'nextDue' });
  const inspectors = useInspectorsQuery();
  const [search, setSearch] = useSearchText(query.q, (q) => setQuery({ q, page: undefined }));
  const filter = (patch: Parameters<typeof setQuery>[0]) => setQuery({ ...patch, page: undefined });

  return (
    <Screen title="Rides" subtitle="Planned inspections across the register, soonest first.">
      <RegisterTabs role={user.role} />
      <FilterPanel
        active={
          (query.dueStatus?.length ?? 0) + (query.inspectionType?.length ?? 0) + (query.assignedTo ? 1 : 0)
        }
        search={
          <TextField
            label="Search"
            placeholder="Ride, site or operator"
            value={search}
            onChangeText={setSearch}
            autoCapitalize="none"
            inputMode="search"
          />
        }
        beside={
          <View style={wide ? styles.flex : undefined}>
            <SelectField
              label="Inspector"
              value={query.assignedTo ?? ANYONE}
              options={[
                { value: ANYONE, label: 'Anyone or nobody' },
                { value: 'none', label: 'Not assigned' },
                ...(inspectors.data ?? []).map((i) => ({ value: i.id, label: i.name })),
              ]}
              onChange={(v) => filter({ assignedTo: v === ANYONE ? undefined : v })}
            />
          </View>
        }
        filters={
          <FilterGroups>
            <FilterGroup label="Due">
              <ToggleChips
                label="Due"
                values={query.dueStatus ?? []}
                options={dueStatuses.map((d) => ({ value: d, label: dueStatusLabel(d) }))}
                onChange={(v) => filter({ dueStatus: v })}
              />
            </FilterGroup>
            <FilterGroup label="Inspection">
              <ToggleChips
                label="Inspection"
                values={query.inspectionType ?? []}
                options={inspectionTypes.map((t) => ({ value: t, label: inspectionTypeLabel[t] }))}
                onChange={(v) => filter({ inspectionType: v })}
              />
            </FilterGroup>
          </FilterGroups>
        }
      />
      <PagedList query={schedules} noun="inspections" setPage={(page) => setQuery({ page })}>
        {(page) =>
          page.schedules.length === 0 ? (
            <Card>
              <Text variant="heading">No planned inspections match.</Text>
            </Card>
          ) : wide ? (
            <SortableTable<Schedule, (typeof scheduleSortKeys)[number]>
              label="Planned inspections"
              rows={page.schedules}
              rowKey={(s) => s.id}
              rowHref={(s) => rideScheduleHref(s.rideId)}
              rowLabel={(s) =>
                `${s.rideName}, ${inspectionTypeLabel[s.inspectionType]}, ${dueStatusLabel(s.dueStatus)}`
              }
              sort={query.sort ?? 'nextDue'}
              onSort={(sort) => setQuery({ sort, page: undefined })}
              columns={[
                {
                  key: 'ride',
                  title: 'Ride',
                  sortKey: 'ride',
                  flex: 1.4,
                  render: (s) => (
                    <View>
                      <Text variant="heading">{s.rideName}</Text>
                      <Text variant="small" muted numberOfLines={1}>
                        {s.siteName ?? 'No site'} · {s.operatorName}
                      </Text>
                    </View>
                  ),
                },
                {
                  key: 'status',
                  title: 'Ride status',
                  render: (s) => <RideStatusMark status={s.rideStatus} compact />,
                },
                {
                  key: 'type',
                  title: 'Inspection',
                  sortKey: 'type',
                  render: (s) => inspectionTypeLabel[s.inspectionType],
                },
                {
                  key: 'next',
                  title: 'Next due',
                  sortKey: 'nextDue',
                  numeric: true,
                  render: (s) => (s.nextDueOn ? formatDate(s.nextDueOn) : '—'),
                },
                { key: 'due', title: 'Due', render: (s) => <DueMark status={s.dueStatus} /> },
                {
                  key: 'assignee',
                  title: 'Inspector',
                  sortKey: 'assignee',
                  render: (s) => s.assignedTo?.name ?? 'Not assigned',
                },
              ]}
            />
          ) : (
            page.schedules.map((s) => <ScheduleCard key={s.id} schedule={s} />)
          )
        }
      </PagedList>
    </Screen>
  );
}

function ScheduleCard({ schedule: s }: { schedule: Schedule }) {
  return (
    <Card accessibilityLabel={`${s.rideName}, ${inspectionTypeLabel[s.inspectionType]}`}>
      <View style={styles.head}>
        <View style={styles.flex}>
          <Text variant="heading">{s.rideName}</Text>
          <Text variant="small" muted>
            {inspectionTypeLabel[s.inspectionType]} · {s.siteName ?? 'No site'}
          </Text>
        </View>
        <DueMark status={s.dueStatus} />
      </View>
      <Text variant="figure">
        {s.nextDueOn ? `${formatDate(s.nextDueOn)} · ${dueInWords(s.daysUntilDue)}` : 'No date set'}
      </Text>
      <Text variant="small">{s.assignedTo ? `Inspector: ${s.assignedTo.name}` : 'Not assigned'}</Text>
      <Button
        label="Plan and assign"
        tone="quiet"
        onPress={() => router.push(rideScheduleHref(s.rideId))}
        style={styles.start}
      />
    </Card>
  );
}

const styles = StyleSheet.create({
  list: { gap: space.md },
  grid: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md, alignItems: 'flex-start' },
  cell: { flexBasis: 420, flexGrow: 1 },
  // An open form takes the whole row: its three date fields need the width.
  cellOpen: { flexBasis: '100%' },
  head: { flexDirection: 'row', justifyContent: 'space-between', alignItems: 'flex-start', gap: space.md },
  flex: { flex: 1, minWidth: 0, gap: 2 },
  start: { alignSelf: 'flex-start' },
});
