import { useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { DateField } from '@/components/date-field';
import { Button } from '@/components/button';
import { Card } from '@/components/card';
import { CheckField } from '@/components/check-field';
import { ChoiceChips } from '@/components/choice-chips';
import { Text } from '@/components/text';
import { TextField } from '@/components/text-field';
import { ToggleChips } from '@/components/toggle-chips';
import { colors, space } from '@/components/theme';
import { useInstrumentSaveMutation } from '@/features/instruments/api';
import { DeleteAction } from '@/features/registry/ui';
import { type Instrument, instrumentMethods, readingMethodWords } from '@/features/instruments/schema';
import { type ReadingKind, readingKinds, readingKindLabel } from '@/features/records/schema';
import { ApiRequestError } from '@/lib/api-errors';

type FormState = {
  name: string;
  serial: string;
  method: (typeof instrumentMethods)[number] | null;
  kinds: ReadingKind[];
  calibratedOn: string;
  calibrationDueOn: string;
  notes: string;
  retired: boolean;
};

const fromInstrument = (i: Instrument | null): FormState => ({
  name: i?.name ?? '',
  serial: i?.serial ?? '',
  method: (i?.method as FormState['method']) ?? null,
  kinds: i?.kinds ?? [],
  calibratedOn: i?.calibratedOn ?? '',
  calibrationDueOn: i?.calibrationDueOn ?? '',
  notes: i?.notes ?? '',
  retired: i ? i.retiredAt !== null : false,
});

/** An admin's form for one instrument: new, or changed (and then retired, or deleted with a confirm). */
export function InstrumentForm({
  id,
  initial,
  onDone,
  onDeleted,
}: {
  id: string | null;
  initial: Instrument | null;
  onDone: () => void;
  /** Told what went, once an instrument is deleted. */
  onDeleted: (message: string) => void;
}) {
  const [form, setForm] = useState<FormState>(() => fromInstrument(initial));
  const save = useInstrumentSaveMutation(id);
  const set = <K extends keyof FormState>(key: K, value: FormState[K]) =>
    setForm((f) => ({ ...f, [key]: value }));
  const issues = save.error instanceof ApiRequestError ? save.error.issues : [];
  const errorOf = (path: string) => issues.find((i) => i.path === path)?.message;
  const onSave = async () => {
    try {
      await save.mutateAsync({
        name: form.name,
        serial: form.serial,
        // Sent as chosen (nothing chosen fails the server's check, which names the field).
        ...(form.method ? { method: form.method } : {}),
        kinds: form.kinds,
        calibratedOn: form.calibratedOn.trim() || null,
        calibrationDueOn: form.calibrationDueOn.trim() || null,
        notes: form.notes,
        retired: form.retired,
      });
      onDone();
    } catch {
      // Shown from save.error.
    }
  };
  return (
    <Card>
      <Text variant="heading">{id ? `Change ${initial?.name ?? 'instrument'}` : 'New instrument'}</Text>
      <TextField
        label="Name"
        value={form.name}
        onChangeText={(v) => set('name', v)}
        error={errorOf('name')}
      />
      <TextField
        label="Serial"
        value={form.serial}
        onChangeText={(v) => set('serial', v)}
        autoCapitalize="characters"
        error={errorOf('serial')}
      />
      <ChoiceChips
        label="Kind of instrument"
        value={form.method}
        options={instrumentMethods.map((m) => ({ value: m, label: readingMethodWords[m] }))}
        onChange={(m) => set('method', m)}
        error={errorOf('method')}
      />
      <MeasuresField values={form.kinds} onChange={(kinds) => set('kinds', kinds)} error={errorOf('kinds')} />
      <View style={styles.dates}>
        <View style={styles.date}>
          <DateField
            label="Calibrated on"
            value={form.calibratedOn || null}
            onChange={(v) => set('calibratedOn', v ?? '')}
            error={errorOf('calibratedOn')}
          />
        </View>
        <View style={styles.date}>
          <DateField
            label="Next calibration due"
            hint="Usable through this date"
            value={form.calibrationDueOn || null}
            min={form.calibratedOn || undefined}
            onChange={(v) => set('calibrationDueOn', v ?? '')}
            error={errorOf('calibrationDueOn')}
          />
        </View>
      </View>
      <TextField
        label="Notes"
        value={form.notes}
        onChangeText={(v) => set('notes', v)}
        multiline
        error={errorOf('notes')}
      />
      {id ? (
        <CheckField
          label="Retired: no longer offered to inspectors (kept for the readings that name it)"
          value={form.retired}
          onChange={(v) => set('retired', v)}
        />
      ) : null}
      {save.error && issues.length === 0 ? (
        <Text role="alert" color={colors.danger}>
          {(save.error as Error).message}
        </Text>
      ) : null}
      <View style={styles.actions}>
        <Button
          label={id ? 'Save changes' : 'Add instrument'}
          tone="accent"
          busy={save.isPending}
          onPress={onSave}
        />
        <Button label="Cancel" tone="quiet" onPress={onDone} />
      </View>
      {id && initial ? (
        <DeleteAction
          kind="instrument"
          id={id}
          noun="instrument"
          name={`${initial.name} (${initial.serial})`}
          consequence={
            'It leaves the register and is no longer offered to inspectors. Readings already taken with it ' +
            'keep their own copy of its name, serial and calibration. To keep it listed, tick Retired ' +
            'instead. The audit log keeps a record.'
          }
          onDeleted={onDeleted}
        />
      ) : null}
    </Card>
  );
}

/** The reading kinds an instrument measures, with the server's complaint about them. */
function MeasuresField({
  values,
  onChange,
  error,
}: {
  values: ReadingKind[];
  onChange: (kinds: ReadingKind[]) => void;
  error: string | undefined;
}) {
  return (
    <View style={styles.group}>
      <Text variant="label" muted>
        MEASURES
      </Text>
      <ToggleChips
        label="Readings it measures"
        values={values}
        options={readingKinds.map((k) => ({ value: k, label: readingKindLabel[k] }))}
        onChange={onChange}
      />
      {error ? (
        <Text variant="small" color={colors.danger}>
          {error}
        </Text>
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  group: { gap: space.sm },
  dates: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md },
  date: { flexGrow: 1, flexBasis: 200 },
  actions: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
});
