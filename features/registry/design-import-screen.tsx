import { zodResolver } from '@hookform/resolvers/zod';
import * as DocumentPicker from 'expo-document-picker';
import { router } from 'expo-router';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { StyleSheet, View } from 'react-native';
import { z } from 'zod';

import { Spinner } from '@/components/spinner';
import { Button } from '@/components/button';
import { Card } from '@/components/card';
import { ChoiceChips } from '@/components/choice-chips';
import Feather from '@/components/feather-icon';
import { FormAlert, type FormProblem } from '@/components/form-alert';
import { SubScreen } from '@/components/sub-screen';
import { Text } from '@/components/text';
import { colors, radius, space } from '@/components/theme';
import { OfflineError } from '@/lib/api-errors';
import { RoleGate } from '@/features/auth/ui';
import {
  useDesignImportCheckMutation,
  useDesignImportMutation,
  useDesignPendingQuery,
  useDesignVersionsQuery,
  useRideQuery,
} from '@/features/registry/api';
import { DesignComparison } from '@/features/registry/design-comparison';
import type { DesignData } from '@/features/loads/design-schema';
import { loosensALimit } from '@/features/registry/design-diff';
import { ExportCard } from '@/features/registry/design-export-card';
import { DesignDrawingPanel, useDesignAnalysis } from '@/features/registry/design-view';
import { FormText } from '@/components/form/fields';
import { type ReportLine, formatFromName, importReport } from '@/features/registry/import-report';
import { type ImportPhase, ImportProgress, csvDataRows } from '@/features/registry/import-progress';
import { Panes } from '@/components/panes';
import { readPickedFile } from '@/features/registry/read-picked-file';
import { WithRide } from '@/features/registry/with-ride';
import { useRideIdParam } from '@/features/registry/ride-route';
import { changeReasonSchema } from '@/features/registry/schema';
import { applyServerError, fieldsOf } from '@/components/form/server-errors';
import { rideDesignHref, rideHref } from '@/features/rides';
import type { RideSummary } from '@/features/rides/schema';
import { useUnitSystem } from '@/features/settings';

/** Picked files larger than this are not design data; refuse before reading them. */
const MAX_FILE_BYTES = 2 * 1024 * 1024;

type Picked = { name: string; size: number | null; text: string; format: 'csv' | 'json' };
type Check =
  | { state: 'idle' }
  | { state: 'checking' }
  | { state: 'ok'; data: DesignData }
  | { state: 'rejected'; message: string; lines: ReportLine[] }
  | { state: 'failed'; message: string };

const reasonFormSchema = z.object({ reason: changeReasonSchema });
type ReasonInput = z.input<typeof reasonFormSchema>;

/**
 * Design data from the files engineers have: pick a CSV or JSON file, the server checks it whole (nothing
 * is saved), its report is shown row by row, a clean file is compared field by field with the version in
 * force (every loosened limit marked), and only then saved as a new version, with a reason. A version that
 * loosens a limit is saved as a proposal a second person must approve. Export of the version in force sits
 * beside it.
 */
export function DesignImportScreen() {
  const id = useRideIdParam();
  return (
    <RoleGate roles={['admin', 'supervisor']}>
      {() => <WithRide id={id}>{(ride) => <DesignImport ride={ride} />}</WithRide>}
    </RoleGate>
  );
}

