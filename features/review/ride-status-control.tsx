import { zodResolver } from '@hookform/resolvers/zod';
import { useEffect, useState } from 'react';
import { Controller, useForm, useWatch } from 'react-hook-form';
import { Pressable, StyleSheet, View } from 'react-native';
import { z } from 'zod';

import { FieldFrame } from '@/components/field-frame';
import { type RideStatus, RideStatusMark, rideStatusLabel } from '@/components/status-mark';
import { Text } from '@/components/text';
import { colors, layout, radius, space } from '@/components/theme';
import { FormText } from '@/features/registry/form-fields';
import { FormFooter, useServerSubmit } from '@/features/registry/form-footer';
import { requireReasonOutOfService } from '@/features/registry/ride-form';
import { ridePatchSchema } from '@/features/registry/schema';
import { fieldsOf } from '@/features/registry/server-errors';
import { useSetRideStatus } from '@/features/review/decision-api';
import { rideStatusSchema, rideStatuses } from '@/features/rides/schema';

/** The status part of the register's ride PATCH, with its rule: a reason unless the ride is in service. */
const rideStatusFormSchema = z
  .object({ status: rideStatusSchema, statusReason: ridePatchSchema.shape.statusReason })
  .superRefine(requireReasonOutOfService);
type FormIn = z.input<typeof rideStatusFormSchema>;
type FormOut = z.output<typeof rideStatusFormSchema>;

/**
 * The ride's status beside the inspection: what it is now, and a change with its reason saved at once
 * (the register's ride PATCH, recorded in the audit trail). `startWith` preselects a status, e.g. out of
 * service when the supervisor is asked to stop the ride before approving.
 */
export function RideStatusControl({
  rideId,
  inspectionId,
  rideName,
  status,
  statusReason,
  startWith,
}: {
  rideId: string;
  inspectionId: string;
  rideName: string;
  status: RideStatus;
  statusReason: string | null;
  startWith?: RideStatus;
}) {
  const setStatus = useSetRideStatus(rideId, inspectionId);
  const [saved, setSaved] = useState<RideStatus | null>(null);
  const { control, handleSubmit, setError, setFocus, formState } = useForm<FormIn, unknown, FormOut>({
    resolver: zodResolver(rideStatusFormSchema),
    defaultValues: {
      status: startWith ?? status,
      statusReason: (startWith ?? status) === status ? (statusReason ?? '') : '',
    },
  });
  const chosen = useWatch({ control, name: 'status' });
  // Opened with a status to set (from the approve warning): the reason is what is still needed.
  useEffect(() => {
    if (startWith && startWith !== 'in_service') setFocus('statusReason');
  }, [startWith, setFocus]);
  const save = useServerSubmit(
    { handleSubmit, setError, formState },
    async (values) => {
      setSaved(null);
      // In service carries no reason; the server clears it the same way.
      const statusReason = values.status === 'in_service' ? null : (values.statusReason ?? null);
      await setStatus.mutateAsync({ status: values.status, statusReason });
      setSaved(values.status);
    },
    fieldsOf(['status', 'statusReason']),
  );
  return (
    <View style={styles.box}>
      <View style={styles.now}>
        <Text variant="label" muted>
          {rideName.toUpperCase()} NOW
        </Text>
        <RideStatusMark status={status} />
        {status !== 'in_service' && statusReason ? <Text variant="small">{statusReason}</Text> : null}
      </View>
      <Controller
        control={control}
        name="status"
        render={({ field, fieldState }) => (
          <FieldFrame label="Set the ride's status" error={fieldState.error?.message}>
            <View role="radiogroup" accessibilityLabel="Ride status" style={styles.choices}>
              {rideStatuses.map((s) => {
                const on = s === field.value;
                return (
                  <Pressable
                    key={s}
                    role="radio"
                    aria-checked={on}
                    accessibilityState={{ checked: on }}
                    accessibilityLabel={rideStatusLabel(s)}
                    onPress={() => field.onChange(s)}
                    style={StyleSheet.flatten([styles.choice, on && styles.choiceOn])}
                  >
                    <Text variant="label" color={on ? colors.base : colors.textMuted}>
                      {on ? '●' : '○'}
                    </Text>
                    <RideStatusMark status={s} compact />
                  </Pressable>
                );
              })}
            </View>
          </FieldFrame>
        )}
      />
      {chosen !== 'in_service' ? (
        <FormText
          control={control}
          name="statusReason"
          label="Reason"
          hint="The operator sees it with the status. Say what must happen before the ride runs normally again."
          multiline
        />
      ) : null}
      <FormFooter save={save} submitLabel="Save ride status" />
      {saved && !formState.isSubmitting ? (
        <Text variant="small" accessibilityLiveRegion="polite" role="status">
          Saved: {rideName} is now {rideStatusLabel(saved).toLowerCase()}.
        </Text>
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  box: { gap: space.md },
  now: { gap: space.xs },
  choices: { flexDirection: 'row', flexWrap: 'wrap', gap: space.xs },
  choice: {
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.sm,
    minHeight: layout.touchTarget,
    paddingHorizontal: space.md,
    borderRadius: radius.md,
    borderWidth: 1.5,
    borderColor: colors.border,
    backgroundColor: colors.surface,
  },
  choiceOn: { borderColor: colors.base, borderWidth: 2.5 },
});
