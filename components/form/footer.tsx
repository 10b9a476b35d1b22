import { useState } from 'react';
import type { FieldValues, UseFormReturn } from 'react-hook-form';
import { StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { FormAlert, type FormProblem } from '@/components/form-alert';
import { space } from '@/components/theme';
import { type FieldFor, applyServerError } from '@/components/form/server-errors';

type ServerSubmit = {
  /** The press handler; takes the press event as react-hook-form's handleSubmit does. */
  submit: (e?: React.BaseSyntheticEvent) => Promise<unknown>;
  problem: FormProblem | null;
  busy: boolean;
};

/**
 * A register form's submit: validate, hand the values on (the screen saves them), and when the server
 * refuses, put each problem next to its field and keep the rest for the footer to show.
 */
export function useServerSubmit<T extends FieldValues, TOut>(
  form: Pick<UseFormReturn<T, unknown, TOut>, 'handleSubmit' | 'setError' | 'formState'>,
  onSubmit: (values: TOut) => Promise<unknown>,
  fieldFor: FieldFor,
  labels?: Record<string, string>,
): ServerSubmit {
  const [problem, setProblem] = useState<FormProblem | null>(null);
  const submit = form.handleSubmit(async (values) => {
    setProblem(null);
    try {
      await onSubmit(values);
    } catch (err) {
      setProblem(applyServerError(err, form.setError, fieldFor, labels));
    }
  });
  return { submit, problem, busy: form.formState.isSubmitting };
}

/** What went wrong with the last save, then the submit button and (when the screen offers it) Cancel. */
export function FormFooter({
  save,
  submitLabel,
  tone,
  onCancel,
}: {
  save: ServerSubmit;
  submitLabel: string;
  tone?: 'primary' | 'accent';
  onCancel?: () => void;
}) {
  return (
    <>
      <FormAlert problem={save.problem} />
      <View style={styles.buttons}>
        <Button label={submitLabel} tone={tone} onPress={save.submit} busy={save.busy} />
        {onCancel ? <Button label="Cancel" tone="quiet" onPress={onCancel} /> : null}
      </View>
    </>
  );
}

const styles = StyleSheet.create({
  buttons: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
});
