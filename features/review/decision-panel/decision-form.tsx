import { zodResolver } from '@hookform/resolvers/zod';
import { useEffect, useRef, useState } from 'react';
import { type Control, Controller, useForm } from 'react-hook-form';
import { StyleSheet, View } from 'react-native';
import type { z } from 'zod';

import { Button } from '@/components/button';
import { FormAlert, type FormProblem } from '@/components/form-alert';
import { applyServerError, fieldsOf } from '@/components/form/server-errors';
import type { RideStatus } from '@/components/status-mark';
import { Text } from '@/components/text';
import { colors, radius, space } from '@/components/theme';
import { TextField } from '@/components/text-field';
import { type ListedFinding, useDecide } from '@/features/review/decision-api';
import { approvalConcerns, approvalWarning } from '@/features/review/decision-panel/approval-concerns';
import { ApprovalWarning } from '@/features/review/decision-panel/approval-warning';
import { type StatusChoice, StatusChoiceField } from '@/features/review/decision-panel/status-choice';
import { sharedStyles } from '@/features/review/decision-panel/styles';
import { type DecisionInput, decisionInputSchema } from '@/features/review/schema';
import { ApiRequestError } from '@/lib/api-errors';

type DecisionValues = z.output<typeof decisionInputSchema>;

/**
 * A decision started from the keyboard (a or r on the inspection): it only brings the form forward, the
 * approval's button or the return's comment focused; the decision is still made with the button, through
 * the same checks (warnings, the status reason, the return's comment). `seq` tells a second press apart.
 */
export type KeyIntent = { kind: 'approve' | 'return'; seq: number };

export function DecisionForm({
  decide,
  problem,
  setProblem,
  note,
  onNoteChange,
  rideName,
  rideStatus,
  findings,
  envelope,
  approvalRefusal,
  keyIntent = null,
}: {
  decide: ReturnType<typeof useDecide>;
  problem: FormProblem | null;
  setProblem: (problem: FormProblem | null) => void;
  note: string;
  onNoteChange: (note: string) => void;
  rideName: string;
  rideStatus: RideStatus;
  findings: readonly ListedFinding[];
  envelope: readonly { id: string; label: string; status: 'within' | 'near' | 'over' }[];
  /** The server's reason this person may not approve (their own inspection), or null. */
  approvalRefusal: string | null;
  keyIntent?: KeyIntent | null;
}) {
  const [warning, setWarning] = useState<'hard' | 'soft' | null>(null);
  const [choice, setChoice] = useState<StatusChoice>('keep');
  const [reason, setReason] = useState('');
  const [reasonError, setReasonError] = useState<string | undefined>();
  const { control, handleSubmit, setValue, setError, clearErrors, setFocus } = useForm<
    DecisionInput,
    unknown,
    DecisionValues
  >({ resolver: zodResolver(decisionInputSchema), defaultValues: { decision: 'approve', note } });
  const approveButton = useRef<View>(null);
  const [dismissed, setDismissed] = useState(-1);
  const keyed = keyIntent && keyIntent.seq !== dismissed ? keyIntent.kind : null;
  useEffect(() => {
    if (!keyIntent) return;
    // Focus brings the step into view; nothing is decided here.
    if (keyIntent.kind === 'return') setFocus('note');
    else (approveButton.current as unknown as { focus?: () => void } | null)?.focus?.();
  }, [keyIntent, setFocus]);

  const concerns = approvalConcerns(findings, envelope);
  const after: RideStatus = choice === 'keep' ? rideStatus : choice;

  const send = handleSubmit(async (values) => {
    setProblem(null);
    const body: DecisionInput = {
      decision: values.decision,
      ...(values.note ? { note: values.note } : {}),
      ...(choice !== 'keep' ? { rideStatus: { status: choice, reason: reason.trim() } } : {}),
    };
    try {
      await decide.mutateAsync(body);
      onNoteChange('');
    } catch (err) {
      const p = applyServerError(err, setError, fieldsOf(['note']));
      setProblem(
        err instanceof ApiRequestError && err.status === 409
          ? {
              ...p,
              message: `${p.message} The inspection has been reloaded to show the decision that stands.`,
            }
          : p,
      );
    }
  });

  const reasonOk = () => {
    if (choice !== 'keep' && reason.trim() === '') {
      setReasonError('Say why; the operator reads it with the status.');
      return false;
    }
    return true;
  };

  const approve = (confirmed: boolean) => {
    clearErrors();
    setValue('decision', 'approve');
    const stop = approvalWarning(concerns, after, confirmed);
    if (stop) {
      setWarning(stop);
      return;
    }
    if (!reasonOk()) return;
    setWarning(null);
    void send();
  };
  const giveBack = () => {
    clearErrors();
    setWarning(null);
    setValue('decision', 'return');
    if (!reasonOk()) return;
    void send();
  };

  return (
    <View style={sharedStyles.section}>
      <NoteField control={control} onNoteChange={onNoteChange} />
      <StatusChoiceField
        rideStatus={rideStatus}
        choice={choice}
        onChoose={(c) => {
          setChoice(c);
          setWarning(null);
          setReasonError(undefined);
        }}
        reason={reason}
        onReasonChange={(t) => {
          setReason(t);
          setReasonError(undefined);
        }}
        reasonError={reasonError}
      />
      {warning ? (
        <ApprovalWarning
          warning={warning}
          concerns={concerns}
          rideName={rideName}
          after={after}
          onStop={() => {
            setWarning(null);
            setChoice('out_of_service');
          }}
          onApproveAnyway={() => approve(true)}
        />
      ) : null}
      <FormAlert problem={problem} />
      {approvalRefusal ? <Text testID="approval-refusal">{approvalRefusal}</Text> : null}
      {keyed ? (
        <KeyedStep
          kind={keyed}
          refused={!!approvalRefusal}
          onCancel={() => setDismissed(keyIntent?.seq ?? -1)}
        />
      ) : null}
      <DecisionButtons
        approveRef={approveButton}
        decide={decide}
        onApprove={approvalRefusal ? null : () => approve(false)}
        onReturn={giveBack}
      />
    </View>
  );
}

