import { useLocalSearchParams } from 'expo-router';
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { Card } from '@/components/card';
import { FormAlert, type FormProblem } from '@/components/form-alert';
import { LabelledLine } from '@/components/labelled-line';
import { QueryState } from '@/components/query-state';
import { SubScreen } from '@/components/sub-screen';
import { Text } from '@/components/text';
import { colors, space } from '@/components/theme';
import { ApiRequestError, OfflineError } from '@/lib/api-errors';
import { formatDateTime } from '@/lib/dates';
import { usePeopleQuery, usePersonActionMutation, usePersonQuery } from '@/features/admin/api';
import { AccountStateMark } from '@/features/admin/account-state';
import { peopleHref } from '@/features/admin/hrefs';
import { PersonEditCard } from '@/features/admin/person-edit-card';
import { PhoneKeysCard } from '@/features/admin/phone-keys-card';
import type { Person } from '@/features/admin/schema';
import { roleLabel } from '@/features/auth';
import { RoleGate } from '@/features/auth/ui';

/** One person's account: what it is, its name, role and company, disabling, enabling or a reset, and phone keys. */
export function PersonScreen() {
  const { id } = useLocalSearchParams<{ id: string }>();
  return <RoleGate roles={['admin']}>{() => <PersonPage id={id} />}</RoleGate>;
}

function PersonPage({ id }: { id: string }) {
  const person = usePersonQuery(id);
  const people = usePeopleQuery();
  return (
    <SubScreen
      title={person.data?.name ?? 'Person'}
      subtitle={person.data?.email}
      back={{ href: peopleHref, label: 'People' }}
      badge={person.data ? <AccountStateMark state={person.data.state} /> : undefined}
    >
      <QueryState query={person}>
        {(p) => (
          <>
            <Summary person={p} />
            <Actions person={p} />
            <PersonEditCard key={p.lastChangeAt} person={p} companies={people.data?.companies ?? []} />
            <PhoneKeysCard person={p} />
            <History person={p} />
          </>
        )}
      </QueryState>
    </SubScreen>
  );
}

function Summary({ person: p }: { person: Person }) {
  return (
    <Card>
      <AccountStateMark state={p.state} described />
      <LabelledLine label="Role" value={roleLabel[p.role]} />
      <LabelledLine label="Company" value={p.companyName ?? 'The inspection body'} />
      <LabelledLine label="Account made" value={formatDateTime(p.createdAt)} />
      <LabelledLine label="Last change" value={formatDateTime(p.lastChangeAt)} />
      {p.pendingLink ? (
        <LabelledLine
          label={p.pendingLink.purpose === 'invite' ? 'Invitation' : 'Reset link'}
          value={`sent ${formatDateTime(p.pendingLink.createdAt)}, works until ${formatDateTime(p.pendingLink.expiresAt)}`}
        />
      ) : null}
    </Card>
  );
}

type Action = 'disable' | 'enable' | 'reset';

/** The server's own words (e.g. why the last administrator stays one), or what else went wrong. */
function problemOf(err: unknown): FormProblem {
  if (err instanceof OfflineError)
    return { message: 'No connection to the server. Nothing changed; try again online.' };
  if (err instanceof ApiRequestError) return { message: err.message };
  return { message: 'Something went wrong. Nothing changed; try again.' };
}

const confirmWords: Record<Action, (p: Person) => string> = {
  disable: (p) =>
    `${p.name} will be signed out on every device at once and cannot sign in until enabled again.`,
  enable: (p) => `${p.name} will be able to sign in again with their password.`,
  reset: (p) =>
    p.state === 'invited'
      ? `A new invitation goes to ${p.email}, valid 7 days; the old link stops working.`
      : `${p.name}'s password stops working now, every device is signed out, and a link to choose a new one goes to ${p.email} (valid 24 hours).`,
};

/** Each action asks once more in words before it runs: all of them reach the person at once. */
function Actions({ person: p }: { person: Person }) {
  const act = usePersonActionMutation(p.id);
  const [asking, setAsking] = useState<Action | null>(null);
  const [done, setDone] = useState<string | null>(null);
  const [problem, setProblem] = useState<FormProblem | null>(null);
  const disabled = p.state === 'disabled';
  const run = (action: Action) => {
    setProblem(null);
    act.mutate(action, {
      onSuccess: () => {
        setAsking(null);
        setDone(
          action === 'reset'
            ? `Link sent to ${p.email}.`
            : action === 'disable'
              ? `${p.name} is disabled and signed out.`
              : `${p.name} can sign in again.`,
        );
      },
      onError: (err) => {
        setAsking(null);
        setProblem(problemOf(err));
      },
    });
  };
  const label: Record<Action, string> = {
    disable: 'Disable account',
    enable: 'Enable account',
    reset: p.state === 'invited' ? 'Send invitation again' : 'Send reset link',
  };
  return (
    <Card>
      <Text variant="heading">Access</Text>
      {asking ? (
        <View style={styles.ask} role="alert">
          <Text>{confirmWords[asking](p)}</Text>
          <View style={styles.buttons}>
            <Button
              label={`Yes, ${label[asking].toLowerCase()}`}
              tone={asking === 'disable' || asking === 'reset' ? 'danger' : 'primary'}
              busy={act.isPending}
              onPress={() => run(asking)}
            />
            <Button label="Cancel" tone="quiet" onPress={() => setAsking(null)} />
          </View>
        </View>
      ) : (
        <View style={styles.buttons}>
          {disabled ? null : <Button label={label.reset} tone="quiet" onPress={() => setAsking('reset')} />}
          <Button
            label={disabled ? label.enable : label.disable}
            tone={disabled ? 'primary' : 'quiet'}
            onPress={() => setAsking(disabled ? 'enable' : 'disable')}
          />
        </View>
      )}
      <FormAlert problem={problem} />
      {done ? (
        <Text color={colors.within} role="status">
          ✓ {done}
        </Text>
      ) : null}
    </Card>
  );
}

function History({ person: p }: { person: Person }) {
  return (
    <Card>
      <Text variant="heading">Changes to this account</Text>
      {p.history.length === 0 ? <Text muted>None recorded.</Text> : null}
      {p.history.map((h, i) => (
        <View key={`${h.at}-${i}`} style={styles.entry}>
          <Text variant="small" muted>
            {formatDateTime(h.at)}
            {h.by ? ` · ${h.by}` : ''}
          </Text>
          <Text>{h.summary}</Text>
        </View>
      ))}
    </Card>
  );
}

const styles = StyleSheet.create({
  ask: { gap: space.md },
  buttons: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  entry: { gap: 2, paddingVertical: space.xs, borderTopWidth: 1, borderTopColor: colors.border },
});
