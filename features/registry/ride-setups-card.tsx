import { useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { Card } from '@/components/card';
import Feather from '@/components/feather-icon';
import { Spinner } from '@/components/spinner';
import { Text } from '@/components/text';
import { colors, radius, space } from '@/components/theme';
import { useInspectorsQuery, useSiteListQuery } from '@/features/registry/api';
import {
  setupPendingWords,
  setupStateLabel,
  setupStateVocabulary,
  type Setup,
} from '@/features/registry/schema';
import { SetupForm } from '@/features/registry/setup-form';
import {
  useRideSetupsQuery,
  useSetupCreateMutation,
  useSetupStateMutation,
  useSiteEventsQuery,
} from '@/features/registry/setups-api';
import { formatDate } from '@/lib/dates';

/**
 * A travelling ride's set-ups on its page: where it is built up, from when to when, and whether it may run
 * there. Planners (supervisors, administrators) plan the next build-up and record built and pulled down;
 * everyone else reads. While a set-up waits for its inspection the card says so first.
 */
export function RideSetupsCard({ rideId, planner }: { rideId: string; planner: boolean }) {
  const query = useRideSetupsQuery(rideId);
  const [planning, setPlanning] = useState(false);
  const list = query.data ?? [];
  const pending = list.find((s) => s.state === 'set_up');
  const shown = list.filter((s) => s.state !== 'pulled_down' || s === list.at(-1));
  return (
    <Card accessibilityLabel="Set-ups">
      <Text variant="heading">Set-ups</Text>
      {pending ? <PendingLine setup={pending} /> : null}
      {query.isPending ? (
        <Spinner color={colors.base} />
      ) : query.error ? (
        <Text muted>The set-ups could not be loaded.</Text>
      ) : shown.length === 0 ? (
        <Text muted>No set-ups. A travelling ride’s build-ups at each site are planned here.</Text>
      ) : (
        shown.map((s) => <SetupLine key={s.id} setup={s} planner={planner} />)
      )}
      {planner ? (
        planning ? (
          <PlanSetup rideId={rideId} onDone={() => setPlanning(false)} />
        ) : (
          <Button label="Plan a set-up" tone="quiet" onPress={() => setPlanning(true)} />
        )
      ) : null}
    </Card>
  );
}

function PendingLine({ setup }: { setup: Setup }) {
  return (
    <View style={styles.pending} accessibilityLabel={setupPendingWords(setup.siteName)}>
      <Feather name="alert-triangle" size={18} color={colors.over} />
      <Text color={colors.over} style={styles.grow}>
        {setupPendingWords(setup.siteName)}
      </Text>
    </View>
  );
}

function SetupLine({ setup: s, planner }: { setup: Setup; planner: boolean }) {
  const change = useSetupStateMutation();
  const act = (state: 'set_up' | 'pulled_down') => change.mutate({ id: s.id, body: { state } });
  return (
    <View style={styles.line}>
      <Text variant="heading">
        {s.siteName}
        {s.eventName ? ` · ${s.eventName}` : ''}
      </Text>
      <Text variant="small" muted>
        {formatDate(s.fromDate)} – {formatDate(s.toDate)}
        {s.pitch ? ` · ${s.pitch}` : ''}
      </Text>
      <Text variant="small" accessibilityHint={setupStateVocabulary[s.state].description}>
        {setupStateLabel[s.state]}
      </Text>
      {planner && s.state !== 'pulled_down' ? (
        <View style={styles.actions}>
          {s.state === 'planned' ? (
            <Button
              label="Record as built"
              tone="quiet"
              busy={change.isPending}
              onPress={() => act('set_up')}
            />
          ) : null}
          <Button label="Pull down" tone="quiet" busy={change.isPending} onPress={() => act('pulled_down')} />
        </View>
      ) : null}
      {change.isError ? (
        <Text role="alert" color={colors.danger}>
          {(change.error as Error).message}
        </Text>
      ) : null}
    </View>
  );
}

function PlanSetup({ rideId, onDone }: { rideId: string; onDone: () => void }) {
  const sites = useSiteListQuery({ pageSize: 200, sort: 'name' });
  const events = useSiteEventsQuery();
  const inspectors = useInspectorsQuery();
  const create = useSetupCreateMutation();
  if (!sites.data || !events.data || !inspectors.data) return <Spinner color={colors.base} />;
  return (
    <SetupForm
      sites={sites.data.sites}
      events={events.data}
      inspectors={inspectors.data}
      onSubmit={async (values) => {
        await create.mutateAsync({ ...values, rideId });
        onDone();
      }}
      onCancel={onDone}
    />
  );
}

const styles = StyleSheet.create({
  grow: { flex: 1 },
  pending: {
    flexDirection: 'row',
    gap: space.sm,
    alignItems: 'flex-start',
    padding: space.sm,
    borderRadius: radius.sm,
    backgroundColor: colors.overSoft,
  },
  line: {
    gap: 2,
    paddingVertical: space.xs,
    borderTopWidth: 1,
    borderTopColor: colors.surfaceSunk,
  },
  actions: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
});
