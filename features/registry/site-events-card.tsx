import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { StyleSheet, View } from 'react-native';
import type { z } from 'zod';

import { Button } from '@/components/button';
import { Card } from '@/components/card';
import { FormDate } from '@/components/form/date';
import { FormText } from '@/components/form/fields';
import { FormFooter, useServerSubmit } from '@/components/form/footer';
import { fieldsOf } from '@/components/form/server-errors';
import { Spinner } from '@/components/spinner';
import { Text } from '@/components/text';
import { colors, space } from '@/components/theme';
import { setupDatesInOrder, siteEventFieldsSchema } from '@/features/registry/schema';
import { useSiteEventCreateMutation, useSiteEventsQuery } from '@/features/registry/setups-api';
import { formatDate } from '@/lib/dates';

const eventFormSchema = siteEventFieldsSchema.superRefine(setupDatesInOrder);
type EventFormInput = z.input<typeof eventFormSchema>;
type EventFormOutput = z.output<typeof eventFormSchema>;

/**
 * A shared ground's events (a fair, a show): rides of many operators are set up for one. Staff read the
 * ones not yet over; planners add one.
 */
export function SiteEventsCard({ siteId, planner }: { siteId: string; planner: boolean }) {
  const events = useSiteEventsQuery();
  const [adding, setAdding] = useState(false);
  const here = (events.data ?? []).filter((e) => e.siteId === siteId);
  return (
    <Card accessibilityLabel="Events">
      <Text variant="heading">Events</Text>
      {events.isPending ? (
        <Spinner color={colors.base} />
      ) : here.length === 0 ? (
        <Text muted>No events coming. A fair here can host rides of many operators.</Text>
      ) : (
        here.map((e) => (
          <View key={e.id} style={styles.line}>
            <Text variant="heading">{e.name}</Text>
            <Text variant="small" muted>
              {formatDate(e.fromDate)} – {formatDate(e.toDate)}
            </Text>
          </View>
        ))
      )}
      {planner ? (
        adding ? (
          <EventForm siteId={siteId} onDone={() => setAdding(false)} />
        ) : (
          <Button label="Add an event" tone="quiet" onPress={() => setAdding(true)} />
        )
      ) : null}
    </Card>
  );
}

function EventForm({ siteId, onDone }: { siteId: string; onDone: () => void }) {
  const create = useSiteEventCreateMutation();
  const { control, handleSubmit, setError, formState } = useForm<EventFormInput, unknown, EventFormOutput>({
    resolver: zodResolver(eventFormSchema),
    defaultValues: { name: '', fromDate: '', toDate: '' },
  });
  const save = useServerSubmit(
    { handleSubmit, setError, formState },
    async (values: EventFormOutput) => {
      await create.mutateAsync({ ...values, siteId });
      onDone();
    },
    fieldsOf(['name', 'fromDate', 'toDate']),
  );
  return (
    <View style={styles.form}>
      <FormText control={control} name="name" label="Event name" />
      <View style={styles.row}>
        <View style={styles.cell}>
          <FormDate control={control} name="fromDate" label="First day" />
        </View>
        <View style={styles.cell}>
          <FormDate control={control} name="toDate" label="Last day" />
        </View>
      </View>
      <FormFooter save={save} submitLabel="Add event" onCancel={onDone} />
    </View>
  );
}

const styles = StyleSheet.create({
  line: { gap: 2, paddingVertical: space.xs, borderTopWidth: 1, borderTopColor: colors.surfaceSunk },
  form: { gap: space.md },
  row: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md },
  cell: { flexGrow: 1, flexBasis: 160, minWidth: 0 },
});
