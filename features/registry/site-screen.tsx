import { router, useLocalSearchParams } from 'expo-router';

import { Button } from '@/components/button';
import { Card } from '@/components/card';
import { Panes } from '@/components/panes';
import { QueryState } from '@/components/query-state';
import { SubScreen } from '@/components/sub-screen';
import { RoleGate } from '@/features/auth/ui';
import { useRidePageQuery, useSiteQuery } from '@/features/registry/api';
import { Field } from '@/features/registry/design-view';
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
              <Card>
                <Field label="Address" value={s.address ?? '—'} />
                <Field label="Locality" value={s.locality ?? '—'} />
                <Field
                  label="Time zone"
                  value={s.timeZone ?? `${s.effectiveTimeZone} (the inspection body’s default)`}
                />
                <Field label="Operator" value={s.operatorName} />
              </Card>
            }
          />
        </SubScreen>
      )}
    </QueryState>
  );
}
