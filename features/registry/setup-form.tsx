import { zodResolver } from '@hookform/resolvers/zod';
import { useForm, useWatch } from 'react-hook-form';
import { StyleSheet, View } from 'react-native';
import { z } from 'zod';

import { FormDate } from '@/components/form/date';
import { FormSelect } from '@/components/form/choices';
import { FormText } from '@/components/form/fields';
import { FormFooter, useServerSubmit } from '@/components/form/footer';
import { fieldsOf } from '@/components/form/server-errors';
import { space } from '@/components/theme';
import { setupDatesInOrder, setupFieldsSchema, type SiteEvent } from '@/features/registry/schema';
import { formatDate } from '@/lib/dates';

const NONE = '__none';
/** The select fields' "none" choice stands for null in the API. */
const noneAsNull = <T extends z.ZodType>(schema: T) => z.preprocess((v) => (v === NONE ? null : v), schema);

export const setupFormSchema = setupFieldsSchema
  .extend({
    eventId: noneAsNull(setupFieldsSchema.shape.eventId),
    assignedTo: noneAsNull(setupFieldsSchema.shape.assignedTo),
  })
  .superRefine(setupDatesInOrder);
type SetupFormInput = z.input<typeof setupFormSchema>;
type SetupFormOutput = z.output<typeof setupFormSchema>;

/**
 * A ride's next build-up: where (a site, and the event there when it is a shared ground), the build-up and
 * pull-down days, the pitch, and who does the set-up inspection.
 */
export function SetupForm({
  sites,
  events,
  inspectors,
  onSubmit,
  onCancel,
}: {
  sites: { id: string; name: string }[];
  events: SiteEvent[];
  inspectors: { id: string; name: string }[];
  onSubmit: (values: SetupFormOutput) => Promise<unknown>;
  onCancel: () => void;
}) {
  const { control, handleSubmit, setError, setValue, formState } = useForm<
    SetupFormInput,
    unknown,
    SetupFormOutput
  >({
    resolver: zodResolver(setupFormSchema),
    defaultValues: { siteId: '', eventId: NONE, fromDate: '', toDate: '', pitch: '', assignedTo: NONE },
  });
  const save = useServerSubmit(
    { handleSubmit, setError, formState },
    onSubmit,
    fieldsOf(['siteId', 'eventId', 'fromDate', 'toDate', 'pitch', 'assignedTo']),
  );
  const siteId = useWatch({ control, name: 'siteId' });
  const here = events.filter((e) => e.siteId === siteId);
  const choose = (eventId: string) => {
    const event = here.find((e) => e.id === eventId);
    if (!event) return;
    setValue('fromDate', event.fromDate);
    setValue('toDate', event.toDate);
  };
  return (
    <View style={styles.form}>
      <FormSelect
        control={control}
        name="siteId"
        label="Site"
        options={sites.map((s) => ({ value: s.id, label: s.name }))}
        onChosen={() => setValue('eventId', NONE)}
      />
      {here.length > 0 ? (
        <FormSelect
          control={control}
          name="eventId"
          label="Event"
          options={[
            { value: NONE, label: 'No event' },
            ...here.map((e) => ({
              value: e.id,
              label: `${e.name} (${formatDate(e.fromDate)} – ${formatDate(e.toDate)})`,
            })),
          ]}
          onChosen={choose}
        />
      ) : null}
      <View style={styles.row}>
        <View style={styles.cell}>
          <FormDate control={control} name="fromDate" label="Build-up" />
        </View>
        <View style={styles.cell}>
          <FormDate control={control} name="toDate" label="Pull-down" />
        </View>
      </View>
      <FormText control={control} name="pitch" label="Pitch or place on the site" />
      <FormSelect
        control={control}
        name="assignedTo"
        label="Set-up inspection by"
        options={[
          { value: NONE, label: 'Not assigned yet' },
          ...inspectors.map((i) => ({ value: i.id, label: i.name })),
        ]}
      />
      <FormFooter save={save} submitLabel="Plan set-up" onCancel={onCancel} />
    </View>
  );
}

const styles = StyleSheet.create({
  form: { gap: space.md },
  row: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md },
  cell: { flexGrow: 1, flexBasis: 160, minWidth: 0 },
});
