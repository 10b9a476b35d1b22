import * as DocumentPicker from 'expo-document-picker';
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { Spinner } from '@/components/spinner';
import { DateField } from '@/components/date-field';
import { Button } from '@/components/button';
import { Card } from '@/components/card';
import { FormAlert, type FormProblem } from '@/components/form-alert';
import { ProgressBar } from '@/components/progress-bar';
import { Segmented } from '@/components/segmented';
import { SubScreen } from '@/components/sub-screen';
import { Text } from '@/components/text';
import { TextField } from '@/components/text-field';
import { colors, space } from '@/components/theme';
import { RoleGate } from '@/features/auth/ui';
import { useLogDayMutation, useLogImportMutation, useRunningLogQuery } from '@/features/pivot-life/api';
import { cyclesText } from '@/features/pivot-life/life-words';
import { RUNNING_LOG_CSV_COLUMNS, parseRunningLogCsv } from '@/features/pivot-life/running-log-csv';
import type { RunningLogResponse } from '@/features/pivot-life/running-log-schema';
import { runningLogEntrySchema, type RunningLogRow } from '@/features/pivot-life/schema';
import { readPickedFile, RideNotFound, useRideIdParam } from '@/features/registry/ui';
import { rideHref } from '@/features/rides';
import { ApiRequestError } from '@/lib/api-errors';
import { formatDate, localDay } from '@/lib/dates';
import { formatSignificant } from '@/lib/units';

type Amount = 'cycles' | 'hours';
type FieldErrors = Partial<Record<'day' | 'cycles' | 'hours' | 'note', string>>;

/** A CSV of a year of days is a few kB; anything past this is not a running log. */
const MAX_CSV_BYTES = 1024 * 1024;

/**
 * The ride's running log, for its operator (and staff): type a day's ride cycles or hours, import a CSV
 * file of days, and see the log newest first with its totals. A day entered again replaces the old entry.
 * Phone-first: one column, big fields, the save button under the thumb.
 */
export function RunningLogScreen() {
  const id = useRideIdParam();
  return (
    <RoleGate roles={['admin', 'supervisor', 'inspector', 'operator']}>
      {() => <RunningLog rideId={id} />}
    </RoleGate>
  );
}

function RunningLog({ rideId }: { rideId: string }) {
  const log = useRunningLogQuery(rideId);
  const back = { href: rideHref(rideId), label: 'Ride' };
  if (log.error instanceof ApiRequestError && log.error.status === 404) return <RideNotFound back={back} />;
  return (
    <SubScreen title="Running log" subtitle={log.data?.rideName} back={back}>
      <View style={styles.column}>
        <DayForm rideId={rideId} log={log.data} />
        <ImportCard rideId={rideId} />
        {log.isPending ? (
          <Spinner color={colors.base} />
        ) : log.data ? (
          <LogList log={log.data} />
        ) : (
          <Card role="alert">
            <Text muted>The running log could not be loaded.</Text>
          </Card>
        )}
      </View>
    </SubScreen>
  );
}

function amountOf(e: Pick<RunningLogRow, 'cycles' | 'hours'>): string {
  const parts: string[] = [];
  if (e.cycles !== undefined) parts.push(`${cyclesText(e.cycles)} cycles`);
  if (e.hours !== undefined) parts.push(`${formatSignificant(e.hours, 3)} h`);
  return parts.join(' · ');
}

function fieldErrorsOf(issues: readonly { path: string; message: string }[]): FieldErrors {
  const out: FieldErrors = {};
  for (const i of issues) {
    const key = i.path.split('.')[0] as keyof FieldErrors;
    if (['day', 'cycles', 'hours', 'note'].includes(key) && !out[key]) out[key] = i.message;
  }
  return out;
}

