import type { Href } from 'expo-router';
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { Text } from '@/components/text';
import { colors, radius, space } from '@/components/theme';
import {
  type ListedFinding,
  useCreateFinding,
  useDeleteFinding,
  useUpdateFinding,
} from '@/features/review/decision-api';
import { sharedStyles } from '@/features/review/decision-panel/styles';
import { FindingForm, type FindingValues, type InspectionPhoto } from '@/features/review/finding-form';
import { FindingsList } from '@/features/review/findings-list';
import { ApiRequestError, OfflineError } from '@/lib/api-errors';

type Editor = { mode: 'new' } | { mode: 'edit'; finding: ListedFinding } | null;

const CONFLICT =
  'Someone else changed this finding while you were editing it, so your change was not saved. The list now shows their version: cancel, then open the finding again to edit it from there.';

function problemText(err: unknown): string {
  if (err instanceof OfflineError) return 'No connection to the server; nothing was changed.';
  if (err instanceof ApiRequestError) return err.message;
  return 'Something went wrong; nothing was changed.';
}

export function FindingsSection({
  inspectionId,
  rideId,
  findings,
  photos,
  editable,
  actionHref,
}: {
  inspectionId: string;
  rideId: string;
  findings: ListedFinding[];
  photos: readonly InspectionPhoto[];
  editable: boolean;
  actionHref: Href | null;
}) {
  const create = useCreateFinding(inspectionId, rideId);
  const update = useUpdateFinding(inspectionId);
  const remove = useDeleteFinding(inspectionId);
  const [editor, setEditor] = useState<Editor>(null);
  const [problem, setProblem] = useState<string | null>(null);

  const addNew = async (values: FindingValues) => {
    await create.mutateAsync(values);
    setEditor(null);
  };
  const saveEdit = (finding: ListedFinding) => async (values: FindingValues) => {
    try {
      await update.mutateAsync({ finding, patch: values });
      setEditor(null);
    } catch (err) {
      if (err instanceof ApiRequestError && err.status === 409)
        throw new ApiRequestError(409, err.code, CONFLICT, err.issues);
      throw err;
    }
  };

  const editing = editable && editor?.mode === 'edit' ? editor.finding : null;
  return (
    <View style={sharedStyles.section}>
      {problem ? (
        <View style={sharedStyles.problem} role="alert">
          <Text color={colors.danger}>{problem}</Text>
          <Button label="Dismiss" tone="quiet" onPress={() => setProblem(null)} />
        </View>
      ) : null}
      <FindingsList
        findings={findings}
        photos={photos}
        editable={editable}
        actionHref={actionHref}
        editingId={editing?.id ?? null}
        editor={
          editing ? (
            <FindingForm
              finding={editing}
              photos={photos}
              onSubmit={saveEdit(editing)}
              onCancel={() => setEditor(null)}
            />
          ) : null
        }
        onEdit={(finding) => {
          setProblem(null);
          setEditor({ mode: 'edit', finding });
        }}
        onDelete={(finding) => {
          setProblem(null);
          if (editor?.mode === 'edit' && editor.finding.id === finding.id) setEditor(null);
          remove.mutate(finding, {
            onError: (err) => setProblem(`Finding ${finding.number} was not deleted. ${problemText(err)}`),
          });
        }}
      />
      {editable && editor?.mode === 'new' ? (
        <View style={styles.newForm}>
          <FindingForm photos={photos} onSubmit={addNew} onCancel={() => setEditor(null)} />
        </View>
      ) : null}
      {editable && editor === null ? (
        <Button
          label="Add finding"
          tone="quiet"
          onPress={() => {
            setProblem(null);
            setEditor({ mode: 'new' });
          }}
        />
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  newForm: {
    padding: space.md,
    borderRadius: radius.md,
    borderWidth: 2,
    borderColor: colors.base,
  },
});
