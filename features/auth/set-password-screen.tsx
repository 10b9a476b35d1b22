import { zodResolver } from '@hookform/resolvers/zod';
import { router, useLocalSearchParams } from 'expo-router';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { ScrollView, StyleSheet, View } from 'react-native';
import { z } from 'zod';

import { Spinner } from '@/components/spinner';
import { Button } from '@/components/button';
import { Card } from '@/components/card';
import { FormAlert, type FormProblem } from '@/components/form-alert';
import { applyServerError, fieldsOf } from '@/components/form/server-errors';
import { Logo } from '@/components/logo';
import { Text } from '@/components/text';
import { colors, space } from '@/components/theme';
import { useWide } from '@/components/use-wide';
import { ApiRequestError } from '@/lib/api-errors';
import { formatDateTime } from '@/lib/dates';
import { roleHome, signInHref } from '@/features/auth/hrefs';
import { usePasswordLinkQuery, useSetPasswordMutation } from '@/features/auth/password-api';
import { PasswordField } from '@/features/auth/password-field';
import { passwordMinLength, passwordProblem, type PasswordLinkInfo } from '@/features/auth/password-schema';

/**
 * The page a set-password link opens (`/set-password?token=…`, from an invitation or a reset): who it is
 * for, then a new password; on success this device is signed in as that person and goes to their home.
 */
export function SetPasswordScreen() {
  const wide = useWide();
  const { token } = useLocalSearchParams<{ token?: string }>();
  const link = usePasswordLinkQuery(token ? String(token) : null);
  return (
    <ScrollView style={styles.root} contentContainerStyle={[styles.content, wide && styles.contentWide]}>
      <View style={styles.brand}>
        <Logo size={wide ? 40 : 32} onDark />
      </View>
      <Card style={styles.card}>
        {!token ? (
          <Gone title="No link" text="Open this page from the link in your e-mail." />
        ) : link.isPending ? (
          <Spinner color={colors.accent} label="Checking the link" />
        ) : link.error || !link.data ? (
          <Gone
            title="This link does not work"
            text={
              link.error instanceof ApiRequestError
                ? link.error.message
                : 'The link could not be checked. Try again.'
            }
          />
        ) : link.data.state === 'used' ? (
          <Gone
            title="This link has been used"
            text="Sign in with the password you chose. If you have forgotten it, ask your administrator for a new link."
          />
        ) : link.data.state === 'expired' ? (
          <Gone title="This link has run out" text="Ask your administrator to send a new one." />
        ) : (
          <PasswordForm token={String(token)} info={link.data} />
        )}
      </Card>
    </ScrollView>
  );
}

function Gone({ title, text }: { title: string; text: string }) {
  return (
    <>
      <Text variant="title">{title}</Text>
      <Text>{text}</Text>
      <Button label="Go to sign-in" tone="quiet" onPress={() => router.replace(signInHref())} />
    </>
  );
}

const formSchema = (email: string) =>
  z.object({ password: z.string(), repeat: z.string() }).superRefine((v, ctx) => {
    const problem = passwordProblem(v.password, email);
    if (problem) ctx.addIssue({ code: 'custom', path: ['password'], message: problem });
    else if (v.repeat !== v.password) {
      ctx.addIssue({ code: 'custom', path: ['repeat'], message: 'The two passwords differ' });
    }
  });
type FormValues = z.infer<ReturnType<typeof formSchema>>;

function PasswordForm({ token, info }: { token: string; info: PasswordLinkInfo }) {
  const setPassword = useSetPasswordMutation(token);
  const [problem, setProblem] = useState<FormProblem | null>(null);
  const form = useForm<FormValues>({
    resolver: zodResolver(formSchema(info.email)),
    defaultValues: { password: '', repeat: '' },
  });
  const submit = form.handleSubmit(async (v) => {
    setProblem(null);
    try {
      const user = await setPassword.mutateAsync(v.password);
      router.replace(roleHome[user.role]);
    } catch (err) {
      setProblem(applyServerError(err, form.setError, fieldsOf(['password'])));
    }
  });
  return (
    <>
      <Text variant="title">
        {info.purpose === 'invite' ? 'Welcome to Pivotwatch' : 'Choose a new password'}
      </Text>
      <Text>
        {info.name}, choose the password you will sign in with as <Text variant="heading">{info.email}</Text>.
      </Text>
      <Text variant="small" muted>
        At least {passwordMinLength} characters, not your e-mail address. A few unrelated words make a good
        one. This link works once, until {formatDateTime(info.expiresAt)}.
      </Text>
      <View style={styles.fields}>
        <PasswordField control={form.control} name="password" label="New password" />
        <PasswordField
          control={form.control}
          name="repeat"
          label="New password again"
          onSubmitEditing={() => void submit()}
        />
      </View>
      <FormAlert problem={problem} />
      <Button label="Set password and sign in" onPress={() => void submit()} busy={setPassword.isPending} />
    </>
  );
}

const styles = StyleSheet.create({
  root: { flex: 1, backgroundColor: colors.chrome },
  content: { flexGrow: 1, padding: space.lg, gap: space.lg, justifyContent: 'center' },
  contentWide: { padding: 64 },
  brand: { alignItems: 'center' },
  card: { gap: space.md, maxWidth: 460, width: '100%', alignSelf: 'center', padding: space.xl },
  fields: { gap: space.md },
});
