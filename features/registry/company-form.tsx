import { zodResolver } from '@hookform/resolvers/zod';
import { useMemo, useState } from 'react';
import { Controller, type FieldErrors, useFieldArray, useForm } from 'react-hook-form';
import { StyleSheet, View } from 'react-native';
import { z } from 'zod';

import { Button } from '@/components/button';
import { IconButton } from '@/components/icon-button';
import { Text } from '@/components/text';
import { TextField } from '@/components/text-field';
import { colors, radius, space } from '@/components/theme';
import { FormChoice, FormSelect } from '@/components/form/choices';
import { FormText } from '@/components/form/fields';
import { FormFooter, useServerSubmit } from '@/components/form/footer';
import { companyInputSchema, siteInputSchema, siteKindLabel, siteKinds } from '@/features/registry/schema';
import { fieldsOf } from '@/components/form/server-errors';
import {
  noticeUnitSystems,
  noticeUnitSystemVocabulary,
  paperSizes,
  paperSizeVocabulary,
} from '@/lib/vocabulary';
import { timeZoneOptions } from '@/features/registry/time-zone-options';

/** Several addresses typed in one box, one per line (commas and semicolons work too). */
function splitAddresses(text: string): string[] {
  return text
    .split(/[\n,;]+/)
    .map((s) => s.trim())
    .filter(Boolean);
}

// A notice keeps the units and paper it was issued with; the choice applies to notices issued after it.
const unitChoices = noticeUnitSystems.map((u) => ({ value: u, label: noticeUnitSystemVocabulary[u].label }));
const paperChoices = paperSizes.map((p) => ({ value: p, label: paperSizeVocabulary[p].label }));

export type CompanyFormInput = z.input<typeof companyInputSchema>;
type CompanyFormOutput = z.output<typeof companyInputSchema>;

/** The first problem among a list's entries, as "Address 2: …", for a field that holds the whole list. */
function entriesError(e: FieldErrors<CompanyFormInput>['noticeEmails'] | undefined, noun: string) {
  if (!e) return undefined;
  if (typeof e.message === 'string' && e.message) return e.message;
  if (Array.isArray(e)) {
    const i = e.findIndex((x) => x?.message);
    if (i >= 0) return `${noun} ${i + 1}: ${e[i].message}`;
  }
  return undefined;
}

export function CompanyForm({
  defaultValues,
  submitLabel,
  onSubmit,
  onCancel,
}: {
  defaultValues: CompanyFormInput;
  submitLabel: string;
  onSubmit: (values: CompanyFormOutput) => Promise<unknown>;
  onCancel?: () => void;
}) {
  const { control, handleSubmit, setError, formState } = useForm<
    CompanyFormInput,
    unknown,
    CompanyFormOutput
  >({
    resolver: zodResolver(companyInputSchema),
    defaultValues,
  });
  const contacts = useFieldArray({ control, name: 'contacts', keyName: 'fieldKey' });
  const save = useServerSubmit(
    { handleSubmit, setError, formState },
    onSubmit,
    fieldsOf(['name', 'noticeEmails', 'phone', 'address', 'noticeUnits', 'noticePaper'], ['contacts']),
    {
      contacts: 'Contact',
    },
  );
  return (
    <View style={styles.form}>
      <FormText control={control} name="name" label="Company name" />
      <Controller
        control={control}
        name="noticeEmails"
        render={({ field }) => (
          <AddressList
            value={field.value ?? []}
            onChange={field.onChange}
            onBlur={field.onBlur}
            error={entriesError(formState.errors.noticeEmails, 'Address')}
          />
        )}
      />
      <View style={styles.pair}>
        <View style={styles.half}>
          <FormChoice control={control} name="noticeUnits" label="Units on notices" options={unitChoices} />
        </View>
        <View style={styles.half}>
          <FormChoice
            control={control}
            name="noticePaper"
            label="Paper for notice PDFs"
            options={paperChoices}
          />
        </View>
      </View>
      <View style={styles.pair}>
        <View style={styles.half}>
          <FormText control={control} name="phone" label="Phone" inputMode="tel" />
        </View>
        <View style={styles.half}>
          <FormText control={control} name="address" label="Address" multiline />
        </View>
      </View>
      <Text variant="label" muted>
        CONTACTS
      </Text>
      {contacts.fields.map((c, i) => (
        <View key={c.fieldKey} style={styles.contact} accessibilityLabel={`Contact ${i + 1}`}>
          <View style={styles.pair}>
            <View style={styles.half}>
              <FormText control={control} name={`contacts.${i}.name`} label={`Contact ${i + 1} name`} />
            </View>
            <View style={styles.half}>
              <FormText control={control} name={`contacts.${i}.role`} label="Role" />
            </View>
          </View>
          <View style={styles.pair}>
            <View style={styles.half}>
              <FormText
                control={control}
                name={`contacts.${i}.email`}
                label="E-mail"
                autoCapitalize="none"
                inputMode="email"
              />
            </View>
            <View style={styles.half}>
              <FormText control={control} name={`contacts.${i}.phone`} label="Phone" inputMode="tel" />
            </View>
            <View style={styles.remove}>
              <IconButton
                icon="trash-2"
                tone="danger"
                label={`Remove contact ${i + 1}`}
                onPress={() => contacts.remove(i)}
              />
            </View>
          </View>
        </View>
      ))}
      <Button
        label="Add a contact"
        tone="quiet"
        onPress={() => contacts.append({ name: '', role: '', email: '', phone: '' })}
        style={styles.start}
      />
      <FormFooter save={save} submitLabel={submitLabel} onCancel={onCancel} />
    </View>
  );
}

