import { zodResolver } from '@hookform/resolvers/zod';
import {
  type Control,
  Controller,
  type FieldErrors,
  useFieldArray,
  useForm,
  useWatch,
} from 'react-hook-form';
import { StyleSheet, View } from 'react-native';
import { z } from 'zod';

import { Button } from '@/components/button';
import { CheckField } from '@/components/check-field';
import { IconButton } from '@/components/icon-button';
import { SelectField } from '@/components/select-field';
import { Text } from '@/components/text';
import { colors, radius, space } from '@/components/theme';
import { useWide } from '@/components/use-wide';
import { ChecklistLimitField } from '@/features/registry/checklist-limit-field';
import { FormText } from '@/components/form/fields';
import { FormFooter, useServerSubmit } from '@/components/form/footer';
import {
  type ChecklistContent,
  type MeasurementKind,
  checklistTemplateCreateSchema,
  checklistTemplatePutSchema,
  generalTemplateLabel,
  inspectionTypeLabel,
  inspectionTypeSchema,
  inspectionTypes,
  measurementKinds,
} from '@/features/registry/schema';
import { FormSelect } from '@/components/form/choices';
import { fieldsOf } from '@/components/form/server-errors';
import { useUnitSystem } from '@/features/settings';

/**
 * The API's PUT schema (content and reason), with the name the create schema requires and the type as a
 * choice (`general` for the class's checklist for any type, sent as null).
 */
export const checklistFormSchema = checklistTemplatePutSchema.omit({ basedOnVersion: true }).extend({
  name: checklistTemplateCreateSchema.shape.name,
  inspectionType: z.union([inspectionTypeSchema, z.literal('general')], {
    error: 'Choose a type, or any type',
  }),
});
export type ChecklistFormInput = z.input<typeof checklistFormSchema>;
type ChecklistFormOutput = z.output<typeof checklistFormSchema>;

export const measurementKindLabel: Record<MeasurementKind, string> = {
  lengthSmall: 'Small length (mm or in): pins, clearances, wear',
  length: 'Length (m or ft)',
  angle: 'Angle',
  rate: 'Speed (rpm)',
  time: 'Time',
  moment: 'Torque',
  force: 'Force',
  mass: 'Mass',
  accel: 'Acceleration (g)',
  pressure: 'Pressure',
  frequency: 'Frequency',
  count: 'A number with its own label',
};

/** A stored template's content as the form edits it; ids stay so inspections keep pointing at items. */
export function contentToForm(content: ChecklistContent): ChecklistFormInput['content'] {
  return {
    areas: content.areas.map((a) => ({
      id: a.id,
      title: a.title,
      items: a.items.map((i) => ({
        id: i.id,
        text: i.text,
        guidance: i.guidance ?? '',
        photoRequired: i.photoRequired,
        measurementRequired: i.measurementRequired,
        measurementKind: i.measurementKind,
        measurementLabel: i.measurementLabel ?? '',
        limit: i.limit ?? null,
      })),
    })),
  };
}

const newItem = () => ({
  text: '',
  guidance: '',
  photoRequired: false,
  measurementRequired: false,
  measurementKind: null,
  measurementLabel: '',
});

/** A limit's own problem or the first of its fields' (the schema names `limit.max` for a bad range). */
function limitError(e: unknown): string | undefined {
  const parsed = z
    .object({
      message: z.string().optional(),
      max: z.object({ message: z.string().optional() }).optional(),
      min: z.object({ message: z.string().optional() }).optional(),
    })
    .safeParse(e);
  return parsed.success
    ? (parsed.data.message ?? parsed.data.max?.message ?? parsed.data.min?.message)
    : undefined;
}

/** The message of an array-level problem, set by the schema (`message`) or by the server (`root`). */
function listError(e: unknown): string | undefined {
  const parsed = z
    .object({ message: z.string().optional(), root: z.object({ message: z.string().optional() }).optional() })
    .safeParse(e);
  return parsed.success ? (parsed.data.message ?? parsed.data.root?.message) : undefined;
}

/**
 * A template's areas and items: add, remove and reorder them, set "photo required" and "measurement
 * required" (with what is measured). Saving makes a new version, so it asks why.
 */
