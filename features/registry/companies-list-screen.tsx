import { router } from 'expo-router';
import { StyleSheet } from 'react-native';

import { Button } from '@/components/button';
import { Card } from '@/components/card';
import Feather from '@/components/feather-icon';
import { PagedList } from '@/components/paged-list';
import { Screen } from '@/components/screen';
import { SortableTable } from '@/components/sortable-table';
import { Text } from '@/components/text';
import { TextField } from '@/components/text-field';
import { colors } from '@/components/theme';
import { useListParams, useSearchText } from '@/components/use-list-params';
import { useWide } from '@/components/use-wide';
import { RoleGate } from '@/features/auth/ui';
import { useCompanyListQuery } from '@/features/registry/api';
import { companyHref, newCompanyHref } from '@/features/registry/hrefs';
import { PAGE_SIZE } from '@/features/registry/register-parts';
import { RegisterTabs } from '@/features/registry/register-tabs';
import { RemovalNotice } from '@/features/registry/removal-notice';
import { type Company, companyListQuerySchema, companySortKeys } from '@/features/registry/schema';
import { staff } from '@/features/registry/screen-access';
import type { SessionUser } from '@/features/session/schema';

/** Operator companies: who owns the rides and where their notices go. Admins add and change them. */
export function CompaniesListScreen() {
  return <RoleGate roles={staff}>{(user) => <CompaniesList user={user} />}</RoleGate>;
}

function CompaniesList({ user }: { user: SessionUser }) {
  const wide = useWide();
  const [query, setQuery] = useListParams(companyListQuerySchema, ['q', 'sort', 'page']);
  const companies = useCompanyListQuery({ ...query, pageSize: PAGE_SIZE });
  const [search, setSearch] = useSearchText(query.q, (q) => setQuery({ q, page: undefined }));
  return (
    <Screen
      title="Companies"
      subtitle="Operator companies: ride owners, their contacts and notice addresses."
      actions={
        user.role === 'admin' ? (
          <Button
            label="New company"
            tone="accent"
            icon={<Feather name="plus" size={18} color={colors.baseText} />}
            onPress={() => router.push(newCompanyHref)}
          />
        ) : null
      }
    >
      <RegisterTabs role={user.role} />
      <RemovalNotice />
      <Card>
        <TextField label="Search companies" value={search} onChangeText={setSearch} autoCapitalize="none" />
      </Card>
      <PagedList query={companies} noun="companies" setPage={(page) => setQuery({ page })}>
        {(page) =>
          wide ? (
            <SortableTable<Company, (typeof companySortKeys)[number]>
              label="Operator companies"
              rows={page.companies}
              rowKey={(c) => c.id}
              rowHref={(c) => companyHref(c.id)}
              rowLabel={(c) => c.name}
              sort={query.sort}
              onSort={(sort) => setQuery({ sort, page: undefined })}
              columns={[
                { key: 'name', title: 'Company', sortKey: 'name', flex: 1.5, render: (c) => c.name },
                {
                  key: 'notices',
                  title: 'Notices to',
                  flex: 1.6,
                  render: (c) => c.noticeEmails.join(', ') || '—',
                },
                { key: 'phone', title: 'Phone', render: (c) => c.phone ?? '—' },
                {
                  key: 'sites',
                  title: 'Sites',
                  numeric: true,
                  flex: 0.5,
                  render: (c) => String(c.siteCount),
                },
                {
                  key: 'rides',
                  title: 'Rides',
                  numeric: true,
                  flex: 0.5,
                  render: (c) => String(c.rideCount),
                },
              ]}
            />
          ) : (
            page.companies.map((c) => (
              <Card key={c.id}>
                <Text variant="heading">{c.name}</Text>
                <Text variant="small" muted>
                  {c.rideCount} rides · {c.siteCount} sites
                </Text>
                <Text variant="small">{c.noticeEmails.join(', ') || 'No notice address'}</Text>
                <Button
                  label="Open"
                  tone="quiet"
                  onPress={() => router.push(companyHref(c.id))}
                  style={styles.start}
                />
              </Card>
            ))
          )
        }
      </PagedList>
    </Screen>
  );
}

const styles = StyleSheet.create({
  start: { alignSelf: 'flex-start' },
});