function DesignImport({ ride }: { ride: RideSummary }) {
  const detail = useRideQuery(ride.id);
  const current = detail.data?.design ?? null;
  const pending = useDesignPendingQuery(ride.id).data?.pending ?? null;
  const versions = useDesignVersionsQuery(ride.id).data;
  const nextVersion = Math.max(current?.version ?? 0, ...(versions ?? []).map((v) => v.version)) + 1;
  const [system] = useUnitSystem();
  const [picked, setPicked] = useState<Picked | null>(null);
  const [check, setCheck] = useState<Check>({ state: 'idle' });
  const [pickError, setPickError] = useState<string | null>(null);
  const [phase, setPhase] = useState<ImportPhase | null>(null);
  const checker = useDesignImportCheckMutation(ride.id);

  const runCheck = async (file: Picked) => {
    setCheck({ state: 'checking' });
    setPhase({
      step: 'checking',
      format: file.format,
      rows: file.format === 'csv' ? csvDataRows(file.text) : null,
    });
    try {
      const res = await checker.mutateAsync({ format: file.format, content: file.text });
      setCheck({ state: 'ok', data: res.data });
    } catch (err) {
      const report = importReport(err);
      if (report) setCheck({ state: 'rejected', ...report });
      else
        setCheck({
          state: 'failed',
          message:
            err instanceof OfflineError
              ? 'No connection: the file can be checked and imported only online.'
              : err instanceof Error
                ? err.message
                : 'The file could not be checked.',
        });
    } finally {
      setPhase(null);
    }
  };

  const pick = async () => {
    setPickError(null);
    const res = await DocumentPicker.getDocumentAsync({
      type: ['.csv', '.json', 'text/csv', 'application/json', 'text/plain'],
      copyToCacheDirectory: true,
      multiple: false,
    });
    if (res.canceled || !res.assets?.[0]) return;
    const asset = res.assets[0];
    if (asset.size && asset.size > MAX_FILE_BYTES) {
      setPickError(`${asset.name} is larger than 2 MB: that is not a design data file.`);
      return;
    }
    try {
      setPhase({ step: 'reading' });
      const text = await readPickedFile(asset);
      const file: Picked = {
        name: asset.name,
        size: asset.size ?? null,
        text,
        format: formatFromName(asset.name),
      };
      setPicked(file);
      await runCheck(file);
    } catch {
      setPhase(null);
      setPickError(`${asset.name} could not be read.`);
    }
  };

  const setFormat = (format: 'csv' | 'json') => {
    if (!picked || picked.format === format) return;
    const file = { ...picked, format };
    setPicked(file);
    void runCheck(file);
  };

  const steps = (
    <>
      <ChooseFileStep picked={picked} pickError={pickError} onPick={pick} onFormat={setFormat} />

      <Card style={styles.step}>
        <StepTitle n={2} title="Check" />
        <ImportProgress phase={phase} />
        <CheckResult check={check} />
      </Card>

      <Card style={styles.step}>
        <StepTitle n={3} title={current ? `Compare with version ${current.version} in force` : 'Compare'} />
        {check.state === 'ok' ? (
          <DesignComparison
            before={current?.data ?? null}
            after={check.data}
            system={system}
            beforeLabel={current ? `version ${current.version}` : 'nothing yet'}
            afterLabel="this file"
          />
        ) : (
          <Text muted>The comparison shows once the file passes the check.</Text>
        )}
      </Card>

      <Card style={styles.step}>
        <StepTitle n={4} title="Save as a new version" />
        <SaveStep
          ride={ride}
          picked={picked}
          check={check}
          basedOnVersion={current?.version ?? 0}
          nextVersion={nextVersion}
          loosens={check.state === 'ok' && loosensALimit(current?.data ?? null, check.data)}
          blockedBy={pending?.version ?? null}
          onRejected={(report) => setCheck({ state: 'rejected', ...report })}
        />
      </Card>
    </>
  );

  const side = <ImportSide ride={ride} current={current} />;

  return (
    <SubScreen
      title="Import design data"
      subtitle={`${ride.name}${current ? ` · now v${current.version}, ${current.data.source.document} rev. ${current.data.source.revision}` : ''}`}
      back={{ href: rideHref(ride.id), label: ride.name }}
    >
      <Panes main={steps} side={side} sideFirstOnPhone={false} />
    </SubScreen>
  );
}

/** Step 1: the file, its size, and whether it is read as CSV or JSON. */
function ChooseFileStep({
  picked,
  pickError,
  onPick,
  onFormat,
}: {
  picked: Picked | null;
  pickError: string | null;
  onPick: () => void;
  onFormat: (format: 'csv' | 'json') => void;
}) {
  return (
    <Card style={styles.step}>
      <StepTitle n={1} title="Choose the file" />
      <Text variant="small" muted>
        CSV with one row per part, pivot, seat, motion and limit, or the JSON form — SI units, as export
        writes them. The file is checked whole; nothing is saved until you say so below.
      </Text>
      <Button
        label={picked ? 'Choose another file' : 'Choose a CSV or JSON file'}
        tone={picked ? 'quiet' : 'primary'}
        icon={<Feather name="file-text" size={18} color={picked ? colors.text : colors.baseText} />}
        onPress={onPick}
        style={styles.start}
      />
      {pickError ? <Text color={colors.danger}>{pickError}</Text> : null}
      {picked ? (
        <View style={styles.fileLine}>
          <Feather name="file" size={16} color={colors.textMuted} />
          <Text variant="figure" style={styles.flex} numberOfLines={1}>
            {picked.name}
          </Text>
          {picked.size !== null ? (
            <Text variant="small" muted>
              {Math.max(1, Math.round(picked.size / 1024))} KB
            </Text>
          ) : null}
        </View>
      ) : null}
      {picked ? (
        <ChoiceChips
          label="Read it as"
          value={picked.format}
          options={[
            { value: 'csv', label: 'CSV' },
            { value: 'json', label: 'JSON' },
          ]}
          onChange={onFormat}
        />
      ) : null}
    </Card>
  );
}