function DayForm({ rideId, log }: { rideId: string; log: RunningLogResponse | undefined }) {
  const save = useLogDayMutation(rideId);
  const [day, setDay] = useState(localDay());
  const [amount, setAmount] = useState<Amount>('cycles');
  const [value, setValue] = useState('');
  const [note, setNote] = useState('');
  const [errors, setErrors] = useState<FieldErrors>({});
  const [problem, setProblem] = useState<FormProblem | null>(null);
  const [saved, setSaved] = useState<string | null>(null);
  const existing = log?.entries.find((e) => e.day === day.trim());

  const submit = async () => {
    setSaved(null);
    setProblem(null);
    const number = value.trim() === '' ? undefined : Number(value.trim().replace(',', '.'));
    const parsed = runningLogEntrySchema.safeParse({
      day: day.trim(),
      [amount]: number,
      note: note.trim() === '' ? undefined : note,
    });
    if (!parsed.success) {
      const found = fieldErrorsOf(
        parsed.error.issues.map((i) => ({ path: i.path.join('.'), message: i.message })),
      );
      // The schema names the cycles when neither is given; the field on screen is the one chosen.
      setErrors(
        found.cycles && amount === 'hours' ? { ...found, hours: found.cycles, cycles: undefined } : found,
      );
      return;
    }
    setErrors({});
    try {
      const res = await save.mutateAsync(parsed.data);
      setSaved(
        `${res.replaced ? 'Replaced' : 'Saved'} ${formatDate(res.entry.day)}: ${amountOf(res.entry)}.`,
      );
      setValue('');
      setNote('');
    } catch (err) {
      if (err instanceof ApiRequestError) {
        setErrors(fieldErrorsOf(err.issues));
        setProblem({ message: err.message });
      } else setProblem({ message: 'The day could not be saved. Check the connection and try again.' });
    }
  };

  return (
    <Card accessibilityLabel="Log a day">
      <Text variant="heading">Log a day</Text>
      <DateField
        label="Day"
        value={day || null}
        onChange={(v) => setDay(v ?? '')}
        error={errors.day}
        hint={existing ? `Already logged: ${amountOf(existing)}. Saving replaces it.` : undefined}
      />
      <Segmented
        label="Log the day as"
        value={amount}
        options={[
          { value: 'cycles', label: 'Ride cycles' },
          { value: 'hours', label: 'Hours run' },
        ]}
        onChange={(v) => {
          setAmount(v);
          setErrors({});
        }}
      />
      <TextField
        label={amount === 'cycles' ? 'Ride cycles run' : 'Hours run'}
        value={value}
        onChangeText={setValue}
        inputMode={amount === 'cycles' ? 'numeric' : 'decimal'}
        unit={amount === 'cycles' ? 'cycles' : 'h'}
        error={amount === 'cycles' ? errors.cycles : errors.hours}
        hint={
          amount === 'hours' && log?.totals.rideCycleS
            ? `Counted at one ride cycle per ${formatSignificant(log.totals.rideCycleS, 3)} s of running.`
            : undefined
        }
      />
      <TextField
        label="Note (optional)"
        value={note}
        onChangeText={setNote}
        maxLength={200}
        error={errors.note}
      />
      <FormAlert problem={problem} />
      {saved ? (
        <Text role="status" color={colors.within}>
          ✓ {saved}
        </Text>
      ) : null}
      <Button label="Save day" onPress={submit} busy={save.isPending} style={styles.primary} />
    </Card>
  );
}

/**
 * Where an import of a running-log file stands: reading the picked file on this device, then the server
 * checking and saving it whole (one request, so the bar moves by step, with the days counted as read).
 */
export type LogImportPhase = { step: 'reading' } | { step: 'saving'; days: number | null };

/** The file's days as this device reads them (the server's reader is the same); null if it cannot. */
export function logDaysIn(text: string): number | null {
  const read = parseRunningLogCsv(text.replace(/^\uFEFF/, ''), localDay());
  return read.ok ? read.entries.length : null;
}

export function logImportText(phase: LogImportPhase): string {
  if (phase.step === 'reading') return 'Reading the file (step 1 of 2)';
  const what = phase.days === null ? 'the file' : `${phase.days} day${phase.days === 1 ? '' : 's'}`;
  return `The server is checking and saving ${what} (step 2 of 2)`;
}