/**
 * The notice addresses as one box of text, one per line; the form holds the list. The text is kept as
 * typed so a new, still empty line stays on screen.
 */
function AddressList({
  value,
  onChange,
  onBlur,
  error,
}: {
  value: string[];
  onChange: (v: string[]) => void;
  onBlur: () => void;
  error?: string;
}) {
  const [text, setText] = useState(value.join('\n'));
  return (
    <TextField
      label="Notice e-mail addresses"
      hint="Where notices about their rides go. One per line."
      value={text}
      onChangeText={(t) => {
        setText(t);
        onChange(splitAddresses(t));
      }}
      onBlur={onBlur}
      multiline
      numberOfLines={3}
      autoCapitalize="none"
      inputMode="email"
      error={error}
      style={styles.multi}
    />
  );
}

export type SiteFormInput = z.input<typeof siteInputSchema>;
type SiteFormOutput = z.output<typeof siteInputSchema>;

export function SiteForm({
  defaultValues,
  operators,
  submitLabel,
  onSubmit,
  onCancel,
  defaultZone,
}: {
  defaultValues: SiteFormInput;
  operators: { value: string; label: string }[];
  /** The inspection body's default zone, named in the hint. */
  defaultZone?: string;
  submitLabel: string;
  onSubmit: (values: SiteFormOutput) => Promise<unknown>;
  onCancel?: () => void;
}) {
  const { control, handleSubmit, setError, formState } = useForm<SiteFormInput, unknown, SiteFormOutput>({
    resolver: zodResolver(siteInputSchema),
    defaultValues,
  });
  const save = useServerSubmit(
    { handleSubmit, setError, formState },
    onSubmit,
    fieldsOf(['name', 'kind', 'address', 'locality', 'timeZone', 'operatorCompanyId']),
  );
  const defaultWords = `The inspection body’s default${defaultZone ? ` (${defaultZone})` : ''}`;
  // Every zone Intl knows, the site's saved one kept even if not listed; the first choice clears it.
  const zones = useMemo(
    () => [{ value: '', label: defaultWords }, ...timeZoneOptions(defaultValues.timeZone)],
    [defaultWords, defaultValues.timeZone],
  );
  return (
    <View style={styles.form}>
      <FormText control={control} name="name" label="Site name" />
      <FormChoice
        control={control}
        name="kind"
        label="Kind of site"
        options={siteKinds.map((k) => ({ value: k, label: siteKindLabel[k] }))}
      />
      <View style={styles.pair}>
        <View style={styles.half}>
          <FormText control={control} name="address" label="Address" />
        </View>
        <View style={styles.half}>
          <FormText control={control} name="locality" label="Town or locality" />
        </View>
      </View>
      <FormSelect
        control={control}
        name="timeZone"
        label="Time zone"
        options={zones}
        placeholder={defaultWords}
      />
      <Text variant="small" muted style={styles.zoneHint}>
        The site’s clock: its “today”, due dates, 07:00 reminders and times shown.
      </Text>
      <FormSelect
        control={control}
        name="operatorCompanyId"
        label="Operator"
        options={operators}
        placeholder="Choose the operator company"
      />
      <FormFooter save={save} submitLabel={submitLabel} onCancel={onCancel} />
    </View>
  );
}

const styles = StyleSheet.create({
  form: { gap: space.lg },
  pair: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md, alignItems: 'flex-end' },
  half: { flexGrow: 1, flexBasis: 220, minWidth: 0 },
  remove: { paddingBottom: 0 },
  contact: {
    gap: space.sm,
    padding: space.md,
    borderRadius: radius.md,
    borderWidth: 1,
    borderColor: colors.surfaceSunk,
    backgroundColor: colors.bg,
  },
  start: { alignSelf: 'flex-start' },
  multi: { minHeight: 72, textAlignVertical: 'top' },
  zoneHint: { marginTop: -space.md },
});
