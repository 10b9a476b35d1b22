import Feather from '@expo/vector-icons/Feather';
import { type Href, router, useLocalSearchParams } from 'expo-router';
import { StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { Card } from '@/components/card';
import { QueryState } from '@/components/query-state';
import { Screen } from '@/components/screen';
import { SelectField } from '@/components/select-field';
import { SortableTable } from '@/components/sortable-table';
import { SubScreen } from '@/components/sub-screen';
import { Text } from '@/components/text';
import { TextField } from '@/components/text-field';
import { ToggleChips } from '@/components/toggle-chips';
import { colors, space } from '@/components/theme';
import { useWide } from '@/components/use-wide';
import { ApiRequestError } from '@/lib/api-errors';
import { RoleGate } from '@/features/auth';
import type { Role, SessionUser } from '@/features/session/schema';
import {
  operatorChoices,
  useCompanyListQuery,
  useCompanyQuery,
  useCompanySaveMutation,
  useRidePageQuery,
  useSiteListQuery,
  useSiteQuery,
  useSiteSaveMutation,
} from '@/features/registry/api';
import {
  CompanyForm,
  type CompanyFormInput,
  SiteForm,
  type SiteFormInput,
} from '@/features/registry/company-form';
import { Field } from '@/features/registry/design-view';
import { PagedList } from '@/components/paged-list';
import { Panes } from '@/components/panes';
import { RegisterTabs } from '@/features/registry/register-tabs';
import { FormCard } from '@/features/registry/ride-edit-screens';
import {
  type Company,
  type Site,
  companyListQuerySchema,
  companySortKeys,
  siteKindLabel,
  siteKinds,
  siteListQuerySchema,
  siteSortKeys,
} from '@/features/registry/schema';
import { useListParams, useSearchText } from '@/components/use-list-params';
import {
  companiesHref,
  companyEditHref,
  companyHref,
  newCompanyHref,
  newSiteHref,
  siteEditHref,
  siteHref,
  sitesHref,
} from '@/features/registry/hrefs';
import { RideCard } from '@/features/rides';
import type { RideSummary } from '@/features/rides/schema';

const staff = ['admin', 'supervisor', 'inspector'] as const;
const PAGE_SIZE = 25;
const ALL = '__all';

const param = (v: string | string[] | undefined) => (Array.isArray(v) ? (v[0] ?? '') : (v ?? ''));

// ——— companies ———

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
      title="Rides"
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

export function CompanyScreen() {
  const { id } = useLocalSearchParams<{ id: string }>();
  return <RoleGate roles={staff}>{(user) => <CompanyView id={param(id)} role={user.role} />}</RoleGate>;
}

function NotFound({ title, back }: { title: string; back: { href: Href; label: string } }) {
  return (
    <SubScreen title={title} back={back}>
      <Card role="alert">
        <Text>It may have been removed, or the link is old.</Text>
      </Card>
    </SubScreen>
  );
}

/** The rides of a company or site under their count; the count waits for the list. */
function RidesPane({
  title,
  page,
}: {
  title: string;
  page: { total: number; rides: RideSummary[] } | undefined;
}) {
  return (
    <>
      <Text variant="label" muted>
        {`${title} (${page?.total ?? '…'})`}
      </Text>
      {(page?.rides ?? []).map((r) => (
        <RideCard key={r.id} ride={r} showOperator={false} link />
      ))}
    </>
  );
}

function CompanyView({ id, role }: { id: string; role: Role }) {
  const company = useCompanyQuery(id);
  const rides = useRidePageQuery({ operatorId: id, pageSize: 100, sort: 'name' });
  if (company.error instanceof ApiRequestError && company.error.status === 404)
    return <NotFound title="No such company" back={{ href: companiesHref, label: 'Companies' }} />;
  return (
    <QueryState query={company}>
      {(c) => (
        <SubScreen
          title={c.name}
          subtitle={c.kind === 'operator' ? 'Operator company' : 'Inspection body'}
          back={{ href: companiesHref, label: 'Companies' }}
          actions={
            role === 'admin' ? (
              <Button label="Edit company" tone="quiet" onPress={() => router.push(companyEditHref(c.id))} />
            ) : null
          }
        >
          <Panes
            main={<RidesPane title="RIDES" page={rides.data} />}
            side={
              <Card>
                <Field label="Notices to" value={c.noticeEmails.join('\n') || '—'} />
                <Field label="Phone" value={c.phone ?? '—'} />
                <Field label="Address" value={c.address ?? '—'} />
                <Text variant="label" muted>
                  CONTACTS
                </Text>
                {c.contacts.length === 0 ? <Text muted>None given.</Text> : null}
                {c.contacts.map((p, i) => (
                  <View key={i} style={styles.contact}>
                    <Text variant="heading">{p.name}</Text>
                    {p.role ? <Text variant="small">{p.role}</Text> : null}
                    <Text variant="small" muted>
                      {[p.email, p.phone].filter(Boolean).join(' · ') || '—'}
                    </Text>
                  </View>
                ))}
              </Card>
            }
          />
        </SubScreen>
      )}
    </QueryState>
  );
}

/** Admins add operator companies and keep their contacts and notice addresses right. */
export function CompanyEditScreen() {
  const { id } = useLocalSearchParams<{ id?: string }>();
  const companyId = param(id) || null;
  return <RoleGate roles={['admin']}>{() => <CompanyEdit id={companyId} />}</RoleGate>;
}

function CompanyEdit({ id }: { id: string | null }) {
  const company = useCompanyQuery(id);
  const save = useCompanySaveMutation(id);
  const form = (values: CompanyFormInput) => (
    <CompanyForm
      defaultValues={values}
      submitLabel={id ? 'Save changes' : 'Add company'}
      onSubmit={async (v) => {
        const res = await save.mutateAsync(v);
        router.replace(companyHref(res.company.id));
      }}
      onCancel={() => router.back()}
    />
  );
  if (!id)
    return (
      <SubScreen title="New operator company" back={{ href: companiesHref, label: 'Companies' }}>
        <FormCard>{form({ name: '', noticeEmails: [], phone: '', address: '', contacts: [] })}</FormCard>
      </SubScreen>
    );
  return (
    <QueryState query={company}>
      {(c) => (
        <SubScreen title={`Edit ${c.name}`} back={{ href: companyHref(c.id), label: c.name }}>
          <FormCard>
            {form({
              name: c.name,
              noticeEmails: c.noticeEmails,
              phone: c.phone ?? '',
              address: c.address ?? '',
              contacts: c.contacts.map((p) => ({
                name: p.name,
                role: p.role ?? '',
                email: p.email ?? '',
                phone: p.phone ?? '',
              })),
            })}
          </FormCard>
        </SubScreen>
      )}
    </QueryState>
  );
}

// ——— sites ———

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
      title="Rides"
      subtitle="Sites: parks, fairgrounds and travelling set-ups."
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
                  {siteKindLabel[s.kind]} · {s.locality ?? '—'} · {s.rideCount} rides
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
    </Screen>
  );
}

