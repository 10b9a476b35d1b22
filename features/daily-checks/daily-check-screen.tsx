import { useQueryClient } from '@tanstack/react-query';
import { useEffect, useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { Card } from '@/components/card';
import { QueryState } from '@/components/query-state';
import { Screen, SectionTitle } from '@/components/screen';
import { Text } from '@/components/text';
import { TextField } from '@/components/text-field';
import { colors, space } from '@/components/theme';
import { RoleGate } from '@/features/auth/ui';
import {
  dailyKeys,
  usePhoneDailyRidesQuery,
  usePhoneSentDailyQuery,
  useStartDailyCheckMutation,
} from '@/features/daily-checks/api';
import { dailyCheckFailed } from '@/features/daily-checks/device';
import { DailyCheckForm } from '@/features/daily-checks/daily-check-form';
import { OperatorDevice } from '@/features/daily-checks/operator-device';
import type { OutboxItem } from '@/features/device-db';
import { useLogDayMutation } from '@/features/pivot-life/ui';
import type { SessionUser } from '@/features/session/schema';
import { useSyncStatus } from '@/features/sync/ui';
import { dayInZone, deviceTimeZone, formatDateTime } from '@/lib/dates';

/**
 * The operator's daily job on a phone (/daily): pick one of the company's rides, fill its pre-opening
 * checklist and test run, send; offline it waits on the phone and goes when the connection returns.
 * The day's running log is entered here too (online: it goes straight to the running log's API).
 */
export function DailyCheckScreen() {
  return (
    <RoleGate roles={['operator']}>
      {(user) => (
        <Screen title="Daily checks" subtitle={user.companyName ?? undefined}>
          <OperatorDevice key={user.id} userId={user.id}>
            <DailyBody user={user} />
          </OperatorDevice>
        </Screen>
      )}
    </RoleGate>
  );
}

function DailyBody({ user }: { user: SessionUser }) {
  const [open, setOpen] = useState<string | null>(null);
  const sync = useSyncStatus();
  const client = useQueryClient();
  // A sync run brings the rides and checklists, and answers what was sent: read the phone again.
  useEffect(() => {
    void client.invalidateQueries({ queryKey: dailyKeys.phoneRides() });
    void client.invalidateQueries({ queryKey: dailyKeys.phoneSent() });
  }, [client, sync.lastSuccessAt, sync.waiting, sync.accepted]);
  if (open)
    return (
      <DailyCheckForm
        draftId={open}
        user={user}
        onDone={(sent) => {
          setOpen(null);
          if (sent) void sync.syncNow();
        }}
      />
    );
  return (
    <View style={styles.body}>
      <Text role="status" muted={sync.online} color={sync.online ? undefined : colors.danger}>
        {sync.online
          ? sync.waiting > 0
            ? `Sending ${sync.waiting} daily check${sync.waiting === 1 ? '' : 's'}…`
            : 'Connected: checks go to the inspection body as you send them.'
          : 'This phone is offline. Checks are kept here and sent when the connection returns.'}
      </Text>
      <PhoneRides onOpen={setOpen} />
      <SentChecks />
      <RunningLogToday online={sync.online} />
    </View>
  );
}

function PhoneRides({ onOpen }: { onOpen: (draftId: string) => void }) {
  const rides = usePhoneDailyRidesQuery();
  const start = useStartDailyCheckMutation();
  return (
    <View style={styles.section}>
      <SectionTitle>Before opening</SectionTitle>
      <QueryState query={rides}>
        {(list) =>
          list.length === 0 ? (
            <Text muted>
              No rides on this phone yet: connect once so your company&apos;s rides are fetched.
            </Text>
          ) : (
            <View style={styles.list}>
              {list.map(({ ride, hasTemplate, draftId }) => (
                <Card key={ride.id} style={styles.card}>
                  <Text variant="heading">{ride.name}</Text>
                  <Text muted>{ride.siteName ?? 'No site'}</Text>
                  {!hasTemplate ? (
                    <Text muted>The inspection body has set no daily checklist for this ride class yet.</Text>
                  ) : draftId ? (
                    <Button
                      label="Continue today's check"
                      accessibilityLabel={`Continue the daily check of ${ride.name}`}
                      onPress={() => onOpen(draftId)}
                    />
                  ) : (
                    <Button
                      label="Start today's check"
                      accessibilityLabel={`Start the daily check of ${ride.name}`}
                      busy={start.isPending && start.variables === ride.id}
                      onPress={() => start.mutate(ride.id, { onSuccess: (d) => onOpen(d.id) })}
                    />
                  )}
                </Card>
              ))}
              {start.error ? <Text color={colors.danger}>{start.error.message}</Text> : null}
            </View>
          )
        }
      </QueryState>
    </View>
  );
}

const stateWords: Record<OutboxItem['state'], string> = {
  queued: 'Waiting to send',
  sending: 'Sending…',
  accepted: 'Sent',
  rejected: 'Refused by the server',
};

function SentChecks() {
  const sent = usePhoneSentDailyQuery();
  const rides = usePhoneDailyRidesQuery();
  const names = new Map((rides.data ?? []).map((r) => [r.ride.id, r.ride.name]));
  return (
    <View style={styles.section}>
      <SectionTitle>Sent from this phone</SectionTitle>
      <QueryState query={sent}>
        {(items) =>
          items.length === 0 ? (
            <Text muted>No daily check sent from this phone yet.</Text>
          ) : (
            <View style={styles.list} role="list" accessibilityLabel="Daily checks sent from this phone">
              {items.slice(0, 20).map((item) => (
                <SentRow key={item.id} item={item} rideName={names.get(item.record.rideId) ?? 'Ride'} />
              ))}
            </View>
          )
        }
      </QueryState>
    </View>
  );
}

function SentRow({ item, rideName }: { item: OutboxItem; rideName: string }) {
  const failed = dailyCheckFailed(item.record);
  const words = `${stateWords[item.state]} · ${failed ? 'Failed: do not open' : 'Passed'}`;
  return (
    <View role="listitem" style={styles.row} accessibilityLabel={`${rideName}: ${words}`}>
      <Text variant="heading">{rideName}</Text>
      <Text color={failed ? colors.danger : undefined}>{words}</Text>
      <Text muted>{formatDateTime(item.record.submittedAt)}</Text>
      {item.state === 'rejected'
        ? item.issues.map((i) => (
            <Text key={`${i.path}:${i.message}`} color={colors.danger}>
              {i.message}
            </Text>
          ))
        : null}
    </View>
  );
}

function RunningLogToday({ online }: { online: boolean }) {
  const rides = usePhoneDailyRidesQuery();
  const [rideId, setRideId] = useState<string | null>(null);
  const [cycles, setCycles] = useState('');
  const [saved, setSaved] = useState<string | null>(null);
  const chosen = rideId ?? rides.data?.[0]?.ride.id ?? null;
  const log = useLogDayMutation(chosen ?? '');
  const today = dayInZone(
    new Date(),
    rides.data?.find((r) => r.ride.id === chosen)?.ride.siteTimeZone ?? deviceTimeZone(),
  );
  const valid = /^\d{1,6}$/.test(cycles.trim());
  return (
    <Card style={styles.card}>
      <Text variant="heading">Today&apos;s running log</Text>
      <Text muted>
        The cycles run today, for the ride&apos;s life and to show the days it ran. This part needs a
        connection.
      </Text>
      <View style={styles.rowWrap}>
        {(rides.data ?? []).map(({ ride }) => (
          <Button
            key={ride.id}
            label={ride.name}
            tone={ride.id === chosen ? 'primary' : 'quiet'}
            aria-pressed={ride.id === chosen}
            onPress={() => setRideId(ride.id)}
          />
        ))}
      </View>
      <TextField
        label="Cycles today"
        value={cycles}
        keyboardType="number-pad"
        inputMode="numeric"
        onChangeText={setCycles}
        error={cycles && !valid ? 'A whole number' : undefined}
      />
      <Button
        label="Save today's cycles"
        disabled={!online || !valid || !chosen}
        busy={log.isPending}
        onPress={() =>
          log.mutate(
            { day: today, cycles: Number(cycles) },
            { onSuccess: () => setSaved(`Saved ${cycles} cycles for ${today}.`) },
          )
        }
      />
      {!online ? <Text muted>Offline: enter the cycles when the phone is connected again.</Text> : null}
      {saved ? <Text role="status">{saved}</Text> : null}
      {log.error ? <Text color={colors.danger}>{log.error.message}</Text> : null}
    </Card>
  );
}

const styles = StyleSheet.create({
  body: { gap: space.xl },
  section: { gap: space.md },
  list: { gap: space.md },
  card: { gap: space.sm },
  row: { gap: 2, paddingVertical: space.sm, borderBottomWidth: 1, borderBottomColor: colors.border },
  rowWrap: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
});
