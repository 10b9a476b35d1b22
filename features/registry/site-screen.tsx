import { router, useLocalSearchParams } from 'expo-router';
import { StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { Card } from '@/components/card';
import { Panes } from '@/components/panes';
import { QueryState } from '@/components/query-state';
import { SubScreen } from '@/components/sub-screen';
import { colors, space } from '@/components/theme';
import { RoleGate } from '@/features/auth/ui';
import { SiteEventsCard } from '@/features/registry/site-events-card';
import { useRidePageQuery, useSiteQuery } from '@/features/registry/api';
import { Field } from '@/features/registry/design-view';
import { DeleteAction } from '@/features/registry/delete-action';
import { siteEditHref, sitesHref } from '@/features/registry/hrefs';
import { NotFound, RidesPane } from '@/features/registry/register-parts';
import { siteKindLabel } from '@/features/registry/schema';
import { staff, routeParam } from '@/features/registry/screen-access';
import type { Role } from '@/features/session/schema';
import { ApiRequestError } from '@/lib/api-errors';

export function SiteScreen() {
  const { id } = useLocalSearchParams<{ id: string }>();
  return <RoleGate roles={staff}>{(user) => <SiteView id={routeParam(id)} role={user.role} />}</RoleGate>;
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
              <>
                <Card>
                  <Field label="Address" value={s.address ?? '—'} />
                  <Field label="Locality" value={s.locality ?? '—'} />
                  <Field
                    label="Time zone"
                    value={s.timeZone ?? `${s.effectiveTimeZone} (the inspection body’s default)`}
                  />
                  <Field label="Operator" value={s.operatorName} />
                  {role === 'admin' ? (
                    <View style={styles.remove}>
                      <DeleteAction
                        kind="site"
                        id={s.id}
                        noun="site"
                        name={s.name}
                        consequence={
                          'The site leaves the register. A site with rides on it stays: move its rides to ' +
                          'another site first. The audit log keeps a record of the removal.'
                        }
                        listHref={sitesHref}
                      />
                    </View>
                  ) : null}
                </Card>
                <SiteEventsCard siteId={s.id} planner={role === 'admin' || role === 'supervisor'} />
              </>
            }
          />
        </SubScreen>
      )}
    </QueryState>
  );
}

const styles = StyleSheet.create({
  remove: { paddingTop: space.md, borderTopWidth: 1, borderTopColor: colors.surfaceSunk },
});
