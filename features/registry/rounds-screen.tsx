import { memo } from 'react';
import { StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { Card } from '@/components/card';
import { IconButton } from '@/components/icon-button';
import { QueryState } from '@/components/query-state';
import { Screen, SectionTitle } from '@/components/screen';
import { SelectField } from '@/components/select-field';
import { RideStatusMark } from '@/components/status-mark';
import { Text } from '@/components/text';
import { colors, space } from '@/components/theme';
import { useListParams } from '@/components/use-list-params';
import { useWide } from '@/components/use-wide';
import { RoleGate } from '@/features/auth/ui';
import { useInspectorsQuery } from '@/features/registry/api';
import { DueMark } from '@/features/registry/due-mark';
import { RegisterTabs } from '@/features/registry/register-tabs';
import {
  inspectionTypeLabel,
  roundWeekQuerySchema,
  weekStartOf,
  type RoundDay,
  type RoundItem,
  type RoundWeek,
} from '@/features/registry/schema';
import { planners } from '@/features/registry/screen-access';
import {
  useRoundItemMutation,
  useRoundOrderMutation,
  useRoundWeekQuery,
} from '@/features/registry/setups-api';
import type { SessionUser } from '@/features/session/schema';
import { addDays, formatDate, localDay } from '@/lib/dates';

const WEEKDAYS = ['Monday', 'Tuesday', 'Wednesday', 'Thursday', 'Friday', 'Saturday', 'Sunday'] as const;
const NOBODY = '__nobody';
const dayWords = (day: string, index: number) => `${WEEKDAYS[index]} ${formatDate(day)}`;

type Inspector = { id: string; name: string };

/**
 * The planner's week (supervisors and administrators): every inspection due that week or overdue, by day
 * and by site in the order the sites are visited. Each inspection gets its day and inspector; each day's
 * sites move up and down the travel order. Everything is saved as it is chosen; the inspectors' phones
 * take the plan with their next sync and order Today by it.
 */
export function RoundsScreen() {
  return <RoleGate roles={planners}>{(user) => <Rounds user={user} />}</RoleGate>;
}

function Rounds({ user }: { user: SessionUser }) {
  const [query, setQuery] = useListParams(roundWeekQuerySchema, ['week']);
  const monday = weekStartOf(query.week ?? localDay());
  const week = useRoundWeekQuery(monday);
  const inspectors = useInspectorsQuery();
  const go = (days: number) => setQuery({ week: days === 0 ? undefined : addDays(monday, days) });
  return (
    <Screen
      title="Rounds"
      subtitle={`Week of ${formatDate(monday)} to ${formatDate(addDays(monday, 6))}: inspections due or overdue, by day and site.`}
    >
      <RegisterTabs role={user.role} />
      <View style={styles.weekBar}>
        <Button label="‹ Previous week" tone="quiet" onPress={() => go(-7)} />
        <Button label="This week" tone="quiet" onPress={() => go(0)} />
        <Button label="Next week ›" tone="quiet" onPress={() => go(7)} />
      </View>
      <QueryState query={week}>{(w) => <WeekPlan week={w} inspectors={inspectors.data ?? []} />}</QueryState>
    </Screen>
  );
}

const WeekPlan = memo(function WeekPlan({ week, inspectors }: { week: RoundWeek; inspectors: Inspector[] }) {
  const wide = useWide();
  const days = week.days.map((d) => d.day);
  return (
    <View style={wide ? styles.daysWide : styles.days}>
      {week.days.map((d, i) => (
        <View key={d.day} style={wide ? styles.dayWide : undefined}>
          <DayPlan day={d} title={dayWords(d.day, i)} days={days} inspectors={inspectors} />
        </View>
      ))}
    </View>
  );
});

function DayPlan({
  day,
  title,
  days,
  inspectors,
}: {
  day: RoundDay;
  title: string;
  days: string[];
  inspectors: Inspector[];
}) {
  const order = useRoundOrderMutation();
  const count = day.sites.reduce((n, s) => n + s.items.length, 0);
  const placed = day.sites.filter((s) => s.siteId !== null);
  const move = (index: number, by: -1 | 1) => {
    const ids = placed.map((s) => s.siteId as string);
    const [moved] = ids.splice(index, 1);
    ids.splice(index + by, 0, moved);
    order.mutate({ day: day.day, siteIds: ids });
  };
  return (
    <View style={styles.day} accessibilityLabel={title}>
      <SectionTitle>{`${title} (${count})`}</SectionTitle>
      {count === 0 ? <Text muted>Nothing due.</Text> : null}
      {day.sites.map((site) => {
        const index = placed.indexOf(site);
        const name = site.siteName ?? 'No site (in store)';
        return (
          <Card key={site.siteId ?? 'none'} accessibilityLabel={`${name}, ${title}`}>
            <View style={styles.siteHead}>
              <Text variant="heading" style={styles.grow}>
                {index >= 0 ? `${index + 1}. ` : ''}
                {name}
              </Text>
              {index >= 0 && placed.length > 1 ? (
                <>
                  <IconButton
                    icon="arrow-up"
                    label={`Visit ${name} earlier on ${title}`}
                    disabled={index === 0 || order.isPending}
                    onPress={() => move(index, -1)}
                  />
                  <IconButton
                    icon="arrow-down"
                    label={`Visit ${name} later on ${title}`}
                    disabled={index === placed.length - 1 || order.isPending}
                    onPress={() => move(index, 1)}
                  />
                </>
              ) : null}
            </View>
            {site.items.map((item) => (
              <ItemPlan key={item.scheduleId} item={item} days={days} inspectors={inspectors} />
            ))}
          </Card>
        );
      })}
      {order.isError ? (
        <Text role="alert" color={colors.danger}>
          {(order.error as Error).message}
        </Text>
      ) : null}
    </View>
  );
}

function ItemPlan({ item, days, inspectors }: { item: RoundItem; days: string[]; inspectors: Inspector[] }) {
  const save = useRoundItemMutation();
  const plan = (patch: Partial<{ day: string; assignedTo: string | null }>) =>
    save.mutate({
      scheduleId: item.scheduleId,
      body: { day: item.day, assignedTo: item.assignedTo?.id ?? null, ...patch },
    });
  const what = `${item.rideName}, ${inspectionTypeLabel[item.inspectionType].toLowerCase()}`;
  return (
    <View style={styles.item} accessibilityLabel={what}>
      <View style={styles.itemHead}>
        <View style={styles.grow}>
          <Text variant="heading">{item.rideName}</Text>
          <Text variant="small" muted>
            {inspectionTypeLabel[item.inspectionType]} · due {formatDate(item.nextDueOn)} ·{' '}
            {item.operatorName}
          </Text>
        </View>
        <DueMark status={item.dueStatus} />
        {item.rideStatus === 'in_service' ? null : <RideStatusMark status={item.rideStatus} compact />}
      </View>
      <View style={styles.choices}>
        <View style={styles.choice}>
          <SelectField
            label={`Day for ${what}`}
            value={item.day}
            options={days.map((d, i) => ({ value: d, label: dayWords(d, i) }))}
            onChange={(day) => plan({ day })}
          />
        </View>
        <View style={styles.choice}>
          <SelectField
            label={`Inspector for ${what}`}
            value={item.assignedTo?.id ?? NOBODY}
            options={[
              { value: NOBODY, label: 'Not assigned' },
              ...inspectors.map((i) => ({ value: i.id, label: i.name })),
            ]}
            onChange={(v) => plan({ assignedTo: v === NOBODY ? null : v })}
          />
        </View>
      </View>
      {save.isError ? (
        <Text role="alert" color={colors.danger}>
          {(save.error as Error).message}
        </Text>
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  grow: { flex: 1 },
  weekBar: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  days: { gap: space.lg },
  daysWide: { flexDirection: 'row', flexWrap: 'wrap', gap: space.lg },
  dayWide: { flexBasis: 420, flexGrow: 1, maxWidth: 640 },
  day: { gap: space.md },
  siteHead: { flexDirection: 'row', alignItems: 'center', gap: space.sm },
  item: { gap: space.sm, paddingTop: space.sm, borderTopWidth: 1, borderTopColor: colors.surfaceSunk },
  itemHead: { flexDirection: 'row', gap: space.sm, alignItems: 'flex-start' },
  choices: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md },
  choice: { flexGrow: 1, flexBasis: 180, minWidth: 0 },
});
