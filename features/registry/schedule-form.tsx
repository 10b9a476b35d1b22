import { zodResolver } from '@hookform/resolvers/zod';
import { Controller, useForm } from 'react-hook-form';
import { StyleSheet, View } from 'react-native';
import { z } from 'zod';

import { SelectField } from '@/components/select-field';
import { space } from '@/components/theme';
import { FormNumber, FormText } from '@/components/form/fields';
import { FormDate } from '@/components/form/date';
import { FormFooter, useServerSubmit } from '@/components/form/footer';
import { schedulePatchSchema } from '@/features/registry/schema';
import { fieldsOf } from '@/components/form/server-errors';

/** An empty date field means "no date": the API takes null for that. */
const emptyAsNull = <T extends z.ZodType>(schema: T) => z.preprocess((v) => (v === '' ? null : v), schema);

/** The API's schedule PATCH schema, with empty date fields read as "none". */
export const scheduleFormSchema = z.object({
  intervalDays: schedulePatchSchema.shape.intervalDays,
  lastDoneOn: emptyAsNull(schedulePatchSchema.shape.lastDoneOn),
  dueOn: emptyAsNull(schedulePatchSchema.shape.dueOn),
  assignedTo: schedulePatchSchema.shape.assignedTo,
  notes: schedulePatchSchema.shape.notes,
});
export type ScheduleFormInput = z.input<typeof scheduleFormSchema>;
type ScheduleFormOutput = z.output<typeof scheduleFormSchema>;

const NOBODY = '__nobody';

/** Interval, dates, the assigned inspector and notes of one inspection type on one ride. */
export function ScheduleForm({
  defaultValues,
  inspectors,
  onSubmit,
  onCancel,
  submitLabel,
}: {
  defaultValues: ScheduleFormInput;
  inspectors: { id: string; name: string }[];
  onSubmit: (values: ScheduleFormOutput) => Promise<unknown>;
  onCancel: () => void;
  submitLabel: string;
}) {
  const { control, handleSubmit, setError, formState } = useForm<
    ScheduleFormInput,
    unknown,
    ScheduleFormOutput
  >({
    resolver: zodResolver(scheduleFormSchema),
    defaultValues,
  });
  const save = useServerSubmit(
    { handleSubmit, setError, formState },
    onSubmit,
    fieldsOf(['intervalDays', 'lastDoneOn', 'dueOn', 'assignedTo', 'notes']),
  );
  return (
    <View style={styles.form}>
      <View style={styles.row}>
        <View style={styles.cell}>
          <FormNumber control={control} name="intervalDays" label="Every" unit="days" integer />
        </View>
        <View style={styles.cell}>
          <FormDate control={control} name="lastDoneOn" label="Last done" />
        </View>
        <View style={styles.cell}>
          <FormDate
            control={control}
            name="dueOn"
            label="Due on (one-off)"
            hint="Overrides last done + interval"
          />
        </View>
      </View>
      <Controller
        control={control}
        name="assignedTo"
        render={({ field, fieldState }) => (
          <SelectField
            label="Inspector"
            value={field.value ?? NOBODY}
            options={[
              { value: NOBODY, label: 'Not assigned' },
              ...inspectors.map((i) => ({ value: i.id, label: i.name })),
            ]}
            onChange={(v) => field.onChange(v === NOBODY ? null : v)}
            error={fieldState.error?.message}
          />
        )}
      />
      <FormText control={control} name="notes" label="Notes" multiline />
      <FormFooter save={save} submitLabel={submitLabel} onCancel={onCancel} />
    </View>
  );
}

const styles = StyleSheet.create({
  form: { gap: space.md },
  row: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md },
  cell: { flexGrow: 1, flexBasis: 160, minWidth: 0 },
});
