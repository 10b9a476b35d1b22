import { useLocalSearchParams } from 'expo-router';
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { Card } from '@/components/card';
import { Caution } from '@/components/caution';
import { FormAlert, type FormProblem } from '@/components/form-alert';
import { QueryState } from '@/components/query-state';
import { SubScreen } from '@/components/sub-screen';
import { Text } from '@/components/text';
import { TextField } from '@/components/text-field';
import { colors, radius, space } from '@/components/theme';
import { RoleGate } from '@/features/auth/ui';
import { useIncident, useReviewIncident } from '@/features/incidents/api';
import { IncidentFlags } from '@/features/incidents/incident-row';
import {
  incidentKindVocabulary,
  incidentReviewInputSchema,
  type Incident,
} from '@/features/incidents/schema';
import { NoticePhotos, problemText } from '@/features/notices/ui';
import { rideIncidentsHref } from '@/features/rides';
import type { SessionUser } from '@/features/session/schema';
import { ApiRequestError } from '@/lib/api-errors';
import { formatDateTime, formatWhen } from '@/lib/dates';

/**
 * `/incidents/:id`: one incident report as sent, with its photos; a supervisor or administrator marks it
 * reviewed with a note, which takes it off the review queue. Times are on the site's clock (with the zone
 * named, as the reader may be elsewhere).
 */
export function IncidentScreen() {
  const { id } = useLocalSearchParams<{ id: string }>();
  const incidentId = Array.isArray(id) ? (id[0] ?? '') : (id ?? '');
  return (
    <RoleGate roles={['admin', 'supervisor', 'inspector', 'operator']}>
      {(user) => <IncidentPage id={incidentId} user={user} />}
    </RoleGate>
  );
}

function IncidentPage({ id, user }: { id: string; user: SessionUser }) {
  const incident = useIncident(id);
  const i = incident.data;
  if (incident.error instanceof ApiRequestError && incident.error.status === 404)
    return (
      <SubScreen title="Incident report not found">
        <Card role="alert">
          <Text muted>There is no such report, or it is not on one of your rides.</Text>
        </Card>
      </SubScreen>
    );
  return (
    <SubScreen
      title={i ? incidentKindVocabulary[i.kind].label : 'Incident report'}
      subtitle={i ? `${i.rideName} · ${formatDateTime(i.occurredAt, i.timeZone)}` : undefined}
      back={i ? { href: rideIncidentsHref(i.rideId), label: 'Incident reports' } : undefined}
    >
      <QueryState query={incident}>
        {(data) => (
          <IncidentBody
            incident={data}
            reviewer={user.role === 'supervisor' || user.role === 'admin'}
            staff={user.role !== 'operator'}
          />
        )}
      </QueryState>
    </SubScreen>
  );
}

function IncidentBody({
  incident: i,
  reviewer,
  staff,
}: {
  incident: Incident;
  reviewer: boolean;
  staff: boolean;
}) {
  const when = (at: string | null) => (at ? formatWhen(at, i.timeZone) : 'Not given');
  return (
    <View style={styles.column}>
      {i.stoppedRide ? (
        <View style={styles.stopped} role="note">
          <Text variant="heading" color={colors.over}>
            This report took the ride out of service
          </Text>
          <Text variant="small">
            A follow-up inspection was asked for. The ride returns to service only after that inspection is
            approved, or by a supervisor’s decision.
          </Text>
        </View>
      ) : null}
      <Card accessibilityLabel="What was reported">
        <IncidentFlags incident={i} />
        <Fact label="When it happened" value={when(i.occurredAt)} />
        <Text variant="label" muted>
          WHAT HAPPENED
        </Text>
        <Text selectable>{i.what}</Text>
        <Fact label="Riders affected" value={String(i.ridersAffected)} />
        <Fact label="Anyone hurt" value={i.anyoneHurt ? 'Yes' : 'No'} />
        {i.stoppedAt || i.runningAgainAt ? (
          <>
            <Fact label="Stopped at" value={when(i.stoppedAt)} />
            <Fact label="Back running at" value={when(i.runningAgainAt)} />
          </>
        ) : null}
        <Fact label="Reported by" value={`${i.reportedByName}, ${formatWhen(i.reportedAt, i.timeZone)}`} />
      </Card>
      {i.photoShas.length > 0 ? (
        <Card>
          <Text variant="heading">Photos ({i.photoShas.length})</Text>
          <NoticePhotos
            label="Photos of the incident"
            photos={i.photoShas.map((sha256, n) => ({
              sha256,
              caption: `Photo ${n + 1} of the incident report`,
            }))}
          />
        </Card>
      ) : null}
      <ReviewCard incident={i} reviewer={reviewer} />
      {staff ? <Caution /> : null}
    </View>
  );
}

function Fact({ label, value }: { label: string; value: string }) {
  return (
    <View style={styles.fact}>
      <Text variant="label" muted>
        {label.toUpperCase()}
      </Text>
      <Text>{value}</Text>
    </View>
  );
}

function ReviewCard({ incident: i, reviewer }: { incident: Incident; reviewer: boolean }) {
  const review = useReviewIncident(i.id);
  const [note, setNote] = useState('');
  const [error, setError] = useState<string | undefined>();
  const [problem, setProblem] = useState<FormProblem | null>(null);
  if (i.reviewedAt)
    return (
      <Card accessibilityLabel="Review">
        <Text variant="heading">Reviewed</Text>
        <Text variant="small" muted>
          {`${i.reviewedByName ?? 'The inspection body'}, ${formatWhen(i.reviewedAt, i.timeZone)}`}
        </Text>
        <Text selectable>{i.reviewNote}</Text>
      </Card>
    );
  if (!reviewer)
    return (
      <Card accessibilityLabel="Review">
        <Text variant="heading">Awaiting review</Text>
        <Text variant="small" muted>
          The inspection body has the report on its review desk.
        </Text>
      </Card>
    );
  const submit = async () => {
    setProblem(null);
    const checked = incidentReviewInputSchema.safeParse({ note });
    if (!checked.success) {
      setError(checked.error.issues[0]?.message);
      return;
    }
    setError(undefined);
    try {
      await review.mutateAsync(checked.data.note);
    } catch (err) {
      if (err instanceof ApiRequestError && err.issues.some((x) => x.path === 'note'))
        setError(err.issues.find((x) => x.path === 'note')?.message);
      else setProblem({ message: problemText(err) });
    }
  };
  return (
    <Card accessibilityLabel="Review">
      <Text variant="heading">Review</Text>
      <TextField
        label="Review note"
        value={note}
        onChangeText={(t) => {
          setNote(t);
          if (error) setError(undefined);
        }}
        multiline
        error={error}
        hint="What was checked or decided: an inspection booked, the operator asked for more, nothing further."
      />
      <FormAlert problem={problem} />
      <Button label="Mark reviewed" tone="accent" onPress={submit} busy={review.isPending} />
    </Card>
  );
}

const styles = StyleSheet.create({
  column: { gap: space.lg },
  fact: { gap: 2 },
  stopped: {
    gap: space.xs,
    padding: space.md,
    borderRadius: radius.sm,
    borderLeftWidth: 4,
    borderLeftColor: colors.over,
    backgroundColor: colors.overSoft,
  },
});