/** Beside the steps: export of the version in force, and what makes a file fail. */
function ImportSide({
  ride,
  current,
}: {
  ride: RideSummary;
  current: NonNullable<ReturnType<typeof useRideQuery>['data']>['design'];
}) {
  return (
    <>
      {current ? (
        <ExportCard ride={ride} version={current.version} data={current.data} />
      ) : (
        <Card>
          <Text variant="heading">No design data yet</Text>
          <Text variant="small" muted>
            The first import makes version 1.
          </Text>
        </Card>
      )}
      <Card>
        <Text variant="heading">What makes a file fail</Text>
        <Text variant="small">• A missing source, body, part, pivot or motion row</Text>
        <Text variant="small">• A value in a column its record does not use</Text>
        <Text variant="small">• Decimal commas, text where a number belongs, masses or sizes of 0</Text>
        <Text variant="small">• A minimum pin diameter not below the nominal</Text>
        <Text variant="small" muted>
          Every problem is listed with its row and column, so the file can be fixed in one go.
        </Text>
      </Card>
    </>
  );
}

function StepTitle({ n, title }: { n: number; title: string }) {
  return (
    <View style={styles.stepTitle}>
      <View style={styles.stepNumber}>
        <Text variant="label" color={colors.baseText}>
          {n}
        </Text>
      </View>
      <Text variant="heading" role="heading" aria-level={2}>
        {title}
      </Text>
    </View>
  );
}

function CheckResult({ check }: { check: Check }) {
  const [system] = useUnitSystem();
  if (check.state === 'idle') return <Text muted>Choose a file first.</Text>;
  if (check.state === 'checking')
    return (
      <View style={styles.fileLine}>
        <Spinner color={colors.base} />
        <Text muted>Checking the file…</Text>
      </View>
    );
  if (check.state === 'failed') return <Text color={colors.danger}>{check.message}</Text>;
  if (check.state === 'rejected') return <ImportReportView message={check.message} lines={check.lines} />;
  return <CheckedPreview data={check.data} system={system} />;
}

function CheckedPreview({ data, system }: { data: DesignData; system: 'si' | 'us' }) {
  const analysis = useDesignAnalysis(data);
  const count = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;
  return (
    <View style={styles.preview}>
      <View style={styles.okLine} role="status">
        <Feather name="check-circle" size={18} color={colors.within} />
        <Text variant="heading" color={colors.within}>
          The file is complete and consistent.
        </Text>
      </View>
      <Text>
        {data.source.document}, revision {data.source.revision}: {count(data.bodies.length, 'body', 'bodies')}
        , {count(data.parts.length, 'part', 'parts')}, {count(data.pivots.length, 'pivot', 'pivots')},{' '}
        {count(data.seats.length, 'seat', 'seats')}.
      </Text>
      <DesignDrawingPanel data={data} system={system} analysis={analysis} />
    </View>
  );
}

/** A rejected file's report: every problem with its row and column, in file order. */
export function ImportReportView({ message, lines }: { message: string; lines: ReportLine[] }) {
  return (
    <View style={styles.report} role="alert" accessibilityLabel="Problems in the file">
      <View style={styles.okLine}>
        <Feather name="x-octagon" size={18} color={colors.danger} />
        <Text variant="heading" color={colors.danger} style={styles.flex}>
          {message}
        </Text>
      </View>
      <View style={styles.reportTable} role="table" accessibilityLabel="File problems by row and column">
        <View style={StyleSheet.flatten([styles.reportRow, styles.reportHead])} role="row">
          <Text variant="label" muted style={styles.reportRowCol} role="columnheader">
            ROW
          </Text>
          <Text variant="label" muted style={styles.reportColCol} role="columnheader">
            COLUMN
          </Text>
          <Text variant="label" muted style={styles.flex} role="columnheader">
            PROBLEM
          </Text>
        </View>
        {lines.map((l, i) => (
          <View key={i} style={styles.reportRow} role="row">
            <Text variant="figure" style={styles.reportRowCol} role="cell">
              {l.row ?? '—'}
            </Text>
            <Text variant="figure" style={styles.reportColCol} role="cell" numberOfLines={2}>
              {l.column ?? (l.row === null ? l.where : '—')}
            </Text>
            <Text style={styles.flex} role="cell">
              {l.message}
            </Text>
          </View>
        ))}
      </View>
    </View>
  );
}

