import { zodResolver } from '@hookform/resolvers/zod';
import { Controller, useForm } from 'react-hook-form';
import { StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { Text } from '@/components/text';
import { TextField } from '@/components/text-field';
import { colors, space } from '@/components/theme';
import { type SignInBody, signInBodySchema } from '@/features/auth/schema';

type Props = { onSubmit: (values: SignInBody) => void; busy?: boolean; error?: string | null };

/** The form only validates and hands values on; the screen owns the mutation and navigation. */
export function SignInForm({ onSubmit, busy, error }: Props) {
  const { control, handleSubmit, formState } = useForm<SignInBody>({
    resolver: zodResolver(signInBodySchema),
    defaultValues: { email: '', password: '' },
  });
  const submit = handleSubmit(onSubmit);
  return (
    <View style={styles.form}>
      <Controller
        control={control}
        name="email"
        render={({ field }) => (
          <TextField
            label="E-mail"
            value={field.value}
            onChangeText={field.onChange}
            onBlur={field.onBlur}
            autoCapitalize="none"
            autoComplete="email"
            keyboardType="email-address"
            inputMode="email"
            textContentType="username"
            error={formState.errors.email?.message}
            onSubmitEditing={submit}
          />
        )}
      />
      <Controller
        control={control}
        name="password"
        render={({ field }) => (
          <TextField
            label="Password"
            value={field.value}
            onChangeText={field.onChange}
            onBlur={field.onBlur}
            secureTextEntry
            autoComplete="current-password"
            textContentType="password"
            error={formState.errors.password?.message}
            onSubmitEditing={submit}
          />
        )}
      />
      {error ? (
        <View style={styles.error} accessibilityRole="alert">
          <Text color={colors.danger}>{error}</Text>
        </View>
      ) : null}
      <Button label="Sign in" onPress={submit} busy={busy} />
    </View>
  );
}

const styles = StyleSheet.create({
  form: { gap: space.lg },
  error: { backgroundColor: colors.overSoft, padding: space.md, borderRadius: 8 },
});
