import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm, useWatch } from 'react-hook-form';
import { StyleSheet, View } from 'react-native';
import { z } from 'zod';

import { Button } from '@/components/button';
import { FormChoice } from '@/components/form/choices';
import { FormDate } from '@/components/form/date';
import { FormText } from '@/components/form/fields';
import { FormFooter, useServerSubmit } from '@/components/form/footer';
import { ProgressBar } from '@/components/progress-bar';
import { Text } from '@/components/text';
import { space } from '@/components/theme';
import {
  type BulletinInput,
  bulletinInputSchema,
  bulletinSeverities,
  bulletinSeverityLabel,
} from '@/features/bulletins/schema';
import { MAX_DOCUMENT_BYTES } from '@/features/documents';
import { pickPdf, uploadPdf, type PickedPdf } from '@/features/documents/ui';
import { formatBytes } from '@/lib/bytes';

const deadlineKinds = ['date', 'next_operation', 'none'] as const;
const deadlineChoices = [
  { value: 'date', label: 'By a date' },
  { value: 'next_operation', label: 'Before the ride next runs' },
  { value: 'none', label: 'No deadline' },
] as const;

/** The form's own fields: models typed in one box, the deadline as a choice and a date. */
const formFields = z.object({
  maker: z.string(),
  modelsText: z.string(),
  reference: z.string(),
  title: z.string(),
  issuedOn: z.string().nullable(),
  severity: z.enum(bulletinSeverities),
  requiredAction: z.string(),
  deadline: z.enum(deadlineKinds),
  deadlineOn: z.string().nullable(),
  notes: z.string(),
});
export type BulletinFormValues = z.input<typeof formFields>;

const splitModels = (text: string) =>
  text
    .split(/[\n,;]+/)
    .map((s) => s.trim())
    .filter(Boolean);

function toInput(f: BulletinFormValues, documentSha256: string | null): BulletinInput {
  return {
    maker: f.maker,
    models: splitModels(f.modelsText),
    reference: f.reference,
    title: f.title,
    issuedOn: f.issuedOn ?? '',
    severity: f.severity,
    requiredAction: f.requiredAction,
    deadlineOn: f.deadline === 'date' ? f.deadlineOn : null,
    beforeNextOperation: f.deadline === 'next_operation',
    documentSha256,
    notes: f.notes,
  };
}

/** Where the API's field paths show in this form. */
const fieldOf = (path: string): keyof BulletinFormValues | null => {
  const top = path.split('.')[0];
  if (top === 'models') return 'modelsText';
  if (top === 'beforeNextOperation') return 'deadline';
  if (top === 'documentSha256') return null;
  return top in formFields.shape ? (top as keyof BulletinFormValues) : null;
};

/** The register's rules, checked on the bulletin the form would send; problems placed on the form's fields. */
const formSchema = formFields.superRefine((f, ctx) => {
  if (f.deadline === 'date' && !f.deadlineOn)
    ctx.addIssue({ code: 'custom', path: ['deadlineOn'], message: 'Choose the date' });
  const parsed = bulletinInputSchema.safeParse(toInput(f, null));
  if (parsed.success) return;
  for (const issue of parsed.error.issues) {
    const field = fieldOf(issue.path.map(String).join('.'));
    if (field) ctx.addIssue({ code: 'custom', path: [field], message: issue.message });
  }
});

export function bulletinFormValues(b?: {
  maker: string;
  models: string[];
  reference: string;
  title: string;
  issuedOn: string;
  severity: BulletinInput['severity'];
  requiredAction: string;
  deadlineOn: string | null;
  beforeNextOperation: boolean;
  notes: string | null;
}): BulletinFormValues {
  return {
    maker: b?.maker ?? '',
    modelsText: b?.models.join(', ') ?? '',
    reference: b?.reference ?? '',
    title: b?.title ?? '',
    issuedOn: b?.issuedOn ?? null,
    severity: b?.severity ?? 'safety',
    requiredAction: b?.requiredAction ?? '',
    deadline: b?.beforeNextOperation ? 'next_operation' : b && !b.deadlineOn ? 'none' : 'date',
    deadlineOn: b?.deadlineOn ?? null,
    notes: b?.notes ?? '',
  };
}

type Sending = { sent: number; total: number } | null;

/**
 * A bulletin of the register. The maker's PDF is picked here and sent to the documents store first
 * (its hash is what the bulletin keeps); a bulletin already holding one keeps it unless another is picked.
 */
