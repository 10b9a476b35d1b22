import { useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { Card } from '@/components/card';
import { DateField } from '@/components/date-field';
import { FormAlert, type FormProblem } from '@/components/form-alert';
import { Text } from '@/components/text';
import { TextField } from '@/components/text-field';
import { colors, space } from '@/components/theme';
import { useBulletinDoneMutation, useRideBulletinsQuery } from '@/features/bulletins/api';
import { BulletinPdfButton } from '@/features/bulletins/bulletin-pdf-button';
import { BulletinStateMark } from '@/features/bulletins/bulletin-state-mark';
import {
  type RideBulletin,
  bulletinDoneInputSchema,
  bulletinSeverityLabel,
} from '@/features/bulletins/schema';
import { actionWords, deadlineWords } from '@/features/bulletins/words';
import type { Role } from '@/features/session/schema';
import { ApiRequestError } from '@/lib/api-errors';
import { localDay } from '@/lib/dates';

/**
 * The makers' bulletins for one ride and whether each is done, overdue first. Everyone who may see the
 * ride sees them (the operator their own rides'); a supervisor or admin may record one done with what
 * they saw. Inspectors record them through the inspection's checklist.
 */
export function RideBulletinsCard({
  rideId,
  role,
  timeZone,
}: {
  rideId: string;
  role: Role;
  /** The ride's zone: "today" for the done date is the ride's day. */
  timeZone?: string | null;
}) {
  const list = useRideBulletinsQuery(rideId);
  const rows = list.data ?? [];
  return (
    <Card accessibilityLabel="Makers’ bulletins" style={styles.card}>
      <Text variant="heading" accessibilityRole="header">
        Makers’ bulletins
      </Text>
      {list.isPending ? <Text muted>Loading bulletins…</Text> : null}
      {list.error ? <Text muted>The bulletins could not be loaded.</Text> : null}
      {list.data && rows.length === 0 ? (
        <Text muted>No bulletin in the register is for this ride’s maker and model.</Text>
      ) : null}
      {rows.map((r, i) => (
        <BulletinRow
          key={r.bulletin.id}
          first={i === 0}
          row={r}
          canRecord={role === 'admin' || role === 'supervisor'}
          timeZone={timeZone}
        />
      ))}
    </Card>
  );
}

function BulletinRow({
  row,
  first,
  canRecord,
  timeZone,
}: {
  row: RideBulletin;
  first: boolean;
  canRecord: boolean;
  timeZone?: string | null;
}) {
  const b = row.bulletin;
  const [recording, setRecording] = useState(false);
  return (
    <View style={[styles.row, !first && styles.rule]} testID={`ride-bulletin-${b.reference}`}>
      <BulletinStateMark state={row.state} />
      <Text variant="heading">
        {b.reference} · {b.title}
      </Text>
      <Text variant="small" muted>
        {bulletinSeverityLabel[b.severity]} · {deadlineWords(b)}
      </Text>
      <Text>{b.requiredAction}</Text>
      {row.done ? <Text variant="small">{actionWords(row.done)}</Text> : null}
      {row.lastNotDone ? (
        <Text variant="small" color={colors.over}>
          {actionWords(row.lastNotDone)}
        </Text>
      ) : null}
      {b.documentSha256 ? <BulletinPdfButton sha256={b.documentSha256} reference={b.reference} /> : null}
      {canRecord && !row.done ? (
        recording ? (
          <RecordDone row={row} timeZone={timeZone} onClose={() => setRecording(false)} />
        ) : (
          <Button
            tone="quiet"
            label="Record as done"
            onPress={() => setRecording(true)}
            style={styles.start}
          />
        )
      ) : null}
    </View>
  );
}

function RecordDone({
  row,
  timeZone,
  onClose,
}: {
  row: RideBulletin;
  timeZone?: string | null;
  onClose: () => void;
}) {
  const today = localDay(new Date(), timeZone);
  const [on, setOn] = useState<string | null>(today);
  const [note, setNote] = useState('');
  const [errors, setErrors] = useState<{ on?: string; note?: string }>({});
  const [problem, setProblem] = useState<FormProblem | null>(null);
  const done = useBulletinDoneMutation(row.rideId, row.bulletin.id);
  const save = async () => {
    setProblem(null);
    const parsed = bulletinDoneInputSchema.safeParse({ on: on ?? '', note });
    if (!parsed.success) {
      const found: { on?: string; note?: string } = {};
      for (const i of parsed.error.issues) found[i.path[0] === 'on' ? 'on' : 'note'] = i.message;
      setErrors(found);
      return;
    }
    setErrors({});
    try {
      await done.mutateAsync(parsed.data);
      onClose();
    } catch (err) {
      setProblem({
        message: err instanceof ApiRequestError ? err.message : 'Nothing was saved; try again.',
      });
    }
  };
  return (
    <View style={styles.form}>
      <DateField label="Done on" value={on} onChange={setOn} max={today} error={errors.on} />
      <TextField
        label="What you saw"
        hint="How the required action was verified: parts, marks, records."
        value={note}
        onChangeText={setNote}
        multiline
        error={errors.note}
      />
      <FormAlert problem={problem} />
      <View style={styles.buttons}>
        <Button label="Record as done" onPress={save} busy={done.isPending} />
        <Button label="Cancel" tone="quiet" onPress={onClose} />
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  card: { gap: space.lg },
  row: { gap: space.xs },
  // Rows apart by a line as well as space, so each bulletin reads as one block on a phone.
  rule: { borderTopWidth: 1, borderTopColor: colors.border, paddingTop: space.lg },
  form: { gap: space.md, paddingTop: space.sm },
  buttons: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  start: { alignSelf: 'flex-start' },
});
