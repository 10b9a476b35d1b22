import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { Controller, useForm, useWatch } from 'react-hook-form';
import { StyleSheet, View } from 'react-native';
import { z } from 'zod';

import { FieldFrame } from '@/components/field-frame';
import { type RideStatus, RideStatusMark, rideStatusLabel } from '@/components/status-mark';
import { RadioGroup, RadioOption } from '@/components/radio-option';
import { Text } from '@/components/text';
import { space } from '@/components/theme';
import { FormText } from '@/components/form/fields';
import { FormFooter, useServerSubmit } from '@/components/form/footer';
import { useSession } from '@/features/auth';
import { fieldsOf } from '@/components/form/server-errors';
import { useSetRideStatus } from '@/features/review/decision-api';
import { statusChoices } from '@/features/rides';
import { rideStatusSchema } from '@/features/rides/schema';

const rideStatusFormSchema = z.object({
  status: rideStatusSchema,
  reason: z.string().trim().max(2000, 'At most 2000 characters'),
});
type FormIn = z.input<typeof rideStatusFormSchema>;
type FormOut = z.output<typeof rideStatusFormSchema>;

/**
 * The ride's status beside the inspection, and a change of it on its own (outside the decision, which
 * carries its own status change): only the changes the status rules (`features/review/status-rules.ts`)
 * allow the signed-in person are offered. A return towards service without a follow-up inspection is a
 * supervisor's override: it needs a reason, is recorded and the operator is sent a notice.
 */
export function RideStatusControl({
  rideId,
  inspectionId,
  rideName,
  status,
  statusReason,
}: {
  rideId: string;
  inspectionId: string;
  rideName: string;
  status: RideStatus;
  statusReason: string | null;
}) {
  const setStatus = useSetRideStatus(rideId, inspectionId);
  const role = useSession().data?.user.role ?? null;
  const choices = role ? statusChoices(status, role) : [];
  const [saved, setSaved] = useState<RideStatus | null>(null);
  const { control, handleSubmit, setError, formState } = useForm<FormIn, unknown, FormOut>({
    resolver: zodResolver(
      rideStatusFormSchema.superRefine((v, ctx) => {
        if (v.status !== status && v.reason === '')
          ctx.addIssue({ code: 'custom', path: ['reason'], message: 'Say why; the operator reads it.' });
      }),
    ),
    defaultValues: { status, reason: '' },
  });
  const chosen = useWatch({ control, name: 'status' });
  const override = choices.find((c) => c.status === chosen)?.override ?? false;
  const save = useServerSubmit(
    { handleSubmit, setError, formState },
    async (values) => {
      setSaved(null);
      if (values.status === status) return;
      await setStatus.mutateAsync({ status: values.status, reason: values.reason });
      setSaved(values.status);
    },
    fieldsOf(['status', 'reason']),
  );
  return (
    <View style={styles.box}>
      <StatusNow rideName={rideName} status={status} statusReason={statusReason} />
      {choices.length === 0 ? (
        <Text variant="small" muted>
          {status === 'in_service'
            ? 'Only a supervisor or an administrator can change the ride’s status.'
            : 'Only a supervisor can override the stop.'}
        </Text>
      ) : (
        <>
          <Controller
            control={control}
            name="status"
            render={({ field, fieldState }) => (
              <FieldFrame label="Change the ride's status on its own" error={fieldState.error?.message}>
                <StatusRadios
                  current={status}
                  choices={choices}
                  value={field.value}
                  onChange={field.onChange}
                />
              </FieldFrame>
            )}
          />
          {chosen !== status ? (
            <FormText
              control={control}
              name="reason"
              label={override ? 'Reason for the override' : 'Reason'}
              hint={
                override
                  ? 'Why the ride may run without its follow-up inspection (who checked what). It is recorded and sent to the operator.'
                  : 'The operator sees it with the status. Say what must happen before the ride runs normally again.'
              }
              multiline
            />
          ) : null}
          <FormFooter save={save} submitLabel={override ? 'Override and notify' : 'Save ride status'} />
        </>
      )}
      {saved && !formState.isSubmitting ? (
        <Text variant="small" accessibilityLiveRegion="polite" role="status">
          Saved: {rideName} is now {rideStatusLabel(saved).toLowerCase()}; the operator is sent a notice.
        </Text>
      ) : null}
    </View>
  );
}

/** The ride's status now, why, and how it returns to service. */
function StatusNow({
  rideName,
  status,
  statusReason,
}: {
  rideName: string;
  status: RideStatus;
  statusReason: string | null;
}) {
  return (
    <View style={styles.now}>
      <Text variant="label" muted>
        {rideName.toUpperCase()} NOW
      </Text>
      <RideStatusMark status={status} />
      {status !== 'in_service' && statusReason ? <Text variant="small">{statusReason}</Text> : null}
      {status !== 'in_service' ? (
        <Text variant="small" muted>
          Returns to service when its follow-up inspection is approved, or by a supervisor’s override.
        </Text>
      ) : null}
    </View>
  );
}

/** The statuses offered: the current one (no change) first, then what the rules allow, overrides marked. */
function StatusRadios({
  current,
  choices,
  value,
  onChange,
}: {
  current: RideStatus;
  choices: ReturnType<typeof statusChoices>;
  value: RideStatus;
  onChange: (status: RideStatus) => void;
}) {
  const offered = [{ status: current, override: false }, ...choices];
  return (
    <RadioGroup
      label="Ride status"
      value={value}
      values={offered.map((c) => c.status)}
      onChange={onChange}
      style={styles.choices}
    >
      {offered.map((c) => {
        const label =
          c.status === current
            ? `${rideStatusLabel(c.status)} (no change)`
            : c.override
              ? `${rideStatusLabel(c.status)} (override)`
              : rideStatusLabel(c.status);
        return (
          <RadioOption key={c.status} value={c.status} label={label}>
            <RideStatusMark status={c.status} compact />
            {c.override ? (
              <Text variant="small" muted>
                override
              </Text>
            ) : null}
          </RadioOption>
        );
      })}
    </RadioGroup>
  );
}

const styles = StyleSheet.create({
  box: { gap: space.md },
  now: { gap: space.xs },
  choices: { flexDirection: 'row', flexWrap: 'wrap', gap: space.xs },
});