function ImportCard({ rideId }: { rideId: string }) {
  const upload = useLogImportMutation(rideId);
  const [problem, setProblem] = useState<FormProblem | null>(null);
  const [done, setDone] = useState<string | null>(null);
  const [phase, setPhase] = useState<LogImportPhase | null>(null);

  const pick = async () => {
    setProblem(null);
    setDone(null);
    const res = await DocumentPicker.getDocumentAsync({
      type: ['.csv', 'text/csv', 'text/plain'],
      copyToCacheDirectory: true,
      multiple: false,
    });
    if (res.canceled || !res.assets?.[0]) return;
    const asset = res.assets[0];
    if (asset.size && asset.size > MAX_CSV_BYTES) {
      setProblem({ message: `${asset.name} is larger than 1 MB: that is not a running log.` });
      return;
    }
    let text: string;
    setPhase({ step: 'reading' });
    try {
      text = await readPickedFile(asset);
    } catch {
      setPhase(null);
      setProblem({ message: `${asset.name} could not be read.` });
      return;
    }
    setPhase({ step: 'saving', days: logDaysIn(text) });
    try {
      const r = await upload.mutateAsync(text).finally(() => setPhase(null));
      setDone(
        `${asset.name}: ${r.saved} ${r.saved === 1 ? 'day' : 'days'} saved${r.replaced ? `, ${r.replaced} of them replacing days already logged` : ''}.`,
      );
    } catch (err) {
      setProblem(
        err instanceof ApiRequestError
          ? { message: err.message, details: err.issues.map((i) => i.message) }
          : { message: 'The file could not be sent. Check the connection and try again.' },
      );
    }
  };

  return (
    <Card accessibilityLabel="Import a CSV file">
      <Text variant="heading">Import a CSV file</Text>
      <Text variant="small" muted>
        One row per day under a header row {RUNNING_LOG_CSV_COLUMNS.join(',')} (cycles or hours, or both; the
        note is optional). A file with any problem saves nothing; days already logged are replaced.
      </Text>
      <FormAlert problem={problem} />
      {done ? (
        <Text role="status" color={colors.within}>
          ✓ {done}
        </Text>
      ) : null}
      {phase ? (
        <ProgressBar
          label="Importing the running log"
          value={phase.step === 'reading' ? 0 : 1}
          max={2}
          valueText={logImportText(phase)}
          caption={false}
        />
      ) : null}
      <Button
        label="Choose a CSV file"
        tone="quiet"
        onPress={pick}
        busy={phase !== null || upload.isPending}
      />
    </Card>
  );
}

function LogList({ log }: { log: RunningLogResponse }) {
  const t = log.totals;
  return (
    <Card accessibilityLabel="The log">
      <Text variant="heading">The log</Text>
      {log.entries.length === 0 ? (
        <Text muted>Nothing logged yet. Each day’s ride cycles feed the pivots’ fatigue life.</Text>
      ) : (
        <>
          <Text variant="small" muted>
            {t.days} {t.days === 1 ? 'day' : 'days'}
            {t.rideCycles !== null ? ` · ${cyclesText(t.rideCycles)} ride cycles` : ''}
            {t.cyclesPerDay !== null
              ? ` · ${formatSignificant(t.cyclesPerDay, 3)} a day over the last 90 days`
              : ''}
            {t.hours > 0 ? ` · ${formatSignificant(t.hours, 4)} h logged as hours` : ''}
          </Text>
          {log.entries.map((e) => (
            <View key={e.id} style={styles.row} accessibilityLabel={`Logged ${e.day}`}>
              <View style={styles.rowMain}>
                <Text variant="figure">{formatDate(e.day)}</Text>
                <Text variant="figure">{amountOf(e)}</Text>
              </View>
              <Text variant="small" muted>
                {e.note ? `${e.note} · ` : ''}
                {e.enteredByName}
                {e.source === 'csv' ? ' · from a CSV file' : ''}
              </Text>
            </View>
          ))}
        </>
      )}
    </Card>
  );
}

const styles = StyleSheet.create({
  column: { gap: space.lg, maxWidth: 640, width: '100%' },
  primary: { alignSelf: 'stretch' },
  row: { paddingVertical: space.sm, borderTopWidth: 1, borderTopColor: colors.surfaceSunk, gap: 2 },
  rowMain: { flexDirection: 'row', justifyContent: 'space-between', gap: space.md, flexWrap: 'wrap' },
});
