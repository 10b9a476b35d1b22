import { zodResolver } from '@hookform/resolvers/zod';
import { type Control, Controller, useForm, useWatch } from 'react-hook-form';
import { StyleSheet, View } from 'react-native';
import { z } from 'zod';

import { ChoiceChips } from '@/components/choice-chips';
import { SelectField } from '@/components/select-field';
import { space } from '@/components/theme';
import { rideStatusLabel } from '@/components/status-mark';
import { FormChoice, FormSelect } from '@/components/form/choices';
import { FormNumber, FormText } from '@/components/form/fields';
import { FormFooter, useServerSubmit } from '@/components/form/footer';
import { rideInputSchema } from '@/features/registry/schema';
import { fieldsOf } from '@/components/form/server-errors';
import { rideClasses, rideClassLabel, rideStatuses } from '@/features/rides/schema';

/**
 * The status rule the server applies, checked here first so the message appears before a round trip:
 * a ride that is not plainly in service says why. Same wording as the server's.
 */
export function requireReasonOutOfService(
  v: { status?: string; statusReason?: string | null },
  ctx: z.RefinementCtx,
): void {
  if (v.status && v.status !== 'in_service' && !v.statusReason)
    ctx.addIssue({
      code: 'custom',
      path: ['statusReason'],
      message: 'Say why the ride is restricted or out of service',
    });
}

/**
 * The API's own ride schema with the status rule. Editing uses it too: the status fields then hold the
 * ride's current status (valid already) and are not shown; status has its own form, with its reason.
 */
export const rideFormSchema = rideInputSchema.superRefine(requireReasonOutOfService);

export type RideFormInput = z.input<typeof rideFormSchema>;

/** A new ride's starting values: a pendulum swing, in service, with nothing else filled in. */
export const blankRide: RideFormInput = {
  name: '',
  rideClass: 'pendulum_swing',
  description: '',
  maker: '',
  model: '',
  serial: '',
  year: null,
  siteId: null,
  operatorCompanyId: '',
  status: 'in_service',
  statusReason: '',
};
type RideFormOutput = z.output<typeof rideFormSchema>;

export type Option = { value: string; label: string; hint?: string; operatorId?: string };

const FIELDS = [
  'name',
  'rideClass',
  'description',
  'maker',
  'model',
  'serial',
  'year',
  'siteId',
  'operatorCompanyId',
  'status',
  'statusReason',
  'statusSince',
] as const;

const NO_SITE = '__none';

/**
 * A ride's identity, place and (for a new ride) its starting status. The form only validates and hands
 * the values on; the screen saves them. A refused save puts each of the server's problems next to its
 * field.
 */
export function RideForm({
  mode,
  defaultValues,
  operators,
  sites,
  onSubmit,
  onCancel,
}: {
  mode: 'create' | 'edit';
  defaultValues: RideFormInput;
  operators: Option[];
  sites: Option[];
  onSubmit: (values: RideFormOutput) => Promise<unknown>;
  onCancel?: () => void;
}) {
  const { control, handleSubmit, setError, formState, setValue } = useForm<
    RideFormInput,
    unknown,
    RideFormOutput
  >({
    resolver: zodResolver(rideFormSchema),
    defaultValues,
  });
  const operatorId = useWatch({ control, name: 'operatorCompanyId' });
  const status = useWatch({ control, name: 'status' });

  const save = useServerSubmit({ handleSubmit, setError, formState }, onSubmit, fieldsOf(FIELDS), {
    operatorCompanyId: 'Operator',
    siteId: 'Site',
  });

  // A site belongs to one operator: offer that operator's sites only.
  const siteOptions = [
    { value: NO_SITE, label: 'No site (travelling or in store)' },
    ...sites.filter((s) => !operatorId || s.operatorId === operatorId),
  ];

  return (
    <View style={styles.form}>
      <FormText control={control} name="name" label="Name" />
      <FormChoice
        control={control}
        name="rideClass"
        label="Ride class"
        options={rideClasses.map((c) => ({ value: c, label: rideClassLabel[c] }))}
      />
      <FormText
        control={control}
        name="description"
        label="Description"
        hint="One line, as people name it."
      />
      <MakerFields control={control} />
      <FormSelect
        control={control}
        name="operatorCompanyId"
        label="Operator"
        options={operators}
        placeholder="Choose the operator company"
        onChosen={(v) => {
          const site = sites.find((s) => s.value === defaultValues.siteId);
          if (site && site.operatorId !== v) setValue('siteId', null);
        }}
      />
      <Controller
        control={control}
        name="siteId"
        render={({ field, fieldState }) => (
          <SelectField
            label="Site"
            value={field.value ?? NO_SITE}
            options={siteOptions}
            onChange={(v) => field.onChange(v === NO_SITE ? null : v)}
            error={fieldState.error?.message}
          />
        )}
      />
      {mode === 'create' ? <StartingStatus control={control} status={status} /> : null}
      <FormFooter
        save={save}
        submitLabel={mode === 'create' ? 'Add ride' : 'Save changes'}
        onCancel={onCancel}
      />
    </View>
  );
}

type RideFormControl = Control<RideFormInput, unknown, RideFormOutput>;

/** Maker, model, serial number and year, two to a row where there is room. */
function MakerFields({ control }: { control: RideFormControl }) {
  return (
    <>
      <View style={styles.pair}>
        <View style={styles.half}>
          <FormText control={control} name="maker" label="Maker" />
        </View>
        <View style={styles.half}>
          <FormText control={control} name="model" label="Model" />
        </View>
      </View>
      <View style={styles.pair}>
        <View style={styles.half}>
          <FormText control={control} name="serial" label="Serial number" autoCapitalize="none" />
        </View>
        <View style={styles.half}>
          <FormNumber control={control} name="year" label="Year built" integer />
        </View>
      </View>
    </>
  );
}

/** A new ride's starting status, and why when it does not start in service. */
function StartingStatus({ control, status }: { control: RideFormControl; status: RideFormInput['status'] }) {
  return (
    <>
      <Controller
        control={control}
        name="status"
        render={({ field, fieldState }) => (
          <ChoiceChips
            label="Status"
            value={field.value ?? 'in_service'}
            options={rideStatuses.map((s) => ({ value: s, label: rideStatusLabel(s) }))}
            onChange={field.onChange}
            error={fieldState.error?.message}
          />
        )}
      />
      {status && status !== 'in_service' ? (
        <FormText control={control} name="statusReason" label="Reason for the status" multiline />
      ) : null}
    </>
  );
}

const styles = StyleSheet.create({
  form: { gap: space.lg },
  pair: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md },
  half: { flexGrow: 1, flexBasis: 220, minWidth: 0 },
});
