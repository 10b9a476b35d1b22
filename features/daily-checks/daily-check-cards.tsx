import { Link } from 'expo-router';
import { StyleSheet, View } from 'react-native';

import { Card } from '@/components/card';
import { QueryState } from '@/components/query-state';
import { Text } from '@/components/text';
import { colors, space } from '@/components/theme';
import { useDailyOverviewQuery, useRideDailyChecksQuery } from '@/features/daily-checks/api';
import { dailyChecksHref } from '@/features/daily-checks/hrefs';
import type { DailyCheckSummary, DailyOverviewRide, RideDailyChecks } from '@/features/daily-checks/schema';
import { formatDate, formatDateTime } from '@/lib/dates';

const todayWords: Record<RideDailyChecks['todayState'], string> = {
  done: 'Daily check done today',
  not_done_yet: 'Not done yet today',
  not_in_service: 'Out of service: no daily check expected',
};

const missedWords = (days: string[]) =>
  days.length === 0
    ? 'No day missed in the last 14'
    : `Ran without a daily check on ${days.map((d) => formatDate(d)).join(', ')}`;

function CheckLine({ check }: { check: DailyCheckSummary }) {
  const failed = check.result === 'fail';
  return (
    <Text color={failed ? colors.danger : undefined}>
      {formatDate(check.day)} · {failed ? `Failed (${check.failedItems}): must not open` : 'Passed'}
      {check.testCycles !== null ? ` · ${check.testCycles} test cycles` : ''} · {check.byName},{' '}
      {formatDateTime(check.submittedAt)}
    </Text>
  );
}

/** The operator's home: each ride's daily check today, its latest result and the days missed. */
export function DailyOverviewCard() {
  const overview = useDailyOverviewQuery();
  return (
    <Card style={styles.card}>
      <Text variant="heading">Daily checks</Text>
      <Link href={dailyChecksHref} style={styles.link}>
        <Text color={colors.accent}>Open the daily checks on this phone</Text>
      </Link>
      <QueryState query={overview}>
        {({ rides }) => (
          <View style={styles.list} role="list" accessibilityLabel="Daily checks of your rides">
            {rides.map((r) => (
              <OverviewRow key={r.rideId} ride={r} />
            ))}
          </View>
        )}
      </QueryState>
    </Card>
  );
}

function OverviewRow({ ride }: { ride: DailyOverviewRide }) {
  const failed = ride.latest?.result === 'fail';
  return (
    <View role="listitem" style={styles.row}>
      <Text variant="heading">{ride.rideName}</Text>
      <Text color={ride.todayState === 'not_done_yet' ? colors.danger : undefined}>
        {todayWords[ride.todayState]}
      </Text>
      {ride.latest ? <CheckLine check={ride.latest} /> : <Text muted>No daily check yet.</Text>}
      {failed ? <Text color={colors.danger}>Do not open until a later daily check passes.</Text> : null}
      <Text color={ride.missedDays.length ? colors.danger : undefined} muted={!ride.missedDays.length}>
        {missedWords(ride.missedDays)}
      </Text>
    </View>
  );
}

/** A ride's page: its daily checks of the last 14 days and the days it ran without one. */
export function RideDailyChecksCard({ rideId }: { rideId: string }) {
  const checks = useRideDailyChecksQuery(rideId);
  return (
    <Card style={styles.card}>
      <Text variant="heading">Daily checks</Text>
      <QueryState query={checks}>
        {(d) => (
          <View style={styles.list}>
            <Text color={d.todayState === 'not_done_yet' ? colors.danger : undefined}>
              {todayWords[d.todayState]}
            </Text>
            <Text color={d.missedDays.length ? colors.danger : undefined}>{missedWords(d.missedDays)}</Text>
            {d.checks.length === 0 ? (
              <Text muted>No daily check in the last 14 days.</Text>
            ) : (
              d.checks.slice(0, 14).map((c) => <CheckLine key={c.id} check={c} />)
            )}
          </View>
        )}
      </QueryState>
    </Card>
  );
}

const styles = StyleSheet.create({
  card: { gap: space.md },
  list: { gap: space.sm },
  row: { gap: 2, paddingVertical: space.sm, borderBottomWidth: 1, borderBottomColor: colors.border },
  link: { alignSelf: 'flex-start' },
});
