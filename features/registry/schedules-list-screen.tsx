import { router } from 'expo-router';
import { StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { Card } from '@/components/card';
import { FilterGroup, FilterGroups, FilterPanel } from '@/components/filter-panel';
import { PagedList } from '@/components/paged-list';
import { Screen } from '@/components/screen';
import { SelectField } from '@/components/select-field';
import { SortableTable, type SortValue } from '@/components/sortable-table';
import { RideStatusMark } from '@/components/status-mark';
import { Text } from '@/components/text';
import { TextField } from '@/components/text-field';
import { space } from '@/components/theme';
import { ToggleChips } from '@/components/toggle-chips';
import { useListParams, useSearchText } from '@/components/use-list-params';
import { useWide } from '@/components/use-wide';
import { RoleGate } from '@/features/auth/ui';
import { useInspectorsQuery, useScheduleListQuery } from '@/features/registry/api';
import { DueMark, dueInWords, dueStatusLabel } from '@/features/registry/due-mark';
import { RegisterTabs } from '@/features/registry/register-tabs';
import {
  type Schedule,
  dueStatuses,
  inspectionTypeLabel,
  inspectionTypes,
  scheduleListQuerySchema,
  scheduleSortKeys,
} from '@/features/registry/schema';
import { planners } from '@/features/registry/screen-access';
import { rideScheduleHref } from '@/features/rides';
import type { SessionUser } from '@/features/session/schema';
import { formatDate } from '@/lib/dates';

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
    <Screen title="Schedules" subtitle="Planned inspections across the register, soonest first.">
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
            <SchedulesTable
              schedules={page.schedules}
              sort={query.sort ?? 'nextDue'}
              onSort={(sort) => setQuery({ sort, page: undefined })}
            />
          ) : (
            page.schedules.map((s) => <ScheduleCard key={s.id} schedule={s} />)
          )
        }
      </PagedList>
    </Screen>
  );
}

type ScheduleSortKey = (typeof scheduleSortKeys)[number];

/** The wide layout: one sortable row per planned inspection. */
function SchedulesTable({
  schedules,
  sort,
  onSort,
}: {
  schedules: Schedule[];
  sort: SortValue<ScheduleSortKey>;
  onSort: (sort: SortValue<ScheduleSortKey> | undefined) => void;
}) {
  return (
    <SortableTable<Schedule, ScheduleSortKey>
      label="Planned inspections"
      rows={schedules}
      rowKey={(s) => s.id}
      rowHref={(s) => rideScheduleHref(s.rideId)}
      rowLabel={(s) =>
        `${s.rideName}, ${inspectionTypeLabel[s.inspectionType]}, ${dueStatusLabel(s.dueStatus)}`
      }
      sort={sort}
      onSort={onSort}
      columns={[
        {
          key: 'ride',
          title: 'Ride',
          sortKey: 'ride',
          flex: 1.4,
          render: (s) => <Text variant="heading">{s.rideName}</Text>,
          detail: (s) => (
            <Text variant="small" muted numberOfLines={1}>
              {s.siteName ?? 'No site'} · {s.operatorName}
            </Text>
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
  head: { flexDirection: 'row', justifyContent: 'space-between', alignItems: 'flex-start', gap: space.md },
  flex: { flex: 1, minWidth: 0, gap: 2 },
  start: { alignSelf: 'flex-start' },
});
