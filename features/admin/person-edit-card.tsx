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
import { Text } from '@/components/text';
import { colors, space } from '@/components/theme';
import { useUpdatePersonMutation } from '@/features/admin/api';
import type { CompanyChoice, Person } from '@/features/admin/schema';
import { roleLabel } from '@/features/auth';
import { roles } from '@/features/session/schema';

const formSchema = z
  .object({
    name: z.string().trim().min(1, 'Enter the name').max(120),
    role: z.enum(roles),
    companyId: z.string(),
  })
  .refine((v) => v.role !== 'operator' || v.companyId !== '', {
    path: ['companyId'],
    message: 'Choose the operator company this person works for',
  });
type FormValues = z.infer<typeof formSchema>;

/** Name, role and company. A new role or company signs the person out everywhere, so the card says so. */
export function PersonEditCard({ person, companies }: { person: Person; companies: CompanyChoice[] }) {
  const update = useUpdatePersonMutation(person.id);
  const [saved, setSaved] = useState(false);
  const form = useForm<FormValues>({
    resolver: zodResolver(formSchema),
    defaultValues: { name: person.name, role: person.role, companyId: person.companyId ?? '' },
  });
  const role = useWatch({ control: form.control, name: 'role' });
  const save = useServerSubmit(
    form,
    async (v) => {
      setSaved(false);
      const user = await update.mutateAsync({
        name: v.name,
        role: v.role,
        companyId: v.role === 'operator' ? v.companyId : null,
      });
      form.reset({ name: user.name, role: user.role, companyId: user.companyId ?? '' });
      setSaved(true);
    },
    fieldsOf(['name', 'role', 'companyId']),
  );
  return (
    <Card>
      <Text variant="heading">Name, role and company</Text>
      <View style={styles.fields}>
        <FormText control={form.control} name="name" label="Name" autoCapitalize="words" />
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
      </View>
      <Text variant="small" muted>
        A new role or company signs {person.name} out on every device; they sign in again to carry on.
      </Text>
      {saved ? (
        <Text color={colors.within} role="status">
          ✓ Saved.
        </Text>
      ) : null}
      <FormFooter save={save} submitLabel="Save changes" />
    </Card>
  );
}

const styles = StyleSheet.create({ fields: { gap: space.md } });
