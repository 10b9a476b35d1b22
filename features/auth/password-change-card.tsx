import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { StyleSheet, View } from 'react-native';
import { z } from 'zod';

import { Button } from '@/components/button';
import { Card } from '@/components/card';
import { FormAlert, type FormProblem } from '@/components/form-alert';
import { applyServerError, fieldsOf } from '@/components/form/server-errors';
import { Text } from '@/components/text';
import { colors, radius, space } from '@/components/theme';
import { usePasswordChangeMutation } from '@/features/auth/password-api';
import { PasswordField } from '@/features/auth/password-field';
import { passwordMinLength, passwordProblem } from '@/features/auth/password-schema';
import type { SessionUser } from '@/features/session/schema';

const formSchema = (email: string) =>
  z
    .object({
      currentPassword: z.string().min(1, 'Enter your current password'),
      newPassword: z.string(),
      repeat: z.string(),
    })
    .superRefine((v, ctx) => {
      const problem = passwordProblem(v.newPassword, email);
      if (problem) ctx.addIssue({ code: 'custom', path: ['newPassword'], message: problem });
      else if (v.repeat !== v.newPassword) {
        ctx.addIssue({ code: 'custom', path: ['repeat'], message: 'The two new passwords differ' });
      }
    });
type FormValues = z.infer<ReturnType<typeof formSchema>>;
const empty: FormValues = { currentPassword: '', newPassword: '', repeat: '' };

/**
 * The signed-in person changes their own password. Every other device they were signed in on is signed
 * out; this one gets a fresh session and stays signed in.
 */
export function PasswordChangeCard({ user }: { user: Pick<SessionUser, 'email'> }) {
  const change = usePasswordChangeMutation();
  const [problem, setProblem] = useState<FormProblem | null>(null);
  const [done, setDone] = useState(false);
  const form = useForm<FormValues>({ resolver: zodResolver(formSchema(user.email)), defaultValues: empty });
  const submit = form.handleSubmit(async (values) => {
    setProblem(null);
    setDone(false);
    try {
      await change.mutateAsync({ currentPassword: values.currentPassword, newPassword: values.newPassword });
      form.reset(empty);
      setDone(true);
    } catch (err) {
      setProblem(applyServerError(err, form.setError, fieldsOf(['currentPassword', 'newPassword'])));
    }
  });
  return (
    <Card>
      <Text variant="heading">Password</Text>
      <Text variant="small" muted>
        At least {passwordMinLength} characters, not your e-mail address. Changing it signs you out on every
        other device.
      </Text>
      <View style={styles.fields}>
        <PasswordField control={form.control} name="currentPassword" label="Current password" current />
        <PasswordField control={form.control} name="newPassword" label="New password" />
        <PasswordField
          control={form.control}
          name="repeat"
          label="New password again"
          onSubmitEditing={() => void submit()}
        />
      </View>
      <FormAlert problem={problem} />
      {done ? (
        <View style={styles.done} role="status">
          <Text color={colors.within}>✓ Password changed. Other devices have been signed out.</Text>
        </View>
      ) : null}
      <Button
        label="Change password"
        onPress={() => void submit()}
        busy={change.isPending}
        style={styles.button}
      />
    </Card>
  );
}

const styles = StyleSheet.create({
  fields: { gap: space.md },
  done: { backgroundColor: colors.withinSoft, padding: space.md, borderRadius: radius.sm },
  button: { alignSelf: 'flex-start' },
});
