import { router, useLocalSearchParams } from 'expo-router';

import { QueryState } from '@/components/query-state';
import { SubScreen } from '@/components/sub-screen';
import { RoleGate } from '@/features/auth/ui';
import { useCompanyQuery, useCompanySaveMutation } from '@/features/registry/api';
import { CompanyForm, type CompanyFormInput } from '@/features/registry/company-form';
import { companiesHref, companyHref } from '@/features/registry/hrefs';
import { FormCard } from '@/features/registry/with-ride';
import { routeParam } from '@/features/registry/screen-access';

/** Admins add operator companies and keep their contacts and notice addresses right. */
export function CompanyEditScreen() {
  const { id } = useLocalSearchParams<{ id?: string }>();
  const companyId = routeParam(id) || null;
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
        <FormCard>
          {form({
            name: '',
            noticeEmails: [],
            phone: '',
            address: '',
            contacts: [],
            noticeUnits: 'si',
            noticePaper: 'A4',
          })}
        </FormCard>
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
              noticeUnits: c.noticeUnits,
              noticePaper: c.noticePaper,
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
