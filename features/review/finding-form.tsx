import { zodResolver } from '@hookform/resolvers/zod';
import { Controller, type DefaultValues, useForm, useWatch } from 'react-hook-form';
import { Pressable, StyleSheet, View } from 'react-native';
import type { z } from 'zod';

import { FieldFrame } from '@/components/field-frame';
import { Text } from '@/components/text';
import { TextField } from '@/components/text-field';
import { colors, layout, radius, space } from '@/components/theme';
import { ToggleChips } from '@/components/toggle-chips';
import { FormText } from '@/components/form/fields';
import { FormFooter, useServerSubmit } from '@/components/form/footer';
import { fieldsOf } from '@/components/form/server-errors';
import { type FindingSeverity, findingSeverities } from '@/features/review/schema';
import {
  type Finding,
  type FindingInput,
  findingInputSchema,
  severityInfo,
} from '@/features/notices/finding-schema';
import { SeverityMark } from '@/features/notices/ui';

export type FindingValues = z.output<typeof findingInputSchema>;
export type InspectionPhoto = { sha256: string; caption: string };

const FIELDS = ['severity', 'description', 'ruleRef', 'requiredAction', 'dueOn', 'photoShas'] as const;

/** A photo's name in lists and chips: its caption, or its place among the inspection's photos. */
export function photoName(photos: readonly InspectionPhoto[], sha: string): string {
  const i = photos.findIndex((p) => p.sha256 === sha);
  if (i < 0) return `Photo ${sha.slice(0, 8)}…`;
  return photos[i].caption.trim() || `Photo ${i + 1}`;
}

function startValues(finding: Finding | undefined): DefaultValues<FindingInput> {
  if (!finding)
    return {
      // No severity until the supervisor picks one: a default would be a decision nobody made.
      severity: undefined,
      description: '',
      ruleRef: '',
      requiredAction: '',
      dueOn: null,
      photoShas: [],
    };
  return {
    severity: finding.severity,
    description: finding.description,
    ruleRef: finding.ruleRef ?? '',
    requiredAction: finding.requiredAction ?? '',
    dueOn: finding.dueOn,
    photoShas: finding.photoShas,
  };
}

/**
 * Adds or edits one finding. The API's own schema judges it (severity rules included); a refused save
 * puts the server's problems on the fields they name.
 */
