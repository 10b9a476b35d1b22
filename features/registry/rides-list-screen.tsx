import { router } from 'expo-router';
import { StyleSheet, View } from 'react-native';

import { Spinner } from '@/components/spinner';
import { Button } from '@/components/button';
import { Card } from '@/components/card';
import Feather from '@/components/feather-icon';
import { Screen } from '@/components/screen';
import { SelectField } from '@/components/select-field';
import { SortableTable, type SortValue } from '@/components/sortable-table';
import { RideStatusMark, rideStatusLabel } from '@/components/status-mark';
import { Text } from '@/components/text';
import { SearchField } from '@/components/search-field';
import { colors, space } from '@/components/theme';
import { useWide } from '@/components/use-wide';
import { RoleGate } from '@/features/auth/ui';
import type { SessionUser } from '@/features/session/schema';
import {
  operatorChoices,
  useCompanyListQuery,
  useRidePageQuery,
  useSiteListQuery,
} from '@/features/registry/api';
import { FilterGroups, FilterPanel } from '@/components/filter-panel';
import { newRideHref, rideHref } from '@/features/rides';
import { RideClassFilter, RideStatusFilter, RideCard } from '@/features/rides/ui';
import { PagedList } from '@/components/paged-list';
import { RegisterTabs } from '@/features/registry/register-tabs';
import { RemovalNotice } from '@/features/registry/removal-notice';
import { type RideSortKey, rideListQuerySchema } from '@/features/registry/schema';
import { formatDate } from '@/lib/dates';
import { useListParams, useSearchText } from '@/components/use-list-params';
import { type RideSummary, rideClassLabel } from '@/features/rides/schema';

const PAGE_SIZE = 20;
const ALL = '__all';
const LIST_KEYS = ['q', 'status', 'rideClass', 'siteId', 'operatorId', 'sort', 'page'] as const;

const sortChoices: { value: SortValue<RideSortKey>; label: string }[] = [
  { value: 'name', label: 'Name, A to Z' },
  { value: '-name', label: 'Name, Z to A' },
  { value: 'status', label: 'Status' },
  { value: '-statusSince', label: 'Status changed, newest first' },
  { value: 'rideClass', label: 'Ride class' },
  { value: 'site', label: 'Site' },
  { value: 'operator', label: 'Operator' },
  { value: '-year', label: 'Year built, newest first' },
];

/**
 * The ride register. Search, filters, sort and pages are all done by the server (GET /api/rides) and
 * kept in the URL. Desktop: a dense table whose column titles sort it. Phone: cards, with the filters
 * behind one button so the list stays in view.
 */
export function RidesListScreen() {
  return (
    <RoleGate roles={['admin', 'supervisor', 'inspector', 'operator']}>
      {(user) => <RidesList user={user} />}
    </RoleGate>
  );
}

function RidesList({ user }: { user: SessionUser }) {
  const wide = useWide();
  const staff = user.role !== 'operator';
  const [query, setQuery] = useListParams(rideListQuerySchema, LIST_KEYS);
  const rides = useRidePageQuery({ ...query, pageSize: PAGE_SIZE });
  const sites = useSiteListQuery({ pageSize: 200, sort: 'name' }, staff);
  const companies = useCompanyListQuery({ pageSize: 200, sort: 'name' }, staff);
  // Type freely; the list follows once typing pauses, and always starts again at page 1.
  const [search, setSearch] = useSearchText(query.q, (q) => setQuery({ q, page: undefined }));

  const filter = (patch: Parameters<typeof setQuery>[0]) => setQuery({ ...patch, page: undefined });
  const activeFilters =
    (query.status?.length ?? 0) +
    (query.rideClass?.length ?? 0) +
    (query.siteId ? 1 : 0) +
    (query.operatorId ? 1 : 0);
  const clear = () => {
    setSearch('');
    setQuery({
      q: undefined,
      status: undefined,
      rideClass: undefined,
      siteId: undefined,
      operatorId: undefined,
      page: undefined,
    });
  };

  const selects = staff ? (
    <PlaceFilters
      wide={wide}
      siteId={query.siteId}
      operatorId={query.operatorId}
      sites={sites.data?.sites}
      companies={companies.data?.companies}
      onChange={filter}
    />
  ) : null;

  const chips = (
    <FilterGroups alignEnd>
      <RideClassFilter values={query.rideClass} onChange={(v) => filter({ rideClass: v })} />
      <RideStatusFilter label="Status" values={query.status} onChange={(v) => filter({ status: v })} />
      {activeFilters > 0 || query.q ? (
        <Button label="Clear search and filters" tone="quiet" onPress={clear} style={styles.clear} />
      ) : null}
    </FilterGroups>
  );

  return (
    <Screen
      title="Rides"
      subtitle={
        staff ? 'The ride register: identity, status and design data.' : (user.companyName ?? undefined)
      }
      actions={
        user.role === 'admin' ? (
          <Button
            label="New ride"
            tone="accent"
            onPress={() => router.push(newRideHref)}
            icon={<Feather name="plus" size={18} color={colors.baseText} />}
          />
        ) : null
      }
    >
      {staff ? <RegisterTabs role={user.role} /> : null}
      <RemovalNotice />
      <FilterPanel
        active={activeFilters}
        search={
          <SearchField
            label="Search rides"
            placeholder={wide ? 'Name, maker, model, serial, site or operator' : 'Name, maker, serial, site…'}
            value={search}
            onChangeText={setSearch}
          />
        }
        beside={selects}
        filters={chips}
        phoneOnly={
          <SelectField
            label="Sort"
            value={query.sort ?? 'name'}
            options={sortChoices}
            onChange={(v) => setQuery({ sort: v, page: undefined })}
          />
        }
      />

      <PagedList
        query={rides}
        noun={(total) => (total === 1 ? 'ride' : 'rides')}
        setPage={(page) => setQuery({ page })}
      >
        {(page) => (
          <RidesPage
            rides={page.rides}
            fetching={rides.isFetching}
            wide={wide}
            sort={query.sort}
            onSort={(sort) => setQuery({ sort, page: undefined })}
            showOperator={staff}
          />
        )}
      </PagedList>
    </Screen>
  );
}

