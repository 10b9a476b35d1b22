import { zodResolver } from '@hookform/resolvers/zod';
import { Controller, useForm, useWatch } from 'react-hook-form';
import { StyleSheet, View } from 'react-native';
import { z } from 'zod';

import { ChoiceChips } from '@/components/choice-chips';
import { rideStatusLabel } from '@/components/status-mark';
import { space } from '@/components/theme';
import { FormText } from '@/components/form/fields';
import { FormFooter, useServerSubmit } from '@/components/form/footer';
import { requireReasonOutOfService } from '@/features/registry/ride-form';
import { ridePatchSchema } from '@/features/registry/schema';
import { fieldsOf } from '@/components/form/server-errors';
import { eases } from '@/features/rides';
import { Text } from '@/components/text';
import { rideStatusSchema, rideStatuses } from '@/features/rides/schema';

/**
 * The status part of the API's ride PATCH, with the status rule; "since" may be left empty (the server
 * then takes the moment of the change).
 */
const statusFormSchema = z
  .object({
    status: rideStatusSchema,
    statusReason: ridePatchSchema.shape.statusReason,
    statusSince: z.preprocess((v) => (v === '' ? undefined : v), ridePatchSchema.shape.statusSince),
  })
  .superRefine(requireReasonOutOfService);

type StatusFormInput = z.input<typeof statusFormSchema>;
type StatusFormOutput = z.output<typeof statusFormSchema>;

export function StatusForm({
  defaultValues,
  onSubmit,
  onCancel,
}: {
  defaultValues: StatusFormInput;
  onSubmit: (values: StatusFormOutput) => Promise<unknown>;
  onCancel?: () => void;
}) {
  const { control, handleSubmit, setError, formState } = useForm<StatusFormInput, unknown, StatusFormOutput>({
    resolver: zodResolver(statusFormSchema),
    defaultValues,
  });
  const status = useWatch({ control, name: 'status' });
  // The register may only make a ride stricter; easing a stop or restriction follows the status rules.
  const choices = rideStatuses.filter((s) => !eases(defaultValues.status, s));
  const save = useServerSubmit(
    { handleSubmit, setError, formState },
    // In service carries no reason; the server clears it the same way.
    (values) => onSubmit(values.status === 'in_service' ? { ...values, statusReason: null } : values),
    fieldsOf(['status', 'statusReason', 'statusSince']),
  );
  return (
    <View style={styles.form}>
      <Controller
        control={control}
        name="status"
        render={({ field, fieldState }) => (
          <ChoiceChips
            label="New status"
            value={field.value}
            options={choices.map((s) => ({ value: s, label: rideStatusLabel(s) }))}
            onChange={field.onChange}
            error={fieldState.error?.message}
          />
        )}
      />
      {choices.length < rideStatuses.length ? (
        <Text variant="small" muted>
          A ride that is stopped or restricted goes back to service only through an approved follow-up
          inspection, or a supervisor’s override with a reason on the ride’s review page.
        </Text>
      ) : null}
      {status !== 'in_service' ? (
        <FormText
          control={control}
          name="statusReason"
          label="Reason"
          hint="The operator sees this with the status. Say what must happen before it changes back."
          multiline
        />
      ) : null}
      <FormText
        control={control}
        name="statusSince"
        label="Since"
        hint="Leave empty for now, or give a date or date-time, e.g. 2025-05-01 or 2025-05-01T08:30Z."
        autoCapitalize="none"
      />
      <FormFooter save={save} submitLabel="Save status" tone="accent" onCancel={onCancel} />
    </View>
  );
}

const styles = StyleSheet.create({
  form: { gap: space.lg },
});
