import { router } from 'expo-router';
import { StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { Card } from '@/components/card';
import Feather from '@/components/feather-icon';
import { PagedList } from '@/components/paged-list';
import { Screen } from '@/components/screen';
import { SelectField } from '@/components/select-field';
import { SortableTable } from '@/components/sortable-table';
import { Text } from '@/components/text';
import { TextField } from '@/components/text-field';
import { colors, space } from '@/components/theme';
import { ToggleChips } from '@/components/toggle-chips';
import { useListParams, useSearchText } from '@/components/use-list-params';
import { useWide } from '@/components/use-wide';
import { RoleGate } from '@/features/auth/ui';
import { operatorChoices, useCompanyListQuery, useSiteListQuery } from '@/features/registry/api';
import { newSiteHref, siteHref } from '@/features/registry/hrefs';
import { PAGE_SIZE } from '@/features/registry/register-parts';
import { RegisterTabs } from '@/features/registry/register-tabs';
import { RemovalNotice } from '@/features/registry/removal-notice';
import { TimeZoneCard } from '@/features/registry/time-zone-card';
import {
  type Site,
  siteKindLabel,
  siteKinds,
  siteListQuerySchema,
  siteSortKeys,
} from '@/features/registry/schema';
import { staff } from '@/features/registry/screen-access';
import type { SessionUser } from '@/features/session/schema';

const ALL = '__all';

/** Parks, fairgrounds and the set-up places of travelling rides. */
export function SitesListScreen() {
  return <RoleGate roles={staff}>{(user) => <SitesList user={user} />}</RoleGate>;
}

function SitesList({ user }: { user: SessionUser }) {
  const wide = useWide();
  const [query, setQuery] = useListParams(siteListQuerySchema, ['q', 'operatorId', 'kind', 'sort', 'page']);
  const sites = useSiteListQuery({ ...query, pageSize: PAGE_SIZE });
  const companies = useCompanyListQuery({ pageSize: 200, sort: 'name' });
  const [search, setSearch] = useSearchText(query.q, (q) => setQuery({ q, page: undefined }));
  return (
    <Screen
      title="Sites"
      subtitle="Parks, fairgrounds and travelling set-ups."
      actions={
        user.role === 'admin' ? (
          <Button
            label="New site"
            tone="accent"
            icon={<Feather name="plus" size={18} color={colors.baseText} />}
            onPress={() => router.push(newSiteHref)}
          />
        ) : null
      }
    >
      <RegisterTabs role={user.role} />
      <RemovalNotice />
      <Card style={styles.filters}>
        <View style={wide ? styles.row : styles.list}>
          <View style={wide ? styles.flex2 : undefined}>
            <TextField label="Search sites" value={search} onChangeText={setSearch} autoCapitalize="none" />
          </View>
          <View style={wide ? styles.flex : undefined}>
            <SelectField
              label="Operator"
              value={query.operatorId ?? ALL}
              options={[
                { value: ALL, label: 'All operators' },
                ...operatorChoices(companies.data?.companies),
              ]}
              onChange={(v) => setQuery({ operatorId: v === ALL ? undefined : v, page: undefined })}
            />
          </View>
        </View>
        <ToggleChips
          label="Kind"
          values={query.kind ? [query.kind] : []}
          options={siteKinds.map((k) => ({ value: k, label: siteKindLabel[k] }))}
          // The API filters by one kind: the newest choice replaces the last.
          onChange={(v) => setQuery({ kind: v.filter((k) => k !== query.kind)[0], page: undefined })}
        />
      </Card>
      <PagedList query={sites} noun="sites" setPage={(page) => setQuery({ page })}>
        {(page) =>
          wide ? (
            <SortableTable<Site, (typeof siteSortKeys)[number]>
              label="Sites"
              rows={page.sites}
              rowKey={(s) => s.id}
              rowHref={(s) => siteHref(s.id)}
              rowLabel={(s) => s.name}
              sort={query.sort}
              onSort={(sort) => setQuery({ sort, page: undefined })}
              columns={[
                { key: 'name', title: 'Site', sortKey: 'name', flex: 1.5, render: (s) => s.name },
                { key: 'kind', title: 'Kind', sortKey: 'kind', render: (s) => siteKindLabel[s.kind] },
                {
                  key: 'locality',
                  title: 'Locality',
                  sortKey: 'locality',
                  render: (s) => s.locality ?? '—',
                },
                { key: 'zone', title: 'Time zone', flex: 1.3, render: (s) => s.effectiveTimeZone },
                {
                  key: 'operator',
                  title: 'Operator',
                  sortKey: 'operator',
                  flex: 1.4,
                  render: (s) => s.operatorName,
                },
                {
                  key: 'rides',
                  title: 'Rides',
                  numeric: true,
                  flex: 0.5,
                  render: (s) => String(s.rideCount),
                },
              ]}
            />
          ) : (
            page.sites.map((s) => (
              <Card key={s.id}>
                <Text variant="heading">{s.name}</Text>
                <Text variant="small" muted>
                  {siteKindLabel[s.kind]} · {s.locality ?? '—'} · {s.effectiveTimeZone} · {s.rideCount} rides
                </Text>
                <Text variant="small">{s.operatorName}</Text>
                <Button
                  label="Open"
                  tone="quiet"
                  onPress={() => router.push(siteHref(s.id))}
                  style={styles.start}
                />
              </Card>
            ))
          )
        }
      </PagedList>
      {user.role === 'admin' ? <TimeZoneCard /> : null}
    </Screen>
  );
}

const styles = StyleSheet.create({
  list: { gap: space.md },
  start: { alignSelf: 'flex-start' },
  filters: { gap: space.md },
  row: { flexDirection: 'row', gap: space.md, alignItems: 'flex-start' },
  flex: { flex: 1, minWidth: 0 },
  flex2: { flex: 2, minWidth: 0 },
});
