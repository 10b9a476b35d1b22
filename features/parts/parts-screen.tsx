import { useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { Card } from '@/components/card';
import { ChoiceChips } from '@/components/choice-chips';
import { DateField } from '@/components/date-field';
import { FormAlert, type FormProblem } from '@/components/form-alert';
import { ProgressBar } from '@/components/progress-bar';
import { Spinner } from '@/components/spinner';
import { SubScreen } from '@/components/sub-screen';
import { Text } from '@/components/text';
import { TextField } from '@/components/text-field';
import { colors, space } from '@/components/theme';
import { useWide } from '@/components/use-wide';
import { downloadPdf } from '@/features/api/ui';
import { RoleGate } from '@/features/auth/ui';
import { MAX_DOCUMENT_BYTES, megabytes } from '@/features/documents';
import { documentPath, pickPdf } from '@/features/documents/ui';
import { useAddPartReplacementMutation, useRidePartsQuery, type PartPdf } from '@/features/parts/api';
import { partReplacementInputSchema, type PartReplacement, type RideParts } from '@/features/parts/schema';
import { RideNotFound, useRideIdParam } from '@/features/registry/ui';
import { RideDocumentsCard } from '@/features/registry/ui-rides';
import { rideHref } from '@/features/rides';
import { ApiRequestError } from '@/lib/api-errors';
import { formatBytes } from '@/lib/bytes';
import { formatDate, formatDateTime } from '@/lib/dates';

/**
 * A ride's parts: the part replacements newest first with their certificates, the documents of the
 * design in force, and a form to record a part fitted. The ride's operator (who fits parts) and the
 * inspection body's staff record; rows are only added, a mistake is corrected by a later record.
 * Phone-first: one column, the form behind one button; side by side on a wide screen.
 */
export function PartsScreen() {
  const id = useRideIdParam();
  return (
    <RoleGate roles={['admin', 'supervisor', 'inspector', 'operator']}>
      {() => <Parts rideId={id} />}
    </RoleGate>
  );
}

function Parts({ rideId }: { rideId: string }) {
  const parts = useRidePartsQuery(rideId);
  const wide = useWide();
  const [formOpen, setFormOpen] = useState(false);
  const [correcting, setCorrecting] = useState<PartReplacement | null>(null);
  const back = { href: rideHref(rideId), label: 'Ride' };
  if (parts.error instanceof ApiRequestError && parts.error.status === 404)
    return <RideNotFound back={back} />;
  const correct = (r: PartReplacement) => {
    setCorrecting(r);
    setFormOpen(true);
  };
  return (
    <SubScreen title="Parts" subtitle={parts.data?.rideName} back={back} wideContent>
      {parts.isPending ? (
        <Spinner color={colors.base} />
      ) : !parts.data ? (
        <Card role="alert">
          <Text muted>The ride’s parts could not be loaded.</Text>
        </Card>
      ) : (
        <View style={[styles.columns, wide && styles.columnsWide]}>
          <View style={[styles.column, wide && styles.main]}>
            {!wide && !formOpen ? (
              <Button label="Record a part fitted" onPress={() => setFormOpen(true)} />
            ) : null}
            {!wide && formOpen ? (
              <AddReplacement
                key={correcting?.id ?? 'new'}
                data={parts.data}
                correcting={correcting}
                onClose={() => {
                  setFormOpen(false);
                  setCorrecting(null);
                }}
              />
            ) : null}
            <Replacements data={parts.data} onCorrect={correct} />
            <RideDocumentsCard rideId={rideId} />
          </View>
          {wide ? (
            <View style={[styles.column, styles.side]}>
              <AddReplacement
                key={correcting?.id ?? 'new'}
                data={parts.data}
                correcting={correcting}
                onClose={correcting ? () => setCorrecting(null) : undefined}
              />
            </View>
          ) : null}
        </View>
      )}
    </SubScreen>
  );
}

function Replacements({ data, onCorrect }: { data: RideParts; onCorrect: (r: PartReplacement) => void }) {
  return (
    <Card accessibilityLabel="Part replacements, newest first">
      <Text variant="heading">Part replacements</Text>
      {data.replacements.length === 0 ? (
        <Text variant="small" muted>
          No part replacement recorded on this ride yet.
        </Text>
      ) : (
        <>
          <Text variant="label" muted>
            NEWEST FIRST
          </Text>
          {data.replacements.map((r) => (
            <ReplacementRow key={r.id} record={r} all={data.replacements} onCorrect={() => onCorrect(r)} />
          ))}
        </>
      )}
    </Card>
  );
}

function ReplacementRow({
  record: r,
  all,
  onCorrect,
}: {
  record: PartReplacement;
  all: PartReplacement[];
  onCorrect: () => void;
}) {
  const [message, setMessage] = useState<string | null>(null);
  const corrected = r.correctedById !== null;
  const corrects = r.correctsId ? all.find((x) => x.id === r.correctsId) : undefined;
  const open = async (sha: string, title: string) => {
    try {
      setMessage(
        await downloadPdf(documentPath(sha), `${title.replace(/[^\w.-]+/g, '_') || 'certificate'}.pdf`),
      );
    } catch (err) {
      setMessage(err instanceof Error ? err.message : 'The PDF could not be opened.');
    }
  };
  return (
    <View style={[styles.record, corrected && styles.recordCorrected]} testID={`part-replacement-${r.id}`}>
      <Text variant="heading">
        {r.component}
        {r.pivotName ? ` · ${r.pivotName}` : ''}
      </Text>
      {corrected ? (
        <Text variant="small" color={colors.near}>
          △ Corrected by a later record: read that one.
        </Text>
      ) : null}
      {corrects ? (
        <Text variant="small" color={colors.info}>
          Corrects the record of {formatDate(corrects.fittedOn)} (serial {corrects.serialNumber}).
        </Text>
      ) : null}
      <Text>
        Serial {r.serialNumber} · {r.maker}
      </Text>
      <Text variant="small">
        Fitted {formatDate(r.fittedOn)} by {r.fittedBy}
      </Text>
      {r.replacedSerial ? <Text variant="small">Replaced serial {r.replacedSerial}</Text> : null}
      {r.note ? <Text variant="small">{r.note}</Text> : null}
      <Text variant="small" muted>
        Recorded {formatDateTime(r.createdAt)}
        {r.createdByName ? ` by ${r.createdByName}` : ''}
      </Text>
      {r.documents.map((d) => (
        <View key={d.sha256} style={styles.document}>
          <Text variant="small" style={styles.documentTitle}>
            {d.title}
          </Text>
          {/* A short label that fits a phone; the accessible name says which PDF. */}
          <Button
            tone="quiet"
            label="Open PDF"
            accessibilityLabel={`${d.title} (PDF)`}
            onPress={() => open(d.sha256, d.title)}
          />
        </View>
      ))}
      <View style={styles.actions}>
        <Button tone="quiet" label="Correct this record" onPress={onCorrect} />
      </View>
      {message ? (
        <Text variant="small" role="status" muted>
          {message}
        </Text>
      ) : null}
    </View>
  );
}

type Field =
  | 'component'
  | 'joint'
  | 'serialNumber'
  | 'maker'
  | 'fittedOn'
  | 'fittedBy'
  | 'replacedSerial'
  | 'note'
  | 'documents';
type FieldErrors = Partial<Record<Field, string>>;
const fields: Field[] = [
  'component',
  'joint',
  'serialNumber',
  'maker',
  'fittedOn',
  'fittedBy',
  'replacedSerial',
  'note',
  'documents',
];

function fieldErrorsOf(issues: readonly { path: string; message: string }[]): FieldErrors {
  const out: FieldErrors = {};
  for (const i of issues) {
    const key = i.path.split('.')[0] as Field;
    if (fields.includes(key) && !out[key]) out[key] = i.message;
  }
  return out;
}

/** Where recording stands: the PDFs going up (bytes over all files), then the record itself. */
export type PartSending = { step: 'files'; sent: number; total: number } | { step: 'record' };

export function partSendingText(s: PartSending, withFiles: boolean): string {
  if (s.step === 'files')
    return `Sending the PDFs: ${formatBytes(s.sent)} of ${formatBytes(s.total)} (step 1 of 2)`;
  return withFiles ? 'Saving the record (step 2 of 2)' : 'Saving the record';
}

const ELSEWHERE = 'elsewhere';

function AddReplacement({
  data,
  correcting,
  onClose,
}: {
  data: RideParts;
  correcting: PartReplacement | null;
  onClose?: () => void;
}) {
  const add = useAddPartReplacementMutation(data.rideId);
  const [component, setComponent] = useState(correcting?.component ?? '');
  const [joint, setJoint] = useState(
    correcting?.joint !== undefined && correcting?.joint !== null ? String(correcting.joint) : ELSEWHERE,
  );
  const [serialNumber, setSerialNumber] = useState(correcting?.serialNumber ?? '');
  const [maker, setMaker] = useState(correcting?.maker ?? '');
  const [fittedOn, setFittedOn] = useState<string | null>(correcting?.fittedOn ?? data.today);
  const [fittedBy, setFittedBy] = useState(correcting?.fittedBy ?? '');
  const [replacedSerial, setReplacedSerial] = useState(correcting?.replacedSerial ?? '');
  const [note, setNote] = useState('');
  const [files, setFiles] = useState<PartPdf[]>([]);
  const [errors, setErrors] = useState<FieldErrors>({});
  const [problem, setProblem] = useState<FormProblem | null>(null);
  const [saved, setSaved] = useState<string | null>(null);
  const [sending, setSending] = useState<PartSending | null>(null);

  const pick = async () => {
    setErrors((e) => ({ ...e, documents: undefined }));
    const picked = await pickPdf(MAX_DOCUMENT_BYTES);
    if (picked === null) return;
    if ('problem' in picked) setErrors((e) => ({ ...e, documents: picked.problem }));
    else setFiles((f) => [...f, { ...picked, title: 'Certificate of conformity' }]);
  };

  const submit = async () => {
    setSaved(null);
    setProblem(null);
    const values = {
      component,
      joint: joint === ELSEWHERE ? null : Number(joint),
      serialNumber,
      maker,
      fittedOn: fittedOn ?? '',
      fittedBy,
      replacedSerial,
      note,
      ...(correcting ? { correctsId: correcting.id } : {}),
    };
    const parsed = partReplacementInputSchema.omit({ documents: true }).safeParse(values);
    const found: FieldErrors = parsed.success
      ? {}
      : fieldErrorsOf(parsed.error.issues.map((i) => ({ path: i.path.join('.'), message: i.message })));
    if (files.some((f) => f.title.trim() === '')) found.documents = 'Say what each PDF is';
    if (!parsed.success || found.documents) {
      setErrors(found);
      return;
    }
    setErrors({});
    const input = parsed.data;
    try {
      const total = files.reduce((n, f) => n + f.bytes.length, 0);
      setSending(files.length > 0 ? { step: 'files', sent: 0, total } : { step: 'record' });
      const res = await add
        .mutateAsync({
          input,
          files,
          onProgress: (sent, all) =>
            setSending(sent < all ? { step: 'files', sent, total: all } : { step: 'record' }),
        })
        .finally(() => setSending(null));
      const r = res.replacement;
      setSaved(
        `Recorded ${r.component}, serial ${r.serialNumber}, fitted ${formatDate(r.fittedOn)}` +
          (r.documents.length > 0
            ? ` with ${r.documents.length} PDF${r.documents.length === 1 ? '' : 's'}.`
            : '.'),
      );
      setComponent('');
      setSerialNumber('');
      setMaker('');
      setFittedBy('');
      setReplacedSerial('');
      setNote('');
      setFiles([]);
    } catch (err) {
      if (err instanceof ApiRequestError) {
        setErrors(fieldErrorsOf(err.issues));
        setProblem({ message: err.message });
      } else setProblem({ message: 'The record could not be saved. Check the connection and try again.' });
    }
  };

  return (
    <Card accessibilityLabel="Record a part fitted">
      <Text variant="heading">{correcting ? 'Correct a record' : 'Record a part fitted'}</Text>
      {correcting ? (
        <Text variant="small" color={colors.info}>
          This new record corrects the one of {formatDate(correcting.fittedOn)} (serial{' '}
          {correcting.serialNumber}). Both stay in the ride’s history.
        </Text>
      ) : null}
      <TextField
        label="Component"
        value={component}
        onChangeText={setComponent}
        maxLength={120}
        error={errors.component}
        hint="What was fitted, e.g. gondola hanger pin, slewing bearing"
      />
      <ChoiceChips
        label="Where"
        value={joint}
        options={[
          ...data.pivots.map((p) => ({ value: String(p.joint), label: p.name })),
          { value: ELSEWHERE, label: 'Elsewhere on the ride' },
        ]}
        onChange={setJoint}
        error={errors.joint}
      />
      <TextField
        label="Serial number"
        value={serialNumber}
        onChangeText={setSerialNumber}
        maxLength={80}
        error={errors.serialNumber}
        autoCapitalize="characters"
      />
      <TextField label="Maker" value={maker} onChangeText={setMaker} maxLength={120} error={errors.maker} />
      <DateField
        label="Date fitted"
        value={fittedOn}
        onChange={setFittedOn}
        max={data.today}
        error={errors.fittedOn}
      />
      <TextField
        label="Fitted by"
        value={fittedBy}
        onChangeText={setFittedBy}
        maxLength={120}
        error={errors.fittedBy}
        hint="The person and company who fitted it"
      />
      <TextField
        label="Serial of the part taken out (optional)"
        value={replacedSerial}
        onChangeText={setReplacedSerial}
        maxLength={80}
        error={errors.replacedSerial}
        autoCapitalize="characters"
      />
      <TextField
        label="Note (optional)"
        value={note}
        onChangeText={setNote}
        maxLength={1000}
        error={errors.note}
        multiline
      />
      <View style={styles.files}>
        <Text variant="label" muted>
          CERTIFICATES AS PDF (OPTIONAL, EACH AT MOST {megabytes(MAX_DOCUMENT_BYTES)})
        </Text>
        {files.map((f, i) => (
          <View key={`${f.name}-${i}`} style={styles.file} testID="part-pdf-picked">
            <Text variant="small">
              {f.name} · {formatBytes(f.bytes.length)}
            </Text>
            <TextField
              label={`What ${f.name} is`}
              value={f.title}
              onChangeText={(title) => setFiles((all) => all.map((x, j) => (j === i ? { ...x, title } : x)))}
              maxLength={120}
            />
            <Button
              tone="quiet"
              label={`Remove ${f.name}`}
              onPress={() => setFiles((all) => all.filter((_, j) => j !== i))}
            />
          </View>
        ))}
        <View style={styles.actions}>
          <Button tone="quiet" label={files.length > 0 ? 'Add another PDF' : 'Add PDF'} onPress={pick} />
        </View>
        {errors.documents ? (
          <Text variant="small" color={colors.over} role="alert">
            {errors.documents}
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
          label="Recording the part"
          value={sending.step === 'files' ? sending.sent : 0}
          max={sending.step === 'files' ? sending.total : null}
          valueText={partSendingText(sending, files.length > 0)}
        />
      ) : null}
      <Button
        label={correcting ? 'Record the correction' : 'Record part'}
        onPress={submit}
        busy={add.isPending}
      />
      {onClose ? <Button tone="quiet" label="Close" onPress={onClose} /> : null}
    </Card>
  );
}

const styles = StyleSheet.create({
  columns: { gap: space.lg },
  columnsWide: { flexDirection: 'row', alignItems: 'flex-start' },
  column: { gap: space.lg },
  main: { flex: 3 },
  side: { flex: 2 },
  record: { gap: 2, borderTopWidth: 1, borderTopColor: colors.border, paddingTop: space.sm },
  recordCorrected: { opacity: 0.75, borderLeftWidth: 3, borderLeftColor: colors.near, paddingLeft: space.sm },
  actions: { flexDirection: 'row', gap: space.sm, flexWrap: 'wrap' },
  files: { gap: space.xs },
  document: { flexDirection: 'row', alignItems: 'center', gap: space.sm },
  documentTitle: { flex: 1 },
  file: { gap: space.xs, borderLeftWidth: 2, borderLeftColor: colors.border, paddingLeft: space.sm },
});