/** One page of rides: a sortable table where there is room, cards on a phone. */
function RidesPage({
  rides,
  fetching,
  wide,
  sort,
  onSort,
  showOperator,
}: {
  rides: RideSummary[];
  fetching: boolean;
  wide: boolean;
  sort: SortValue<RideSortKey> | undefined;
  onSort: (sort: SortValue<RideSortKey> | undefined) => void;
  showOperator: boolean;
}) {
  return (
    <>
      {fetching ? (
        <View style={styles.fetching} accessibilityLabel="Updating">
          <Spinner color={colors.base} size="small" />
        </View>
      ) : null}
      {rides.length === 0 ? (
        <Card style={styles.empty}>
          <Text variant="heading">No rides match.</Text>
          <Text muted>Try fewer filters or another search.</Text>
        </Card>
      ) : wide ? (
        <RideTable rides={rides} sort={sort} onSort={onSort} showOperator={showOperator} />
      ) : (
        <View style={styles.cards}>
          {rides.map((r) => (
            <RideCard key={r.id} ride={r} showOperator={showOperator} link />
          ))}
        </View>
      )}
    </>
  );
}

/** Staff narrow the register to one site or one operator. */
function PlaceFilters({
  wide,
  siteId,
  operatorId,
  sites,
  companies,
  onChange,
}: {
  wide: boolean;
  siteId: string | undefined;
  operatorId: string | undefined;
  sites: NonNullable<ReturnType<typeof useSiteListQuery>['data']>['sites'] | undefined;
  companies: Parameters<typeof operatorChoices>[0];
  onChange: (patch: { siteId?: string; operatorId?: string }) => void;
}) {
  const siteOptions = [
    { value: ALL, label: 'All sites' },
    ...(sites ?? []).map((s) => ({ value: s.id, label: s.name, hint: s.operatorName })),
  ];
  const operatorOptions = [{ value: ALL, label: 'All operators' }, ...operatorChoices(companies)];

  return (
    <>
      <View style={wide ? styles.selectWide : undefined}>
        <SelectField
          label="Site"
          value={siteId ?? ALL}
          options={siteOptions}
          onChange={(v) => onChange({ siteId: v === ALL ? undefined : v })}
        />
      </View>
      <View style={wide ? styles.selectWide : undefined}>
        <SelectField
          label="Operator"
          value={operatorId ?? ALL}
          options={operatorOptions}
          onChange={(v) => onChange({ operatorId: v === ALL ? undefined : v })}
        />
      </View>
    </>
  );
}

function RideTable({
  rides,
  sort,
  onSort,
  showOperator,
}: {
  rides: RideSummary[];
  sort: SortValue<RideSortKey> | undefined;
  onSort: (sort: SortValue<RideSortKey> | undefined) => void;
  showOperator: boolean;
}) {
  return (
    <SortableTable<RideSummary, RideSortKey>
      label="Rides"
      rows={rides}
      rowKey={(r) => r.id}
      rowHref={(r) => rideHref(r.id)}
      rowLabel={(r) => `${r.name}, ${rideStatusLabel(r.status)}`}
      sort={sort}
      onSort={onSort}
      columns={[
        {
          key: 'name',
          title: 'Ride',
          sortKey: 'name',
          flex: 1.6,
          render: (r) => <Text variant="heading">{r.name}</Text>,
          detail: (r) => (
            <Text variant="small" muted numberOfLines={1}>
              {[r.maker, r.model].filter(Boolean).join(' · ') || '—'}
            </Text>
          ),
        },
        { key: 'class', title: 'Class', sortKey: 'rideClass', render: (r) => rideClassLabel[r.rideClass] },
        { key: 'site', title: 'Site', sortKey: 'site', flex: 1.3, render: (r) => r.siteName ?? '—' },
        ...(showOperator
          ? [
              {
                key: 'operator',
                title: 'Operator',
                sortKey: 'operator' as const,
                flex: 1.3,
                render: (r: RideSummary) => r.operatorName,
              },
            ]
          : []),
        {
          key: 'status',
          title: 'Status',
          sortKey: 'status',
          flex: 1.1,
          render: (r) => <RideStatusMark status={r.status} compact />,
        },
        {
          key: 'since',
          title: 'Since',
          sortKey: 'statusSince',
          flex: 0.9,
          numeric: true,
          render: (r) => (r.statusSince ? formatDate(r.statusSince) : '—'),
        },
        {
          key: 'year',
          title: 'Built',
          sortKey: 'year',
          flex: 0.6,
          numeric: true,
          render: (r) => (r.year ? String(r.year) : '—'),
        },
      ]}
    />
  );
}

const styles = StyleSheet.create({
  selectWide: { flex: 1, minWidth: 0 },
  clear: { alignSelf: 'flex-start' },
  fetching: { position: 'absolute', right: 0, top: -28 },
  cards: { gap: space.md },
  empty: { alignItems: 'flex-start' },
});