export function SiteScreen() {
  const { id } = useLocalSearchParams<{ id: string }>();
  return <RoleGate roles={staff}>{(user) => <SiteView id={param(id)} role={user.role} />}</RoleGate>;
}

function SiteView({ id, role }: { id: string; role: Role }) {
  const site = useSiteQuery(id);
  const rides = useRidePageQuery({ siteId: id, pageSize: 100, sort: 'name' });
  if (site.error instanceof ApiRequestError && site.error.status === 404)
    return <NotFound title="No such site" back={{ href: sitesHref, label: 'Sites' }} />;
  return (
    <QueryState query={site}>
      {(s) => (
        <SubScreen
          title={s.name}
          subtitle={`${siteKindLabel[s.kind]} · ${s.operatorName}`}
          back={{ href: sitesHref, label: 'Sites' }}
          actions={
            role === 'admin' ? (
              <Button label="Edit site" tone="quiet" onPress={() => router.push(siteEditHref(s.id))} />
            ) : null
          }
        >
          <Panes
            main={<RidesPane title="RIDES AT THIS SITE" page={rides.data} />}
            side={
              <Card>
                <Field label="Address" value={s.address ?? '—'} />
                <Field label="Locality" value={s.locality ?? '—'} />
                <Field label="Operator" value={s.operatorName} />
              </Card>
            }
          />
        </SubScreen>
      )}
    </QueryState>
  );
}

export function SiteEditScreen() {
  const { id } = useLocalSearchParams<{ id?: string }>();
  const siteId = param(id) || null;
  return <RoleGate roles={['admin']}>{() => <SiteEdit id={siteId} />}</RoleGate>;
}

function SiteEdit({ id }: { id: string | null }) {
  const site = useSiteQuery(id);
  const save = useSiteSaveMutation(id);
  const companies = useCompanyListQuery({ pageSize: 200, sort: 'name' });
  const operators = operatorChoices(companies.data?.companies);
  const form = (values: SiteFormInput) =>
    companies.data ? (
      <SiteForm
        defaultValues={values}
        operators={operators}
        submitLabel={id ? 'Save changes' : 'Add site'}
        onSubmit={async (v) => {
          const res = await save.mutateAsync(v);
          router.replace(siteHref(res.site.id));
        }}
        onCancel={() => router.back()}
      />
    ) : (
      <Text muted>Loading companies…</Text>
    );
  if (!id)
    return (
      <SubScreen title="New site" back={{ href: sitesHref, label: 'Sites' }}>
        <FormCard>
          {form({ name: '', kind: 'park', address: '', locality: '', operatorCompanyId: '' })}
        </FormCard>
      </SubScreen>
    );
  return (
    <QueryState query={site}>
      {(s) => (
        <SubScreen title={`Edit ${s.name}`} back={{ href: siteHref(s.id), label: s.name }}>
          <FormCard>
            {form({
              name: s.name,
              kind: s.kind,
              address: s.address ?? '',
              locality: s.locality ?? '',
              operatorCompanyId: s.operatorCompanyId,
            })}
          </FormCard>
        </SubScreen>
      )}
    </QueryState>
  );
}

const styles = StyleSheet.create({
  list: { gap: space.md },
  start: { alignSelf: 'flex-start' },
  filters: { gap: space.md },
  row: { flexDirection: 'row', gap: space.md, alignItems: 'flex-start' },
  flex: { flex: 1, minWidth: 0 },
  flex2: { flex: 2, minWidth: 0 },
  contact: { gap: 2, paddingTop: space.sm, borderTopWidth: 1, borderTopColor: colors.surfaceSunk },
});