export function ChecklistForm({
  defaultValues,
  submitLabel,
  onSubmit,
  onCancel,
}: {
  defaultValues: ChecklistFormInput;
  submitLabel: string;
  onSubmit: (values: ChecklistFormOutput) => Promise<unknown>;
  onCancel?: () => void;
}) {
  const { control, handleSubmit, setError, formState } = useForm<
    ChecklistFormInput,
    unknown,
    ChecklistFormOutput
  >({
    resolver: zodResolver(checklistFormSchema),
    defaultValues,
  });
  const wide = useWide();
  const areas = useFieldArray({ control, name: 'content.areas', keyName: 'fieldKey' });
  const save = useServerSubmit(
    { handleSubmit, setError, formState },
    onSubmit,
    fieldsOf(['name', 'inspectionType', 'reason'], ['content']),
    {
      content: 'Content',
      areas: 'Area',
      items: 'Item',
    },
  );
  const areasError = listError(formState.errors.content?.areas);
  return (
    <View style={styles.form}>
      <FormText control={control} name="name" label="Template name" />
      <FormSelect
        control={control}
        name="inspectionType"
        label="Inspection type"
        options={[
          { value: 'general', label: generalTemplateLabel },
          ...inspectionTypes.map((t) => ({ value: t, label: inspectionTypeLabel[t] })),
        ]}
      />
      <Text variant="small" muted>
        A phone takes the ride class&apos;s checklist for the inspection&apos;s type, else the general one.
        Operators&apos; daily checks use the daily pre-opening checklist, never the general one.
      </Text>
      {areas.fields.map((area, a) => (
        <View key={area.fieldKey} style={styles.area}>
          <View style={wide ? styles.areaHead : styles.itemStack}>
            <View style={wide ? styles.flex : undefined}>
              <FormText control={control} name={`content.areas.${a}.title`} label={`Area ${a + 1}`} />
            </View>
            <View style={styles.tools}>
              <IconButton
                icon="arrow-up"
                label={`Move area ${a + 1} up`}
                disabled={a === 0}
                onPress={() => areas.move(a, a - 1)}
              />
              <IconButton
                icon="arrow-down"
                label={`Move area ${a + 1} down`}
                disabled={a === areas.fields.length - 1}
                onPress={() => areas.move(a, a + 1)}
              />
              <IconButton
                icon="trash-2"
                tone="danger"
                label={`Remove area ${a + 1}`}
                onPress={() => areas.remove(a)}
              />
            </View>
          </View>
          <ItemsEditor control={control} area={a} errors={formState.errors} />
        </View>
      ))}
      {areasError ? <Text color={colors.danger}>{areasError}</Text> : null}
      <Button
        label="Add an area"
        tone="quiet"
        onPress={() => areas.append({ title: '', items: [newItem()] })}
        style={styles.start}
      />
      <FormText
        control={control}
        name="reason"
        label="Why this change"
        hint="Kept with the new version, e.g. “Added the restraint lock check after the maker’s bulletin”."
        multiline
      />
      <FormFooter save={save} submitLabel={submitLabel} tone="accent" onCancel={onCancel} />
    </View>
  );
}