export function FindingForm({
  finding,
  photos,
  onSubmit,
  onCancel,
}: {
  /** The finding being edited; none to add a new one. */
  finding?: Finding;
  photos: readonly InspectionPhoto[];
  onSubmit: (values: FindingValues) => Promise<unknown>;
  onCancel: () => void;
}) {
  const { control, handleSubmit, setError, formState } = useForm<FindingInput, unknown, FindingValues>({
    resolver: zodResolver(findingInputSchema),
    defaultValues: startValues(finding),
  });
  const severity = useWatch({ control, name: 'severity' });
  const save = useServerSubmit({ handleSubmit, setError, formState }, onSubmit, fieldsOf(FIELDS), {
    photoShas: 'Photo',
  });
  return (
    <View style={styles.form} accessibilityLabel={finding ? `Edit finding ${finding.number}` : 'New finding'}>
      <Text variant="heading">{finding ? `Edit finding ${finding.number}` : 'New finding'}</Text>
      <Controller
        control={control}
        name="severity"
        render={({ field, fieldState }) => (
          <SeverityChooser
            value={field.value}
            onChange={field.onChange}
            // The schema's message lists the codes; a person needs to hear what to do.
            error={
              fieldState.error ? (field.value ? fieldState.error.message : 'Choose a severity') : undefined
            }
          />
        )}
      />
      <FormText control={control} name="description" label="What was found" multiline />
      <FormText
        control={control}
        name="ruleRef"
        label="Rule or maker's instruction breached"
        hint="Clause, bulletin or manual section, e.g. Maintenance manual 4.2, main pivot pin wear."
      />
      <FormText
        control={control}
        name="requiredAction"
        label="Required action"
        hint={severity === 'note' ? 'Optional for a note.' : 'Say what must be done to correct it.'}
        multiline
      />
      <Controller
        control={control}
        name="dueOn"
        render={({ field, fieldState }) => (
          <TextField
            ref={field.ref}
            label="Due date"
            hint={
              severity === 'fix_by_date'
                ? 'Needed for this severity. YYYY-MM-DD, e.g. 2025-06-30.'
                : 'Optional. YYYY-MM-DD, e.g. 2025-06-30.'
            }
            value={field.value ?? ''}
            // An empty field is "no due date", which the API takes as null.
            onChangeText={(t) => field.onChange(t.trim() === '' ? null : t)}
            onBlur={field.onBlur}
            error={fieldState.error?.message}
            autoCapitalize="none"
            inputMode="numeric"
            placeholder="YYYY-MM-DD"
          />
        )}
      />
      <Controller
        control={control}
        name="photoShas"
        render={({ field, fieldState }) => (
          <FieldFrame label="Photos it refers to" error={fieldState.error?.message}>
            {photos.length === 0 ? (
              <Text variant="small" muted>
                This inspection has no photos.
              </Text>
            ) : (
              <ToggleChips
                label="Photo"
                values={field.value ?? []}
                options={photos.map((p) => ({ value: p.sha256, label: photoName(photos, p.sha256) }))}
                onChange={field.onChange}
              />
            )}
          </FieldFrame>
        )}
      />
      <FormFooter
        save={save}
        submitLabel={finding ? 'Save finding' : 'Add finding'}
        tone="accent"
        onCancel={onCancel}
      />
    </View>
  );
}

/** The four severities, each with its mark and what it means; one is chosen. */
function SeverityChooser({
  value,
  onChange,
  error,
}: {
  value: FindingSeverity | undefined;
  onChange: (value: FindingSeverity) => void;
  error?: string;
}) {
  return (
    <FieldFrame label="Severity" error={error}>
      <View role="radiogroup" accessibilityLabel="Severity" style={styles.choices}>
        {findingSeverities.map((s) => {
          const on = s === value;
          return (
            <Pressable
              key={s}
              role="radio"
              aria-checked={on}
              accessibilityState={{ checked: on }}
              accessibilityLabel={severityInfo[s].label}
              onPress={() => onChange(s)}
              style={StyleSheet.flatten([
                styles.choice,
                on && styles.choiceOn,
                error && !on && styles.choiceError,
              ])}
            >
              <View style={StyleSheet.flatten([styles.radio, on && styles.radioOn])}>
                {on ? <View style={styles.radioDot} /> : null}
              </View>
              <View style={styles.choiceText}>
                <SeverityMark severity={s} compact />
                <Text variant="small">{severityInfo[s].description}</Text>
              </View>
            </Pressable>
          );
        })}
      </View>
    </FieldFrame>
  );
}

const styles = StyleSheet.create({
  form: { gap: space.lg },
  choices: { gap: space.xs },
  choice: {
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.md,
    minHeight: layout.touchTarget,
    paddingHorizontal: space.md,
    paddingVertical: space.sm,
    borderRadius: radius.md,
    borderWidth: 1.5,
    borderColor: colors.border,
    backgroundColor: colors.surface,
  },
  choiceOn: { borderColor: colors.base, borderWidth: 2.5, backgroundColor: colors.bg },
  choiceError: { borderColor: colors.danger },
  radio: {
    width: 22,
    height: 22,
    borderRadius: 11,
    borderWidth: 2,
    borderColor: colors.textMuted,
    alignItems: 'center',
    justifyContent: 'center',
  },
  radioOn: { borderColor: colors.base },
  radioDot: { width: 10, height: 10, borderRadius: 5, backgroundColor: colors.base },
  choiceText: { flex: 1, gap: space.xs },
});
