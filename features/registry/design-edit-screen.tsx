import { router } from 'expo-router';
import { useMemo, useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { Card } from '@/components/card';
import Feather from '@/components/feather-icon';
import { FormAlert, type FormProblem } from '@/components/form-alert';
import { Panes } from '@/components/panes';
import { SubScreen } from '@/components/sub-screen';
import { Text } from '@/components/text';
import { TextField } from '@/components/text-field';
import { colors, space } from '@/components/theme';
import { RoleGate } from '@/features/auth/ui';
import type { DesignData } from '@/features/loads/design-schema';
import { useDesignPendingQuery, useDesignPutMutation, useRideQuery } from '@/features/registry/api';
import { DesignComparison } from '@/features/registry/design-comparison';
import { diffDesign, loosensALimit } from '@/features/registry/design-diff';
import type * as SheetModel from '@/features/registry/design-sheet';
import { useCsvModule } from '@/features/registry/use-csv-module';
import { FullScreenWait } from '@/components/full-screen-wait';
import type { DesignCsvColumn } from '@/features/registry/design-file/columns';
import { useRideIdParam } from '@/features/registry/ride-route';
import type { DesignVersion } from '@/features/registry/schema';
import { WithRide } from '@/features/registry/with-ride';
import { rideDesignHref, rideHref } from '@/features/rides';
import type { RideSummary } from '@/features/rides/schema';
import { useUnitSystem } from '@/features/settings';
import { ApiRequestError, OfflineError } from '@/lib/api-errors';

/**
 * The design data field by field: every name and value of the version in force, with its unit, read
 * back as the import reads a file (the same cell rules and schema, `design-sheet.ts`), each problem under
 * its field. What changed is listed against the version in force with the import's comparison, and the
 * result is saved as a new version by the same rule as an import: a version that loosens a limit waits for
 * a second person. Nothing is saved while any field has a problem.
 */
export function DesignEditScreen() {
  const id = useRideIdParam();
  return (
    <RoleGate roles={['admin', 'supervisor']}>
      {() => <WithRide id={id}>{(ride) => <DesignEditLoader ride={ride} />}</WithRide>}
    </RoleGate>
  );
}

/** The editor's page when there is no editor to show, only why. */
function EditorMessage({ ride, children }: { ride: RideSummary; children: React.ReactNode }) {
  return (
    <SubScreen
      title="Edit design data"
      subtitle={ride.name}
      back={{ href: rideHref(ride.id), label: ride.name }}
    >
      <Card>{children}</Card>
    </SubScreen>
  );
}

function DesignEditLoader({ ride }: { ride: RideSummary }) {
  const current = useRideQuery(ride.id).data?.design ?? null;
  if (!current)
    return (
      <EditorMessage ride={ride}>
        <Text variant="heading">No design data yet</Text>
        <Text muted>
          The first version comes from a design file: import it from the maker’s design document.
        </Text>
      </EditorMessage>
    );
  return <DesignEditWithModel ride={ride} current={current} />;
}

/** The editor's model sits in the CSV chunk with the import's reader and writer: loaded on first use. */
function DesignEditWithModel({ ride, current }: { ride: RideSummary; current: DesignVersion }) {
  const csv = useCsvModule();
  if (csv.failed)
    return (
      <EditorMessage ride={ride}>
        <Text role="alert">
          The editor could not be loaded. Check the connection and open this page again.
        </Text>
      </EditorMessage>
    );
  if (!csv.module) return <FullScreenWait />;
  // A new version in force starts the editor again from it.
  return <DesignEdit key={current.version} ride={ride} current={current} model={csv.module.designSheet} />;
}

function DesignEdit({
  ride,
  current,
  model,
}: {
  ride: RideSummary;
  current: DesignVersion;
  model: typeof SheetModel;
}) {
  const { designSheet, checkSheet, changedCells, sheetSections, withCell } = model;
  const [system] = useUnitSystem();
  const start = useMemo(() => designSheet(current.data), [current.data, designSheet]);
  const [rows, setRows] = useState<SheetModel.SheetRow[]>(start);
  const check = useMemo(() => checkSheet(rows), [rows, checkSheet]);
  const edits = useMemo(() => changedCells(start, rows), [start, rows, changedCells]);
  const pending = useDesignPendingQuery(ride.id).data?.pending ?? null;

  const main = (
    <>
      <Card>
        <Text variant="small" muted>
          Values in SI units as the design file holds them (the unit is beside each field), a point as the
          decimal mark. Which record a row is (its body or joint, its kind) is changed by importing a file.
        </Text>
      </Card>
      {sheetSections.map((section) => {
        const members = rows.flatMap((r, i) => (section.records.includes(r.record) ? [i] : []));
        if (members.length === 0) return null;
        return (
          <Card key={section.title} style={styles.section}>
            <Text variant="heading" role="heading" aria-level={2}>
              {section.title}
            </Text>
            {members.map((i) => (
              <RecordFields
                key={i}
                model={model}
                row={rows[i]}
                was={start[i]}
                errors={check.ok ? {} : check.fieldErrors}
                index={i}
                onChange={(column, text) => setRows((r) => withCell(r, i, column, text))}
              />
            ))}
          </Card>
        );
      })}
    </>
  );

  const side = (
    <>
      <Card style={styles.section}>
        <Text variant="heading" role="heading" aria-level={2}>
          {`Changes against version ${current.version}`}
        </Text>
        {check.ok ? (
          edits === 0 ? (
            <Text muted>Nothing changed yet.</Text>
          ) : (
            <DesignComparison
              before={current.data}
              after={check.data}
              system={system}
              beforeLabel={`version ${current.version}`}
              afterLabel="this edit"
              narrow
            />
          )
        ) : (
          <FormAlert
            problem={{
              message: 'Some fields have problems: the comparison shows once every field is valid.',
              details: check.general,
            }}
          />
        )}
      </Card>
      <SaveCard
        ride={ride}
        current={current}
        data={check.ok && edits > 0 ? check.data : null}
        pendingVersion={pending?.version ?? null}
        onReset={() => setRows(start)}
        edits={edits}
      />
    </>
  );

  return (
    <SubScreen
      title="Edit design data"
      subtitle={`${ride.name} · from v${current.version}, ${current.data.source.document} rev. ${current.data.source.revision}`}
      back={{ href: rideDesignHref(ride.id), label: 'Design data' }}
    >
      <Panes main={main} side={side} sideFirstOnPhone={false} />
    </SubScreen>
  );
}

/** One record's editable fields, each with its unit, its problem, and what it was when changed. */
function RecordFields({
  model: { editableFields, recordTitle, fieldKey },
  row,
  was,
  errors,
  index,
  onChange,
}: {
  model: typeof SheetModel;
  row: SheetModel.SheetRow;
  was: SheetModel.SheetRow | undefined;
  errors: Record<string, string>;
  index: number;
  onChange: (column: DesignCsvColumn, text: string) => void;
}) {
  const fields = editableFields(row);
  // The heading names the record as it was, so it does not jump while its name is typed.
  const title = recordTitle(was ?? row);
  if (fields.length === 0) return null;
  return (
    <View style={styles.record} accessibilityLabel={title}>
      <Text variant="label" muted>
        {title.toUpperCase()}
      </Text>
      <View style={styles.fields}>
        {fields.map((f) => {
          const value = row.cells[f.column] ?? '';
          const before = was?.cells[f.column] ?? '';
          const changed = value !== before;
          return (
            <View key={f.column} style={f.unit || f.column === 'name' ? styles.field : styles.wideField}>
              <TextField
                label={f.label}
                unit={f.unit.length <= 8 ? f.unit : undefined}
                accessibilityLabel={`${title}: ${f.label}${f.unit ? ` (${f.unit})` : ''}`}
                value={value}
                onChangeText={(t) => onChange(f.column, t)}
                autoCapitalize="none"
                inputMode={f.unit && f.unit.length <= 8 ? 'decimal' : undefined}
                placeholder={f.optional ? 'not given' : undefined}
                error={errors[fieldKey(index, f.column)]}
                hint={
                  changed
                    ? `Changed: was ${before === '' ? 'not given' : before}`
                    : f.unit.length > 8
                      ? f.unit
                      : undefined
                }
              />
            </View>
          );
        })}
      </View>
    </View>
  );
}

function problemOf(err: unknown): FormProblem {
  if (err instanceof OfflineError)
    return { message: 'No connection: design data can be saved only online. Nothing was saved.' };
  if (err instanceof ApiRequestError)
    return {
      message: `Nothing was saved. ${err.message}`,
      details: err.issues?.map((i) => `${i.path}: ${i.message}`),
    };
  return { message: 'Something went wrong. Nothing was saved; try again.' };
}

/** The reason and the save: as an import, a version that loosens a limit is a proposal. */
function SaveCard({
  ride,
  current,
  data,
  pendingVersion,
  onReset,
  edits,
}: {
  ride: RideSummary;
  current: DesignVersion;
  /** The edited data once every field is valid and something changed. */
  data: DesignData | null;
  pendingVersion: number | null;
  onReset: () => void;
  edits: number;
}) {
  const [system] = useUnitSystem();
  const put = useDesignPutMutation(ride.id);
  const [reason, setReason] = useState('');
  const [reasonError, setReasonError] = useState<string | undefined>();
  const [problem, setProblem] = useState<FormProblem | null>(null);
  const loosens = data ? loosensALimit(current.data, data) : false;
  const noDifference = data ? diffDesign(current.data, data, system).length === 0 : false;
  const ready = data !== null && pendingVersion === null;
  const next = current.version + 1;
  const save = () => {
    if (!data) return;
    if (reason.trim() === '') {
      setReasonError('Say why: it is kept with the version.');
      return;
    }
    setReasonError(undefined);
    setProblem(null);
    // mutateAsync, not mutate's callbacks: the saved version reloads the ride, which starts this editor
    // afresh (its key is the version) before a per-call onSuccess could run.
    put.mutateAsync({ reason: reason.trim(), data, basedOnVersion: current.version }).then(
      () => router.replace(rideDesignHref(ride.id)),
      (err: unknown) => setProblem(problemOf(err)),
    );
  };
  return (
    <Card style={styles.section}>
      <Text variant="heading" role="heading" aria-level={2}>
        Save as a new version
      </Text>
      <TextField
        label="Why this version"
        value={reason}
        onChangeText={setReason}
        multiline
        error={reasonError}
        hint="Kept with the version, e.g. “Gondola mass from the maker’s weighing, letter of 3 Nov”."
      />
      {pendingVersion !== null ? (
        <View style={styles.line} role="alert">
          <Feather name="clock" size={18} color={colors.near} />
          <Text color={colors.near} style={styles.flex}>
            Version {pendingVersion} waits for a second person’s approval. Another version can be saved once
            it is approved or rejected.
          </Text>
        </View>
      ) : null}
      {ready && loosens ? (
        <Text variant="small">
          This edit loosens a limit: it is saved as a proposal and takes effect only when another supervisor
          or an admin approves it. Version {current.version} stays in force until then.
        </Text>
      ) : null}
      {ready && noDifference ? (
        <Text variant="small" muted>
          The values read the same as version {current.version} (e.g. 1.50 for 1.5): nothing to save.
        </Text>
      ) : null}
      <FormAlert problem={problem} />
      <View style={styles.buttons}>
        <Button
          label={loosens ? `Propose version ${next} for approval` : `Save as version ${next}`}
          tone="accent"
          disabled={!ready || noDifference}
          busy={put.isPending}
          onPress={save}
        />
        <Button label="Undo all changes" tone="quiet" disabled={edits === 0} onPress={onReset} />
      </View>
      {data === null && pendingVersion === null ? (
        <Text variant="small" muted>
          {edits === 0 ? 'Change a field to make a new version.' : 'Fix the fields marked above to save.'}
        </Text>
      ) : null}
    </Card>
  );
}

const styles = StyleSheet.create({
  flex: { flex: 1, minWidth: 0 },
  section: { gap: space.md },
  record: {
    gap: space.sm,
    paddingTop: space.sm,
    borderTopWidth: 1,
    borderTopColor: colors.surfaceSunk,
  },
  fields: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md },
  field: { flexGrow: 1, flexBasis: 180, minWidth: 0 },
  wideField: { flexGrow: 2, flexBasis: 280, minWidth: 0 },
  line: { flexDirection: 'row', alignItems: 'center', gap: space.sm },
  buttons: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
});