/** The comment kept with the decision; needed to return the inspection. */
function NoteField({
  control,
  onNoteChange,
}: {
  control: Control<DecisionInput, unknown, DecisionValues>;
  onNoteChange: (note: string) => void;
}) {
  return (
    <Controller
      control={control}
      name="note"
      render={({ field, fieldState }) => (
        <TextField
          ref={field.ref}
          label="Comment"
          hint="Needed to return the inspection: tell the inspector what to correct. Optional when approving; it is kept with the approval."
          value={field.value ?? ''}
          onChangeText={(t) => {
            field.onChange(t);
            onNoteChange(t);
          }}
          onBlur={field.onBlur}
          error={fieldState.error?.message}
          multiline
          numberOfLines={3}
          style={styles.note}
        />
      )}
    />
  );
}

/** What a decision started from the keyboard still needs: said in words, with a way out. */
function KeyedStep({
  kind,
  refused,
  onCancel,
}: {
  kind: 'approve' | 'return';
  refused: boolean;
  onCancel: () => void;
}) {
  const words =
    kind === 'return'
      ? 'Returning: write in the comment what the inspector should correct, then press “Return to inspector”.'
      : refused
        ? 'You may not approve this inspection (see above); it can only be returned or left for another supervisor.'
        : 'Approving: check the comment and the ride status, then press “Approve inspection” (Enter while it has the focus). Nothing is approved until you do.';
  return (
    <View style={styles.keyed} role="status" accessibilityLabel="Decision started from the keyboard">
      <Text variant="small" style={styles.keyedWords}>
        {words}
      </Text>
      <Button label="Cancel" tone="quiet" onPress={onCancel} />
    </View>
  );
}

function DecisionButtons({
  approveRef,
  decide,
  onApprove,
  onReturn,
}: {
  approveRef: React.Ref<View>;
  decide: ReturnType<typeof useDecide>;
  /** Null when this person may not approve: the button is not offered at all. */
  onApprove: (() => void) | null;
  onReturn: () => void;
}) {
  return (
    <View style={sharedStyles.buttons}>
      {onApprove ? (
        <Button
          ref={approveRef}
          label="Approve inspection"
          tone="accent"
          busy={decide.isPending && decide.variables?.decision === 'approve'}
          disabled={decide.isPending}
          onPress={onApprove}
        />
      ) : null}
      <Button
        label="Return to inspector"
        tone="quiet"
        busy={decide.isPending && decide.variables?.decision === 'return'}
        disabled={decide.isPending}
        onPress={onReturn}
      />
    </View>
  );
}

const styles = StyleSheet.create({
  note: { minHeight: 72, textAlignVertical: 'top' },
  keyed: {
    flexDirection: 'row',
    alignItems: 'center',
    flexWrap: 'wrap',
    gap: space.md,
    padding: space.md,
    borderRadius: radius.md,
    borderLeftWidth: 4,
    borderLeftColor: colors.focus,
    backgroundColor: colors.infoSoft,
  },
  keyedWords: { flex: 1, minWidth: 200 },
});
