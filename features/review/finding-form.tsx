import { zodResolver } from '@hookform/resolvers/zod';
import { Controller, type DefaultValues, useForm, useWatch } from 'react-hook-form';
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import type { z } from 'zod';

import { DateField } from '@/components/date-field';
import { FieldFrame } from '@/components/field-frame';
import { RadioGroup, RadioOption } from '@/components/radio-option';
import { Text } from '@/components/text';
import { space } from '@/components/theme';
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
import { formatDateTime } from '@/lib/dates';

export type FindingValues = z.output<typeof findingInputSchema>;
/**
 * A photo of the inspection as the finding form names it. `id` is the photo's own (two photos may hold
 * the same bytes, so the same SHA-256); `about` says what it shows (its pivot, its checklist item).
 */
export type InspectionPhoto = {
  sha256: string;
  caption: string;
  id?: string;
  takenAt?: string;
  about?: string | null;
};

const FIELDS = ['severity', 'description', 'ruleRef', 'requiredAction', 'dueOn', 'photoShas'] as const;

/**
 * The name of the photo at `index`, distinct from every other photo's: its place among the inspection's
 * photos, then its caption (or what it shows), then when it was taken: "Photo 2 — P2 · Main pin, 3 Dec
 * 2026, 14:05". Two uncaptioned photos of the same item still differ by their number.
 */
export function photoLabel(photos: readonly InspectionPhoto[], index: number): string {
  const p = photos[index];
  const what = p.caption.trim() || p.about || '';
  const when = p.takenAt ? formatDateTime(p.takenAt) : '';
  const tail = [what, when].filter(Boolean).join(', ');
  return tail ? `Photo ${index + 1} — ${tail}` : `Photo ${index + 1}`;
}

/** A photo's name in lists, from the SHA-256 a finding keeps: the first photo holding those bytes. */
export function photoName(photos: readonly InspectionPhoto[], sha: string): string {
  const i = photos.findIndex((p) => p.sha256 === sha);
  if (i < 0) return `Photo ${sha.slice(0, 8)}…`;
  return photoLabel(photos, i);
}

/** A photo's key in the picker: its own id (the place in the list for a photo without one). */
const photoKey = (p: InspectionPhoto, i: number) => p.id ?? `#${i}`;

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
          <DateField
            label="Due date"
            hint={severity === 'fix_by_date' ? 'Needed for this severity.' : 'Optional.'}
            value={field.value ?? null}
            // No date is "no due date", which the API takes as null.
            onChange={field.onChange}
            onBlur={field.onBlur}
            error={fieldState.error?.message}
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
              <PhotoPicker photos={photos} shas={field.value ?? []} onChange={field.onChange} />
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

/**
 * Which photos the finding refers to. Each photo is ticked by its own id, so two photos with the same
 * bytes (one picture attached to two items) are two choices; the finding keeps their SHA-256s, once each.
 */
function PhotoPicker({
  photos,
  shas,
  onChange,
}: {
  photos: readonly InspectionPhoto[];
  shas: readonly string[];
  onChange: (shas: string[]) => void;
}) {
  // A finding being edited names its photos by SHA-256: the first photo with each is the one ticked.
  const [keys, setKeys] = useState<string[]>(() =>
    shas.flatMap((sha) => {
      const i = photos.findIndex((p) => p.sha256 === sha);
      return i < 0 ? [] : [photoKey(photos[i], i)];
    }),
  );
  return (
    <ToggleChips
      label="Refers to"
      values={keys}
      options={photos.map((p, i) => ({ value: photoKey(p, i), label: photoLabel(photos, i) }))}
      onChange={(next) => {
        setKeys(next);
        const chosen = photos.filter((p, i) => next.includes(photoKey(p, i))).map((p) => p.sha256);
        onChange([...new Set(chosen)]);
      }}
    />
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
      <RadioGroup
        label="Severity"
        value={value}
        values={findingSeverities}
        onChange={onChange}
        style={styles.choices}
      >
        {findingSeverities.map((s) => (
          <RadioOption
            key={s}
            value={s}
            label={severityInfo[s].label}
            invalid={!!error}
            style={styles.choice}
          >
            <View style={styles.choiceText}>
              <SeverityMark severity={s} compact />
              <Text variant="small">{severityInfo[s].description}</Text>
            </View>
          </RadioOption>
        ))}
      </RadioGroup>
    </FieldFrame>
  );
}

const styles = StyleSheet.create({
  form: { gap: space.lg },
  choices: { gap: space.xs },
  choice: { gap: space.md, paddingVertical: space.sm },
  choiceText: { flex: 1, gap: space.xs },
});
