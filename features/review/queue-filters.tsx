import { StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { DateField } from '@/components/date-field';
import { SelectField } from '@/components/select-field';
import { SearchField } from '@/components/search-field';
import { space } from '@/components/theme';
import { useWide } from '@/components/use-wide';
import {
  operatorChoices,
  useCompanyListQuery,
  useInspectorsQuery,
  useSiteListQuery,
} from '@/features/registry/ui';
import { FilterGroups, FilterPanel } from '@/components/filter-panel';
import { RideClassFilter, RideStatusFilter } from '@/features/rides/ui';
import { type QueueQuery, type QueueSort } from '@/features/review/schema';

const ALL = '__all';

type QueuePatch = Record<string, string | number | readonly string[] | undefined>;

const queueSortChoices: { value: QueueSort; label: string }[] = [
  { value: 'urgency', label: 'Most urgent first' },
  { value: 'newest', label: 'Newest first' },
  { value: 'oldest', label: 'Oldest first' },
  { value: 'ride', label: 'Ride, A to Z' },
];

/** How many of the panel's filters are set (search, sort and the urgency tiles are counted elsewhere). */
export function activeFilterCount(query: Partial<QueueQuery>): number {
  return (
    (query.siteId ? 1 : 0) +
    (query.operatorId ? 1 : 0) +
    (query.inspectorId ? 1 : 0) +
    (query.rideClass?.length ?? 0) +
    (query.rideStatus?.length ?? 0) +
    (query.from ? 1 : 0) +
    (query.to ? 1 : 0)
  );
}

/**
 * The queue's search, filters and sort. Each change goes to the URL (and so to the server) at once, apart
 * from the search, which waits for typing to pause (`search` is the text as typed).
 */
export function QueueFilterPanel({
  query,
  setQuery,
  search,
  setSearch,
  onClear,
}: {
  query: Partial<QueueQuery>;
  setQuery: (patch: QueuePatch) => void;
  search: string;
  setSearch: (text: string) => void;
  onClear: () => void;
}) {
  const wide = useWide();
  // A new filter always starts again at page 1.
  const filter = (patch: QueuePatch) => setQuery({ ...patch, page: undefined });
  const active = activeFilterCount(query);
  // Both ends valid but in the wrong order: say so under "To" rather than ask the server for nothing.
  const rangeProblem =
    query.from && query.to && query.from > query.to
      ? 'Must be on or after the "From" date; not applied'
      : null;

  const selects = <QueueSelects query={query} filter={filter} wide={wide} />;

  const sort = (
    <View style={wide ? styles.sortWide : undefined}>
      <SelectField
        label="Sort"
        value={query.sort ?? 'urgency'}
        options={queueSortChoices}
        onChange={(v) => setQuery({ sort: v === 'urgency' ? undefined : v, page: undefined })}
      />
    </View>
  );

  const groups = (
    <FilterGroups alignEnd>
      <RideClassFilter values={query.rideClass} onChange={(v) => filter({ rideClass: v })} />
      <RideStatusFilter
        label="Ride status"
        values={query.rideStatus}
        onChange={(v) => filter({ rideStatus: v })}
      />
      <View style={wide ? styles.datesWide : styles.dates} role="group" accessibilityLabel="Date range">
        <View style={styles.date}>
          <DateField
            label="From"
            value={query.from}
            max={query.to}
            onChange={(from) => filter({ from: from ?? undefined })}
          />
        </View>
        <View style={styles.date}>
          <DateField
            label="To"
            value={query.to}
            min={query.from}
            onChange={(to) => filter({ to: to ?? undefined })}
            error={rangeProblem ?? undefined}
          />
        </View>
      </View>
      {wide ? sort : null}
      {active > 0 || query.q ? (
        <Button label="Clear search and filters" tone="quiet" onPress={onClear} style={styles.clear} />
      ) : null}
    </FilterGroups>
  );

  return (
    <FilterPanel
      active={active}
      search={
        <SearchField
          label="Search the queue"
          placeholder={wide ? 'Ride, serial, site, operator or inspector' : 'Ride, site, inspector…'}
          value={search}
          onChangeText={setSearch}
        />
      }
      beside={selects}
      filters={groups}
      phoneOnly={sort}
    />
  );
}

/** Where and by whom: one site, operator or inspector at a time. */
function QueueSelects({
  query,
  filter,
  wide,
}: {
  query: Partial<QueueQuery>;
  filter: (patch: QueuePatch) => void;
  wide: boolean;
}) {
  const sites = useSiteListQuery({ pageSize: 200, sort: 'name' });
  const companies = useCompanyListQuery({ pageSize: 200, sort: 'name' });
  const inspectors = useInspectorsQuery();

  const siteOptions = [
    { value: ALL, label: 'All sites' },
    ...(sites.data?.sites ?? []).map((s) => ({ value: s.id, label: s.name, hint: s.operatorName })),
  ];
  const operatorOptions = [
    { value: ALL, label: 'All operators' },
    ...operatorChoices(companies.data?.companies),
  ];
  const inspectorOptions = [
    { value: ALL, label: 'All inspectors' },
    ...(inspectors.data ?? []).map((i) => ({ value: i.id, label: i.name, hint: i.email })),
  ];
  const selectStyle = wide ? styles.selectWide : undefined;

  return (
    <>
      <View style={selectStyle}>
        <SelectField
          label="Site"
          value={query.siteId ?? ALL}
          options={siteOptions}
          onChange={(v) => filter({ siteId: v === ALL ? undefined : v })}
        />
      </View>
      <View style={selectStyle}>
        <SelectField
          label="Operator"
          value={query.operatorId ?? ALL}
          options={operatorOptions}
          onChange={(v) => filter({ operatorId: v === ALL ? undefined : v })}
        />
      </View>
      <View style={selectStyle}>
        <SelectField
          label="Inspector"
          value={query.inspectorId ?? ALL}
          options={inspectorOptions}
          onChange={(v) => filter({ inspectorId: v === ALL ? undefined : v })}
        />
      </View>
    </>
  );
}

const styles = StyleSheet.create({
  selectWide: { flex: 1, minWidth: 0 },
  sortWide: { minWidth: 200 },
  dates: { flexDirection: 'row', gap: space.sm },
  datesWide: { flexDirection: 'row', gap: space.sm, alignItems: 'flex-start' },
  date: { flex: 1, minWidth: 140 },
  clear: { alignSelf: 'flex-start' },
});