function SaveStep({
  ride,
  picked,
  check,
  basedOnVersion,
  nextVersion,
  loosens,
  blockedBy,
  onRejected,
}: {
  ride: RideSummary;
  picked: Picked | null;
  check: Check;
  basedOnVersion: number;
  nextVersion: number;
  loosens: boolean;
  /** A revision already waiting for approval: no other version until it is decided. */
  blockedBy: number | null;
  onRejected: (report: { message: string; lines: ReportLine[] }) => void;
}) {
  const importer = useDesignImportMutation(ride.id);
  const { control, handleSubmit, setError, formState } = useForm<ReasonInput>({
    resolver: zodResolver(reasonFormSchema),
    defaultValues: { reason: '' },
  });
  const [problem, setProblem] = useState<FormProblem | null>(null);
  const ready = !!picked && check.state === 'ok' && blockedBy === null;
  const submit = handleSubmit(async ({ reason }) => {
    if (!picked) return;
    setProblem(null);
    try {
      await importer.mutateAsync({ format: picked.format, content: picked.text, reason, basedOnVersion });
      router.replace(rideDesignHref(ride.id));
    } catch (err) {
      const report = importReport(err);
      if (report) onRejected(report);
      else setProblem(applyServerError(err, setError, fieldsOf(['reason'])));
    }
  });
  return (
    <View style={styles.preview}>
      <FormText
        control={control}
        name="reason"
        label="Why this version"
        hint="Kept with the version, e.g. “Revision D of the design report: new main pin”."
        multiline
      />
      <FormAlert problem={problem} />
      {blockedBy !== null ? (
        <View style={styles.okLine} role="alert">
          <Feather name="clock" size={18} color={colors.near} />
          <Text color={colors.near} style={styles.flex}>
            Version {blockedBy} waits for a second person’s approval. Another version can be imported once it
            is approved or rejected.
          </Text>
        </View>
      ) : null}
      {ready && loosens ? (
        <Text variant="small">
          This version loosens a limit: it is saved as a proposal and takes effect only when another
          supervisor or an admin approves it. Version {basedOnVersion} stays in force until then.
        </Text>
      ) : null}
      <Button
        label={loosens ? `Propose version ${nextVersion} for approval` : `Import as version ${nextVersion}`}
        tone="accent"
        disabled={!ready}
        busy={formState.isSubmitting}
        onPress={submit}
        style={styles.start}
      />
      {!ready && blockedBy === null ? (
        <Text variant="small" muted>
          Only a file that passes the check can be imported.
        </Text>
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  flex: { flex: 1, minWidth: 0 },
  step: { gap: space.md },
  start: { alignSelf: 'flex-start' },
  stepTitle: { flexDirection: 'row', alignItems: 'center', gap: space.sm },
  stepNumber: {
    width: 26,
    height: 26,
    borderRadius: 13,
    backgroundColor: colors.base,
    alignItems: 'center',
    justifyContent: 'center',
  },
  fileLine: { flexDirection: 'row', alignItems: 'center', gap: space.sm },
  preview: { gap: space.md },
  okLine: { flexDirection: 'row', alignItems: 'center', gap: space.sm },
  report: { gap: space.sm },
  reportTable: {
    borderWidth: 1,
    borderColor: colors.border,
    borderRadius: radius.md,
    overflow: 'hidden',
    backgroundColor: colors.surface,
  },
  reportHead: { backgroundColor: colors.surfaceSunk },
  reportRow: {
    flexDirection: 'row',
    alignItems: 'flex-start',
    gap: space.md,
    paddingHorizontal: space.md,
    paddingVertical: space.sm,
    borderTopWidth: 1,
    borderTopColor: colors.surfaceSunk,
  },
  reportRowCol: { width: 44 },
  reportColCol: { width: 150 },
});
