import { router, useLocalSearchParams } from 'expo-router';

import { QueryState } from '@/components/query-state';
import { SubScreen } from '@/components/sub-screen';
import { Text } from '@/components/text';
import { RoleGate } from '@/features/auth/ui';
import {
  operatorChoices,
  useCompanyListQuery,
  useSiteQuery,
  useSiteSaveMutation,
  useTimeZoneSettingQuery,
} from '@/features/registry/api';
import { SiteForm, type SiteFormInput } from '@/features/registry/company-form';
import { siteHref, sitesHref } from '@/features/registry/hrefs';
import { FormCard } from '@/features/registry/with-ride';
import { routeParam } from '@/features/registry/screen-access';

export function SiteEditScreen() {
  const { id } = useLocalSearchParams<{ id?: string }>();
  const siteId = routeParam(id) || null;
  return <RoleGate roles={['admin']}>{() => <SiteEdit id={siteId} />}</RoleGate>;
}

function SiteEdit({ id }: { id: string | null }) {
  const site = useSiteQuery(id);
  const save = useSiteSaveMutation(id);
  const companies = useCompanyListQuery({ pageSize: 200, sort: 'name' });
  const operators = operatorChoices(companies.data?.companies);
  const defaultZone = useTimeZoneSettingQuery().data?.zone;
  const form = (values: SiteFormInput) =>
    companies.data ? (
      <SiteForm
        defaultValues={values}
        operators={operators}
        defaultZone={defaultZone}
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
          {form({ name: '', kind: 'park', address: '', locality: '', timeZone: '', operatorCompanyId: '' })}
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
              timeZone: s.timeZone ?? '',
              operatorCompanyId: s.operatorCompanyId,
            })}
          </FormCard>
        </SubScreen>
      )}
    </QueryState>
  );
}
