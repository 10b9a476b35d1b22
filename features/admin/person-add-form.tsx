import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm, useWatch } from 'react-hook-form';
import { StyleSheet, View } from 'react-native';
import { z } from 'zod';

import { Card } from '@/components/card';
import { FormChoice, FormSelect } from '@/components/form/choices';
import { FormText } from '@/components/form/fields';
import { FormFooter, useServerSubmit } from '@/components/form/footer';
import { fieldsOf } from '@/components/form/server-errors';
import { Segmented } from '@/components/segmented';
import { Text } from '@/components/text';
import { colors, radius, space } from '@/components/theme';
import { useCreatePersonMutation } from '@/features/admin/api';
import { createPersonBodySchema, type CompanyChoice } from '@/features/admin/schema';
import { roleLabel } from '@/features/auth';
import { passwordMinLength } from '@/features/auth/password-schema';
import { PasswordField } from '@/features/auth/ui';
import { roles } from '@/features/session/schema';

const formSchema = z.object({
  name: z.string(),
  email: z.string(),
  role: z.enum(roles),
  companyId: z.string(),
  password: z.string(),
  how: z.enum(['invite', 'password']),
});
type FormValues = z.infer<typeof formSchema>;
const empty: FormValues = {
  name: '',
  email: '',
  role: 'inspector',
  companyId: '',
  password: '',
  how: 'invite',
};

/** What the API takes: no company for staff, and a password only when the administrator sets one. */
const bodyOf = (v: FormValues) => ({
  name: v.name,
  email: v.email,
  role: v.role,
  companyId: v.role === 'operator' && v.companyId ? v.companyId : null,
  ...(v.how === 'password' ? { password: v.password } : {}),
});

// The API's own schema judges the values, so the form and the server give the same messages.
const checked = formSchema.superRefine((v, ctx) => {
  const parsed = createPersonBodySchema.safeParse(bodyOf(v));
  if (!parsed.success) {
    for (const issue of parsed.error.issues) {
      ctx.addIssue({ code: 'custom', path: issue.path.map(String), message: issue.message });
    }
  }
});

/**
 * Adds a person: by invitation (an e-mail with a link to choose a password, valid 7 days) or with a
 * password the administrator sets and passes on.
 */
export function PersonAddForm({ companies, onDone }: { companies: CompanyChoice[]; onDone: () => void }) {
  const [sent, setSent] = useState<string | null>(null);
  const create = useCreatePersonMutation();
  const form = useForm<FormValues>({ resolver: zodResolver(checked), defaultValues: empty });
  const role = useWatch({ control: form.control, name: 'role' });
  const how = useWatch({ control: form.control, name: 'how' });
  const save = useServerSubmit(
    form,
    async (values) => {
      const res = await create.mutateAsync(bodyOf(values));
      setSent(
        res.invited
          ? `Invitation sent to ${res.user.email}. The link works once, for 7 days.`
          : `${res.user.name} can sign in now with the password you set.`,
      );
      form.reset(empty);
    },
    fieldsOf(['name', 'email', 'role', 'companyId', 'password']),
  );
  return (
    <Card>
      <Text variant="heading">Add a person</Text>
      <Segmented<FormValues['how']>
        label="How they get a password"
        value={how}
        onChange={(v) => form.setValue('how', v)}
        options={[
          { value: 'invite', label: 'Send an invitation' },
          { value: 'password', label: 'Set a password' },
        ]}
      />
      <View style={styles.fields}>
        <FormText control={form.control} name="name" label="Name" autoCapitalize="words" />
        <FormText
          control={form.control}
          name="email"
          label="E-mail"
          autoCapitalize="none"
          inputMode="email"
        />
        <FormChoice
          control={form.control}
          name="role"
          label="Role"
          options={roles.map((r) => ({ value: r, label: roleLabel[r] }))}
        />
        {role === 'operator' ? (
          <FormSelect
            control={form.control}
            name="companyId"
            label="Operator company"
            placeholder="Choose the company they work for"
            options={companies.map((c) => ({ value: c.id, label: c.name }))}
          />
        ) : null}
        {how === 'password' ? (
          <PasswordField
            control={form.control}
            name="password"
            label="Password"
            hint={`At least ${passwordMinLength} characters, not the e-mail address. Pass it on in person.`}
          />
        ) : (
          <Text variant="small" muted>
            They get an e-mail with a link to choose their own password. Until then they cannot sign in.
          </Text>
        )}
      </View>
      {sent ? (
        <View style={styles.sent} role="status">
          <Text color={colors.within}>✓ {sent}</Text>
        </View>
      ) : null}
      <FormFooter
        save={save}
        submitLabel={how === 'invite' ? 'Send invitation' : 'Create account'}
        onCancel={onDone}
      />
    </Card>
  );
}

const styles = StyleSheet.create({
  fields: { gap: space.md },
  sent: { backgroundColor: colors.withinSoft, padding: space.md, borderRadius: radius.sm },
});