export function BulletinForm({
  defaultValues,
  documentSha256,
  submitLabel,
  onSubmit,
  onCancel,
}: {
  defaultValues: BulletinFormValues;
  documentSha256: string | null;
  submitLabel: string;
  onSubmit: (input: BulletinInput) => Promise<unknown>;
  onCancel?: () => void;
}) {
  const { control, handleSubmit, setError, formState } = useForm<BulletinFormValues>({
    resolver: zodResolver(formSchema),
    defaultValues,
  });
  const [picked, setPicked] = useState<PickedPdf | null>(null);
  const [pdfProblem, setPdfProblem] = useState<string | null>(null);
  const [sending, setSending] = useState<Sending>(null);
  const save = useServerSubmit(
    { handleSubmit, setError, formState },
    async (values: BulletinFormValues) => {
      let hash = documentSha256;
      if (picked) {
        setSending({ sent: 0, total: picked.bytes.length });
        try {
          hash = await uploadPdf('/api/documents', picked.bytes, 'Bulletin upload', (sent, total) =>
            setSending({ sent, total }),
          );
        } finally {
          setSending(null);
        }
      }
      await onSubmit(toInput(values, hash));
    },
    (path) => fieldOf(path),
  );
  const pick = async () => {
    setPdfProblem(null);
    const got = await pickPdf(MAX_DOCUMENT_BYTES);
    if (got === null) return;
    if ('problem' in got) setPdfProblem(got.problem);
    else setPicked(got);
  };
  const deadline = useWatch({ control, name: 'deadline' });
  return (
    <View style={styles.form}>
      <View style={styles.pair}>
        <View style={styles.half}>
          <FormText control={control} name="maker" label="Maker" />
        </View>
        <View style={styles.half}>
          <FormText
            control={control}
            name="modelsText"
            label="Models"
            hint="As the maker names them, separated by commas. Rides of this maker and these models get it."
          />
        </View>
      </View>
      <View style={styles.pair}>
        <View style={styles.half}>
          <FormText control={control} name="reference" label="Maker’s reference" autoCapitalize="none" />
        </View>
        <View style={styles.half}>
          <FormDate control={control} name="issuedOn" label="Issued on" />
        </View>
      </View>
      <FormText control={control} name="title" label="Title" />
      <FormChoice
        control={control}
        name="severity"
        label="How much it matters"
        options={bulletinSeverities.map((s) => ({ value: s, label: bulletinSeverityLabel[s] }))}
      />
      <FormText
        control={control}
        name="requiredAction"
        label="Required action"
        hint="What must be done on each ride. The inspector’s checklist shows it as written."
        multiline
      />
      <FormChoice control={control} name="deadline" label="Deadline" options={deadlineChoices} />
      {deadline === 'date' ? <FormDate control={control} name="deadlineOn" label="Deadline date" /> : null}
      <FormText control={control} name="notes" label="Notes (optional)" multiline />
      <View style={styles.pdf}>
        <Text variant="label" muted>
          MAKER’S BULLETIN (PDF)
        </Text>
        <Text testID="bulletin-pdf">
          {picked
            ? `${picked.name} (${formatBytes(picked.bytes.length)}), sent when you save`
            : documentSha256
              ? 'A PDF is on file.'
              : 'No PDF yet.'}
        </Text>
        {pdfProblem ? (
          <Text role="alert" variant="small">
            {pdfProblem}
          </Text>
        ) : null}
        <Button
          tone="quiet"
          label={picked || documentSha256 ? 'Choose another PDF' : 'Choose PDF'}
          onPress={pick}
          style={styles.start}
        />
        {sending ? (
          <ProgressBar
            label="Sending the bulletin’s PDF"
            value={sending.sent}
            max={sending.total}
            valueText={`${formatBytes(sending.sent)} of ${formatBytes(sending.total)}`}
          />
        ) : null}
      </View>
      <FormFooter save={save} submitLabel={submitLabel} onCancel={onCancel} />
    </View>
  );
}

const styles = StyleSheet.create({
  form: { gap: space.lg },
  pair: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md, alignItems: 'flex-start' },
  half: { flexGrow: 1, flexBasis: 220, minWidth: 0 },
  pdf: { gap: space.xs },
  start: { alignSelf: 'flex-start' },
});
