import { router, useLocalSearchParams } from 'expo-router';
import { StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { Card } from '@/components/card';
import { Panes } from '@/components/panes';
import { QueryState } from '@/components/query-state';
import { SubScreen } from '@/components/sub-screen';
import { Text } from '@/components/text';
import { colors, space } from '@/components/theme';
import { RoleGate } from '@/features/auth/ui';
import { useCompanyQuery, useRidePageQuery } from '@/features/registry/api';
import { Field } from '@/features/registry/design-view';
import { DeleteAction } from '@/features/registry/delete-action';
import { companiesHref, companyEditHref } from '@/features/registry/hrefs';
import { NotFound, RidesPane } from '@/features/registry/register-parts';
import { staff, routeParam } from '@/features/registry/screen-access';
import type { Role } from '@/features/session/schema';
import { ApiRequestError } from '@/lib/api-errors';

export function CompanyScreen() {
  const { id } = useLocalSearchParams<{ id: string }>();
  return <RoleGate roles={staff}>{(user) => <CompanyView id={routeParam(id)} role={user.role} />}</RoleGate>;
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
                {role === 'admin' ? (
                  <View style={styles.remove}>
                    <DeleteAction
                      kind="company"
                      id={c.id}
                      noun="company"
                      name={c.name}
                      consequence={
                        'The operator company and its contacts leave the register. A company that still has ' +
                        'sites, rides or user accounts stays: move or remove those first. The audit log keeps ' +
                        'a record of the removal.'
                      }
                      listHref={companiesHref}
                    />
                  </View>
                ) : null}
              </Card>
            }
          />
        </SubScreen>
      )}
    </QueryState>
  );
}

const styles = StyleSheet.create({
  remove: { paddingTop: space.md, borderTopWidth: 1, borderTopColor: colors.surfaceSunk },
  contact: { gap: 2, paddingTop: space.sm, borderTopWidth: 1, borderTopColor: colors.surfaceSunk },
});
