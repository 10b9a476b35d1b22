import { useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { Card } from '@/components/card';
import { QueryState } from '@/components/query-state';
import { Text } from '@/components/text';
import { TextField } from '@/components/text-field';
import { colors, space } from '@/components/theme';
import { useSubmitDailyCheckMutation } from '@/features/daily-checks/api';
import { dailyCheckFailed, dailyCheckProblems, setTestRun } from '@/features/daily-checks/device';
import { useFieldDeclarationQuery } from '@/features/instruments/ui';
import { DEFAULT_DECLARATION_TEXT } from '@/features/instruments/schema';
import {
  ChecklistSection,
  useDraftEditor,
  useDraftQuery,
  useFieldRideQuery,
} from '@/features/inspections/ui';
import { type Draft, answerItem, setNotes } from '@/features/records';
import { useUnitSystem } from '@/features/settings';
import type { SessionUser } from '@/features/session/schema';

/** One daily check being filled in: the class's daily checklist, the test run, notes, and Send. */
export function DailyCheckForm({
  draftId,
  user,
  onDone,
}: {
  draftId: string;
  user: SessionUser;
  onDone: (sent: boolean) => void;
}) {
  const draft = useDraftQuery(draftId);
  return (
    <QueryState query={draft}>
      {(d) =>
        d ? (
          <Form draft={d} user={user} onDone={onDone} />
        ) : (
          <Text>This daily check is no longer on the phone.</Text>
        )
      }
    </QueryState>
  );
}

function Form({ draft, user, onDone }: { draft: Draft; user: SessionUser; onDone: (sent: boolean) => void }) {
  const editor = useDraftEditor(draft.id);
  const ride = useFieldRideQuery(draft.rideId, null, draft.templateId);
  const [system] = useUnitSystem();
  const declaration = useFieldDeclarationQuery();
  const submit = useSubmitDailyCheckMutation();
  const [tried, setTried] = useState(false);
  const now = () => new Date();
  const run = draft.testRuns?.[0] ?? null;
  const [cycles, setCycles] = useState(run ? String(run.cycles) : '');
  const template = ride.data?.template ?? null;
  const problems = dailyCheckProblems(draft, template);
  const failed = dailyCheckFailed(draft);

  const putRun = (text: string, result: 'pass' | 'fail' | null) => {
    setCycles(text);
    const n = Number(text);
    const valid = /^\d{1,4}$/.test(text.trim()) && n <= 1000;
    editor.update((d) =>
      setTestRun(
        d,
        valid && result ? { cycles: n, result, ...(run?.note ? { note: run.note } : {}) } : null,
        now(),
      ),
    );
  };
  const cyclesValid = /^\d{1,4}$/.test(cycles.trim()) && Number(cycles) <= 1000;

  const send = async () => {
    setTried(true);
    if (problems.length) return;
    const at = now().toISOString();
    await submit.mutateAsync({
      draft,
      template,
      declaration: {
        text: declaration.data?.text ?? DEFAULT_DECLARATION_TEXT,
        declaredAt: at,
        declaredBy: user.id,
        declaredByName: user.name,
      },
    });
    onDone(true);
  };

  return (
    <View style={styles.form}>
      <Text variant="heading">Daily check · {draft.rideName}</Text>
      <Text muted>
        Kept on this phone as you go; sent when you press Send and the phone has a connection.
      </Text>
      <ChecklistSection
        draft={draft}
        template={template}
        system={system}
        onAnswer={(itemId, patch) => editor.update((d) => answerItem(d, itemId, patch, now()))}
        onDraft={editor.update}
      />
      <Card style={styles.card}>
        <Text variant="heading">Test run</Text>
        <TextField
          label="Empty cycles run"
          value={cycles}
          keyboardType="number-pad"
          inputMode="numeric"
          onChangeText={(t) => putRun(t, run?.result ?? null)}
          error={cycles && !cyclesValid ? 'A whole number from 0 to 1000' : undefined}
        />
        <View style={styles.row} role="radiogroup" accessibilityLabel="Test run result">
          {(['pass', 'fail'] as const).map((r) => (
            <Button
              key={r}
              label={r === 'pass' ? 'Ran as it should' : 'Did not run as it should'}
              tone={run?.result === r ? (r === 'pass' ? 'accent' : 'danger') : 'quiet'}
              role="radio"
              aria-checked={run?.result === r}
              disabled={!cyclesValid}
              onPress={() => putRun(cycles, r)}
            />
          ))}
        </View>
      </Card>
      <TextField
        label="Notes"
        value={draft.notes}
        multiline
        onChangeText={(t) => editor.update((d) => setNotes(d, t, now()))}
      />
      {failed ? (
        <View style={styles.stop} role="alert">
          <Text color={colors.danger} variant="heading">
            Do not open {draft.rideName}
          </Text>
          <Text>
            An item or the test run failed. Send this check: the inspection body sees it. Open only after a
            later daily check passes.
          </Text>
        </View>
      ) : null}
      {tried && problems.length ? (
        <View role="alert">
          {problems.map((p) => (
            <Text key={p} color={colors.danger}>
              {p}
            </Text>
          ))}
        </View>
      ) : null}
      {submit.error ? <Text color={colors.danger}>{submit.error.message}</Text> : null}
      <View style={styles.row}>
        <Button label="Send daily check" tone="accent" busy={submit.isPending} onPress={() => void send()} />
        <Button label="Back to my rides" tone="quiet" onPress={() => onDone(false)} />
      </View>
      {editor.saving ? <Text muted>Saving on this phone…</Text> : <Text muted>Saved on this phone.</Text>}
    </View>
  );
}

const styles = StyleSheet.create({
  form: { gap: space.lg },
  card: { gap: space.md },
  row: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  stop: { gap: space.xs, padding: space.md, borderWidth: 2, borderColor: colors.danger, borderRadius: 8 },
});