function ItemsEditor({
  control,
  area,
  errors,
}: {
  control: Control<ChecklistFormInput>;
  area: number;
  errors: FieldErrors<ChecklistFormInput>;
}) {
  const wide = useWide();
  const [system] = useUnitSystem();
  const items = useFieldArray({ control, name: `content.areas.${area}.items`, keyName: 'fieldKey' });
  const values = useWatch({ control, name: `content.areas.${area}.items` });
  const itemsError = listError(errors.content?.areas?.[area]?.items);
  return (
    <View style={styles.items}>
      {items.fields.map((item, i) => {
        const base = `content.areas.${area}.items.${i}` as const;
        const measured = !!values?.[i]?.measurementRequired;
        const label = `item ${i + 1} of area ${area + 1}`;
        return (
          <View key={item.fieldKey} style={styles.item}>
            <View style={wide ? styles.itemRow : styles.itemStack}>
              <View style={wide ? styles.flex : undefined}>
                <FormText control={control} name={`${base}.text`} label={`Item ${i + 1}`} multiline={!wide} />
              </View>
              <View style={styles.tools}>
                <IconButton
                  icon="arrow-up"
                  label={`Move ${label} up`}
                  disabled={i === 0}
                  onPress={() => items.move(i, i - 1)}
                />
                <IconButton
                  icon="arrow-down"
                  label={`Move ${label} down`}
                  disabled={i === items.fields.length - 1}
                  onPress={() => items.move(i, i + 1)}
                />
                <IconButton
                  icon="x"
                  tone="danger"
                  label={`Remove ${label}`}
                  onPress={() => items.remove(i)}
                />
              </View>
            </View>
            <ItemFlags control={control} base={base} />
            {measured ? <MeasurementFields control={control} base={base} wide={wide} /> : null}
            {measured ? (
              <Controller
                control={control}
                name={`${base}.limit`}
                render={({ field, fieldState }) => (
                  <ChecklistLimitField
                    value={field.value}
                    onChange={field.onChange}
                    kind={values?.[i]?.measurementKind}
                    system={system}
                    error={limitError(fieldState.error)}
                  />
                )}
              />
            ) : null}
          </View>
        );
      })}
      {itemsError ? <Text color={colors.danger}>{itemsError}</Text> : null}
      <Button label="Add an item" tone="quiet" onPress={() => items.append(newItem())} style={styles.start} />
    </View>
  );
}

type ItemPath = `content.areas.${number}.items.${number}`;

/** Whether the item needs a photo, a measurement, or both. */
function ItemFlags({ control, base }: { control: Control<ChecklistFormInput>; base: ItemPath }) {
  return (
    <View style={styles.flags}>
      <Controller
        control={control}
        name={`${base}.photoRequired`}
        render={({ field }) => (
          <CheckField label="Photo required" icon="camera" value={!!field.value} onChange={field.onChange} />
        )}
      />
      <Controller
        control={control}
        name={`${base}.measurementRequired`}
        render={({ field }) => (
          <CheckField
            label="Measurement required"
            icon="crosshair"
            value={!!field.value}
            onChange={field.onChange}
          />
        )}
      />
    </View>
  );
}

/** For a measured item: what is measured, and the label its reading carries. */
function MeasurementFields({
  control,
  base,
  wide,
}: {
  control: Control<ChecklistFormInput>;
  base: ItemPath;
  wide: boolean;
}) {
  return (
    <View style={wide ? styles.itemRow : styles.itemStack}>
      <View style={wide ? styles.flex : undefined}>
        <Controller
          control={control}
          name={`${base}.measurementKind`}
          render={({ field, fieldState }) => (
            <SelectField
              label="What is measured"
              value={field.value ?? null}
              options={measurementKinds.map((k) => ({ value: k, label: measurementKindLabel[k] }))}
              onChange={field.onChange}
              error={fieldState.error?.message}
            />
          )}
        />
      </View>
      <View style={wide ? styles.flex : undefined}>
        <FormText
          control={control}
          name={`${base}.measurementLabel`}
          label="Reading label"
          hint="e.g. “pin Ø, two stations × two directions”"
        />
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  form: { gap: space.lg },
  flex: { flex: 1, minWidth: 0 },
  start: { alignSelf: 'flex-start' },
  area: {
    gap: space.md,
    borderWidth: 1,
    borderColor: colors.border,
    borderRadius: radius.lg,
    padding: space.md,
    backgroundColor: colors.bg,
  },
  areaHead: { flexDirection: 'row', alignItems: 'flex-end', gap: space.sm, flexWrap: 'wrap' },
  tools: { flexDirection: 'row', gap: space.xs },
  items: { gap: space.sm },
  item: {
    gap: space.xs,
    backgroundColor: colors.surface,
    borderRadius: radius.md,
    borderWidth: 1,
    borderColor: colors.surfaceSunk,
    padding: space.md,
  },
  itemRow: { flexDirection: 'row', alignItems: 'flex-end', gap: space.sm },
  itemStack: { gap: space.sm },
  flags: { flexDirection: 'row', flexWrap: 'wrap', columnGap: space.xl },
});
