import { useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { Spinner } from '@/components/spinner';
import { DateField } from '@/components/date-field';
import { Button } from '@/components/button';
import { Card } from '@/components/card';
import { Caution } from '@/components/caution';
import { ChoiceChips } from '@/components/choice-chips';
import { FormAlert, type FormProblem } from '@/components/form-alert';
import { LabelledLine } from '@/components/labelled-line';
import { ProgressBar } from '@/components/progress-bar';
import { Segmented } from '@/components/segmented';
import { SubScreen } from '@/components/sub-screen';
import { Text } from '@/components/text';
import { TextField } from '@/components/text-field';
import { colors, space } from '@/components/theme';
import { useWide } from '@/components/use-wide';
import { downloadPdf } from '@/features/api/ui';
import { megabytes } from '@/features/documents';
import { pickPdf } from '@/features/documents/ui';
import { RoleGate } from '@/features/auth/ui';
import { ndtMethods, type NdtMethod } from '@/features/loads/design-schema';
import {
  MAX_NDT_REPORT_BYTES,
  ndtReportPath,
  useAddNdtRecordMutation,
  useRideNdtQuery,
} from '@/features/pivot-life/ndt-api';
import {
  NDT_METHOD_WORDS,
  ndtRecordInputSchema,
  ndtResultInfo,
  ndtResults,
  type NdtRecord,
  type NdtResult,
  type RideNdt,
} from '@/features/pivot-life/ndt-schema';
import { NdtRows } from '@/features/pivot-life/ndt-rows';
import { RideNotFound, useRideIdParam } from '@/features/registry/ui';
import { rideHref } from '@/features/rides';
import type { SessionUser } from '@/features/session/schema';
import { ApiRequestError } from '@/lib/api-errors';
import { formatBytes } from '@/lib/bytes';
import { formatDate, localDay } from '@/lib/dates';

type Field = 'joint' | 'testedOn' | 'method' | 'technician' | 'level' | 'result' | 'note' | 'report';
type FieldErrors = Partial<Record<Field, string>>;
type PickedReport = { name: string; bytes: Uint8Array };

const recorders: SessionUser['role'][] = ['inspector', 'supervisor', 'admin'];

/**
 * A ride's NDT: per pivot the tests the design data plans with when each falls due, and the records
 * newest first with their reports. Inspectors, supervisors and admins add a record (with its report PDF);
 * the ride's operator reads. Phone-first: one column, big targets, the add button under the thumb.
 */
export function NdtScreen() {
  const id = useRideIdParam();
  return (
    <RoleGate roles={['admin', 'supervisor', 'inspector', 'operator']}>
      {(user) => <Ndt rideId={id} canAdd={recorders.includes(user.role)} />}
    </RoleGate>
  );
}

function Ndt({ rideId, canAdd }: { rideId: string; canAdd: boolean }) {
  const ndt = useRideNdtQuery(rideId);
  const wide = useWide();
  const back = { href: rideHref(rideId), label: 'Ride' };
  if (ndt.error instanceof ApiRequestError && ndt.error.status === 404) return <RideNotFound back={back} />;
  return (
    <SubScreen title="NDT" subtitle={ndt.data?.rideName} back={back} wideContent>
      <Caution />
      {ndt.isPending ? (
        <Spinner color={colors.base} />
      ) : !ndt.data ? (
        <Card role="alert">
          <Text muted>The ride’s NDT could not be loaded.</Text>
        </Card>
      ) : (
        <View style={[styles.columns, wide && styles.columnsWide]}>
          <View style={[styles.column, wide && styles.main]}>
            <Pivots data={ndt.data} />
          </View>
          {canAdd && ndt.data.pivots.length > 0 ? (
            <View style={[styles.column, wide && styles.side]}>
              <AddRecord data={ndt.data} />
            </View>
          ) : null}
        </View>
      )}
    </SubScreen>
  );
}

function Pivots({ data }: { data: RideNdt }) {
  if (data.pivots.length === 0)
    return (
      <Card>
        <Text muted>This ride has no design data in force, so no pivots and no NDT plans.</Text>
      </Card>
    );
  return (
    <>
      {data.pivots.map((p) => (
        <Card key={p.joint} accessibilityLabel={`NDT at ${p.name}`}>
          <Text variant="heading">{p.name}</Text>
          <Text variant="small" muted>
            Pivot {p.joint} · plans from design data version {data.designVersion}
          </Text>
          <NdtRows due={p.due} asOf={data.asOf} />
          {p.plans.some((plan) => plan.note) ? (
            <View style={styles.notes}>
              {p.plans
                .filter((plan) => plan.note)
                .map((plan) => (
                  <LabelledLine key={plan.method} label={`${plan.method} where`} value={plan.note ?? ''} />
                ))}
            </View>
          ) : null}
          <Records records={p.records} />
        </Card>
      ))}
      {data.otherRecords.length > 0 ? (
        <Card accessibilityLabel="Records at pivots no longer in the design">
          <Text variant="heading">Records at pivots the design data no longer has</Text>
          <Records records={data.otherRecords} />
        </Card>
      ) : null}
    </>
  );
}

function Records({ records }: { records: NdtRecord[] }) {
  if (records.length === 0)
    return (
      <Text variant="small" muted>
        No NDT recorded at this pivot yet.
      </Text>
    );
  return (
    <View style={styles.records} accessibilityLabel="NDT records, newest first">
      <Text variant="label" muted>
        RECORDS, NEWEST FIRST
      </Text>
      {records.map((r) => (
        <RecordRow key={r.id} record={r} />
      ))}
    </View>
  );
}

function RecordRow({ record: r }: { record: NdtRecord }) {
  const [message, setMessage] = useState<string | null>(null);
  const rejectable = r.result === 'rejectable_indications';
  const open = async () => {
    try {
      setMessage(await downloadPdf(ndtReportPath(r.reportSha256 ?? ''), `ndt-${r.method}-${r.testedOn}.pdf`));
    } catch (err) {
      setMessage(err instanceof Error ? err.message : 'The report could not be opened.');
    }
  };
  return (
    <View style={[styles.record, rejectable && styles.recordBad]} testID={`ndt-record-${r.id}`}>
      <Text variant="heading">
        {formatDate(r.testedOn)} · {r.method}
      </Text>
      <Text color={rejectable ? colors.over : undefined}>
        {rejectable ? '✕ ' : '✓ '}
        {ndtResultInfo[r.result].label}
      </Text>
      <Text variant="small">
        {r.technician} · EN ISO 9712 level {r.level}
        {r.createdByName ? ` · recorded by ${r.createdByName}` : ''}
      </Text>
      {r.note ? <Text variant="small">{r.note}</Text> : null}
      {r.reportSha256 ? (
        <Button tone="quiet" label="Report PDF" onPress={open} style={styles.reportButton} />
      ) : null}
      {message ? (
        <Text variant="small" role="status" muted>
          {message}
        </Text>
      ) : null}
    </View>
  );
}

/** Where adding a record stands: its report going up (bytes), then the record itself. */
export type NdtSending = { step: 'report'; sent: number; total: number } | { step: 'record' };

export function ndtSendingText(s: NdtSending, withReport: boolean): string {
  if (s.step === 'report')
    return `Sending the report: ${formatBytes(s.sent)} of ${formatBytes(s.total)} (step 1 of 2)`;
  return withReport ? 'Saving the record (step 2 of 2)' : 'Saving the record';
}

function fieldErrorsOf(issues: readonly { path: string; message: string }[]): FieldErrors {
  const out: FieldErrors = {};
  const fields: Field[] = ['joint', 'testedOn', 'method', 'technician', 'level', 'result', 'note', 'report'];
  for (const i of issues) {
    const key = (i.path.split('.')[0] === 'reportSha256' ? 'report' : i.path.split('.')[0]) as Field;
    if (fields.includes(key) && !out[key]) out[key] = i.message;
  }
  return out;
}

function AddRecord({ data }: { data: RideNdt }) {
  const add = useAddNdtRecordMutation(data.rideId);
  const [joint, setJoint] = useState(String(data.pivots[0].joint));
  const [testedOn, setTestedOn] = useState(localDay());
  const [method, setMethod] = useState<NdtMethod | null>(null);
  const [technician, setTechnician] = useState('');
  const [level, setLevel] = useState<'1' | '2' | '3'>('2');
  const [result, setResult] = useState<NdtResult | null>(null);
  const [note, setNote] = useState('');
  const [report, setReport] = useState<PickedReport | null>(null);
  const [errors, setErrors] = useState<FieldErrors>({});
  const [problem, setProblem] = useState<FormProblem | null>(null);
  const [saved, setSaved] = useState<string | null>(null);
  const [sending, setSending] = useState<NdtSending | null>(null);
  const pivot = data.pivots.find((p) => String(p.joint) === joint);
  const planned = pivot?.plans.map((p) => p.method) ?? [];

  const pick = async () => {
    setErrors((e) => ({ ...e, report: undefined }));
    const picked = await pickPdf(MAX_NDT_REPORT_BYTES);
    if (picked === null) return;
    if ('problem' in picked) setErrors((e) => ({ ...e, report: picked.problem }));
    else setReport(picked);
  };

  const submit = async () => {
    setSaved(null);
    setProblem(null);
    const parsed = ndtRecordInputSchema.omit({ reportSha256: true }).safeParse({
      joint: Number(joint),
      testedOn: testedOn.trim(),
      method: method ?? undefined,
      technician,
      level: Number(level),
      result: result ?? undefined,
      note: note.trim() === '' ? undefined : note,
    });
    if (!parsed.success) {
      setErrors(
        fieldErrorsOf(parsed.error.issues.map((i) => ({ path: i.path.join('.'), message: i.message }))),
      );
      return;
    }
    setErrors({});
    try {
      const bytes = report?.bytes ?? null;
      setSending(bytes ? { step: 'report', sent: 0, total: bytes.length } : { step: 'record' });
      const res = await add
        .mutateAsync({
          input: parsed.data,
          report: bytes,
          onProgress: (sent, total) =>
            // The last byte out: the server still checks and stores the file, then the record goes.
            setSending(sent < total ? { step: 'report', sent, total } : { step: 'record' }),
        })
        .finally(() => setSending(null));
      setSaved(
        `Recorded ${res.record.method} on ${formatDate(res.record.testedOn)}${report ? ' with its report' : ''}.` +
          (res.message ? ` ${res.message}` : ''),
      );
      setTechnician('');
      setNote('');
      setReport(null);
      setResult(null);
    } catch (err) {
      if (err instanceof ApiRequestError) {
        setErrors(fieldErrorsOf(err.issues));
        setProblem({ message: err.message });
      } else setProblem({ message: 'The record could not be saved. Check the connection and try again.' });
    }
  };

  return (
    <Card accessibilityLabel="Add NDT record">
      <Text variant="heading">Add NDT record</Text>
      <ChoiceChips
        label="Pivot"
        value={joint}
        options={data.pivots.map((p) => ({ value: String(p.joint), label: p.name }))}
        onChange={setJoint}
        error={errors.joint}
      />
      <DateField
        label="Tested on"
        value={testedOn || null}
        onChange={(v) => setTestedOn(v ?? '')}
        error={errors.testedOn}
      />
      <ChoiceChips
        label="Method"
        value={method}
        options={ndtMethods.map((m) => ({
          value: m,
          label: `${m} ${planned.includes(m) ? '· planned' : ''}`.trim(),
        }))}
        onChange={setMethod}
        error={errors.method}
      />
      {method && !planned.includes(method) ? (
        <Text variant="small" color={colors.near}>
          △ {NDT_METHOD_WORDS[method]} is not in this pivot’s plan ({planned.join(', ') || 'none planned'}).
          The record is kept; no due date follows from it.
        </Text>
      ) : null}
      <TextField
        label="Technician"
        value={technician}
        onChangeText={setTechnician}
        maxLength={120}
        error={errors.technician}
        autoComplete="name"
      />
      <Text variant="label" muted>
        EN ISO 9712 LEVEL
      </Text>
      <Segmented
        label="EN ISO 9712 level"
        value={level}
        options={[
          { value: '1', label: 'Level 1' },
          { value: '2', label: 'Level 2' },
          { value: '3', label: 'Level 3' },
        ]}
        onChange={setLevel}
      />
      {errors.level ? (
        <Text variant="small" color={colors.over}>
          {errors.level}
        </Text>
      ) : null}
      <ChoiceChips
        label="Result"
        value={result}
        options={ndtResults.map((r) => ({ value: r, label: ndtResultInfo[r].label }))}
        onChange={setResult}
        error={errors.result}
      />
      {result === 'rejectable_indications' ? (
        <Text variant="small" color={colors.over}>
          ✕ A defect: record it as a finding on the ride’s inspection and follow the procedure for stopping
          the ride where it applies.
        </Text>
      ) : null}
      <TextField
        label="Note (optional)"
        value={note}
        onChangeText={setNote}
        maxLength={1000}
        error={errors.note}
        multiline
      />
      <View style={styles.report}>
        <Text variant="label" muted>
          REPORT PDF (OPTIONAL, AT MOST {megabytes(MAX_NDT_REPORT_BYTES)})
        </Text>
        {report ? (
          <Text testID="ndt-report-picked">
            PDF: {report.name} · {formatBytes(report.bytes.length)}
          </Text>
        ) : null}
        <View style={styles.reportActions}>
          <Button tone="quiet" label={report ? 'Choose another PDF' : 'Choose PDF'} onPress={pick} />
          {report ? <Button tone="quiet" label="Remove" onPress={() => setReport(null)} /> : null}
        </View>
        {errors.report ? (
          <Text variant="small" color={colors.over} role="alert">
            {errors.report}
          </Text>
        ) : null}
      </View>
      <FormAlert problem={problem} />
      {saved ? (
        <Text role="status" color={colors.within}>
          ✓ {saved}
        </Text>
      ) : null}
      {sending ? (
        <ProgressBar
          label="Adding the NDT record"
          value={sending.step === 'report' ? sending.sent : 0}
          max={sending.step === 'report' ? sending.total : null}
          valueText={ndtSendingText(sending, report !== null)}
        />
      ) : null}
      <Button label="Add NDT record" onPress={submit} busy={add.isPending} />
    </Card>
  );
}

const styles = StyleSheet.create({
  columns: { gap: space.lg },
  columnsWide: { flexDirection: 'row', alignItems: 'flex-start' },
  column: { gap: space.lg },
  main: { flex: 3 },
  side: { flex: 2 },
  notes: { gap: 2 },
  records: { gap: space.sm, marginTop: space.sm },
  record: { gap: 2, borderTopWidth: 1, borderTopColor: colors.border, paddingTop: space.sm },
  recordBad: { borderLeftWidth: 3, borderLeftColor: colors.over, paddingLeft: space.sm },
  reportButton: { alignSelf: 'flex-start' },
  report: { gap: space.xs },
  reportActions: { flexDirection: 'row', gap: space.sm, flexWrap: 'wrap' },
});
