import { Link, router, useLocalSearchParams } from 'expo-router';
import { StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { Card } from '@/components/card';
import { QueryState } from '@/components/query-state';
import { SubScreen } from '@/components/sub-screen';
import { Text } from '@/components/text';
import { space } from '@/components/theme';
import { RoleGate } from '@/features/auth/ui';
import { useBulletinQuery } from '@/features/bulletins/api';
import { BulletinPdfButton } from '@/features/bulletins/bulletin-pdf-button';
import { BulletinStateMark } from '@/features/bulletins/bulletin-state-mark';
import { type Bulletin, type RideBulletin, bulletinSeverityLabel } from '@/features/bulletins/schema';
import { actionWords, deadlineWords } from '@/features/bulletins/words';
import { bulletinEditHref, bulletinsHref } from '@/features/registry';
import { DeleteAction, Field } from '@/features/registry/ui';
import { rideHref } from '@/features/rides';
import type { SessionUser } from '@/features/session/schema';
import { formatDate } from '@/lib/dates';

/** One bulletin: what the maker asks, its PDF, and where it stands on each ride of its models. */
export function BulletinScreen() {
  const { id } = useLocalSearchParams<{ id?: string | string[] }>();
  const bulletinId = (Array.isArray(id) ? id[0] : id) ?? '';
  return (
    <RoleGate roles={['admin', 'supervisor', 'inspector']}>
      {(user) => <BulletinDetail id={bulletinId} user={user} />}
    </RoleGate>
  );
}

function BulletinDetail({ id, user }: { id: string; user: SessionUser }) {
  const found = useBulletinQuery(id);
  const keeper = user.role === 'admin' || user.role === 'supervisor';
  return (
    <QueryState query={found}>
      {({ bulletin: b, rides }) => (
        <SubScreen
          title={`Bulletin ${b.reference}`}
          subtitle={b.title}
          back={{ href: bulletinsHref, label: 'Bulletins' }}
          actions={
            keeper ? (
              <Button label="Edit" tone="quiet" onPress={() => router.push(bulletinEditHref(b.id))} />
            ) : null
          }
        >
          <BulletinCard b={b} />
          <Card style={styles.card} accessibilityLabel="Rides">
            <Text variant="heading" accessibilityRole="header">
              Rides of these models ({b.doneCount} of {b.rideCount} done)
            </Text>
            {rides.length === 0 ? <Text muted>No ride in the register is of these models.</Text> : null}
            {rides.map((r) => (
              <RideLine key={r.rideId} row={r} />
            ))}
          </Card>
          {keeper ? (
            <DeleteAction
              kind="bulletin"
              id={b.id}
              noun="bulletin"
              name={`Bulletin ${b.reference}`}
              consequence="It leaves the register and no ride’s checklist asks for it. A bulletin recorded done or not done on a ride stays."
              listHref={bulletinsHref}
            />
          ) : null}
        </SubScreen>
      )}
    </QueryState>
  );
}

function BulletinCard({ b }: { b: Bulletin }) {
  return (
    <Card style={styles.card}>
      <View style={styles.fields}>
        <Field label="Maker" value={b.maker} />
        <Field label="Models" value={b.models.join(', ')} />
        <Field label="Issued" value={formatDate(b.issuedOn)} />
        <Field label="How much it matters" value={bulletinSeverityLabel[b.severity]} />
        <Field label="Deadline" value={deadlineWords(b)} />
      </View>
      <Field label="Required action" value={b.requiredAction} />
      {b.notes ? <Field label="Notes" value={b.notes} /> : null}
      {b.documentSha256 ? (
        <BulletinPdfButton sha256={b.documentSha256} reference={b.reference} />
      ) : (
        <Text variant="small" muted>
          No PDF of the maker’s bulletin on file.
        </Text>
      )}
    </Card>
  );
}

function RideLine({ row }: { row: RideBulletin }) {
  const record = row.done ?? row.lastNotDone;
  return (
    <View style={styles.ride}>
      <BulletinStateMark state={row.state} />
      <Link href={rideHref(row.rideId)}>
        <Text style={styles.link}>
          {row.rideName}
          {row.siteName ? ` · ${row.siteName}` : ''}
        </Text>
      </Link>
      {record ? <Text variant="small">{actionWords(record)}</Text> : null}
    </View>
  );
}

const styles = StyleSheet.create({
  card: { gap: space.md },
  fields: { flexDirection: 'row', flexWrap: 'wrap', gap: space.lg },
  ride: { gap: space.xs, paddingVertical: space.xs },
  link: { textDecorationLine: 'underline' },
});
