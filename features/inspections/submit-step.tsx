import { router } from 'expo-router';
import { StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { Card } from '@/components/card';
import { Text } from '@/components/text';
import { TextField } from '@/components/text-field';
import { colors, space } from '@/components/theme';
import type { SessionUser } from '@/features/session/schema';
import type { Draft } from '@/features/records';
import type { useSubmitDraftMutation } from '@/features/inspections/field-api';
import { todayHref } from '@/features/inspections/hrefs';
import type { DraftProblem } from '@/features/records/schema';
import { DeclarationConfirm } from '@/features/instruments/ui';
import type { ChecklistTemplate } from '@/features/registry/schema';

/**
 * The last step of recording: notes for the supervisor, what still stands in the way, the inspector's
 * declaration, and the submit that puts the inspection in the phone's outbox.
 */
export function SubmitStep({
  draft,
  template,
  problems,
  saving,
  onNotes,
  user,
  declarationText,
  fromDefault,
  declared,
  setDeclared,
  submit,
  syncNow,
}: {
  draft: Draft;
  template: ChecklistTemplate | null;
  problems: DraftProblem[];
  /** A change of the draft is still being saved on the phone. */
  saving: boolean;
  onNotes: (text: string) => void;
  user: SessionUser | null;
  declarationText: string;
  /** The text is the standard one: no administrator has set the inspection body's own. */
  fromDefault: boolean;
  declared: boolean;
  setDeclared: (declared: boolean) => void;
  submit: ReturnType<typeof useSubmitDraftMutation>;
  syncNow: () => Promise<unknown>;
}) {
  return (
    <View style={styles.submit}>
      <TextField label="Notes for the supervisor" value={draft.notes} onChangeText={onNotes} multiline />
      {problems.length > 0 ? (
        <Card>
          <Text variant="heading">Before you submit</Text>
          {problems.map((p, i) => (
            <Text key={`${p.itemId}${i}`} color={colors.near}>
              • {p.message}
            </Text>
          ))}
        </Card>
      ) : (
        <Card>
          <Text variant="heading">Ready to submit</Text>
          <Text muted>
            It goes to the outbox on this phone and is sent as soon as there is a connection. After that it
            cannot be changed; a correction is sent as an amendment.
          </Text>
        </Card>
      )}
      {user ? (
        <DeclarationConfirm
          text={declarationText}
          name={user.name}
          value={declared}
          onChange={setDeclared}
          fromDefault={fromDefault}
        />
      ) : null}
      {submit.isError ? (
        <Text role="alert" color={colors.danger}>
          {(submit.error as Error).message}
        </Text>
      ) : null}
      <Button
        label="Submit inspection"
        tone="accent"
        disabled={problems.length > 0 || saving || !declared || !user}
        busy={submit.isPending}
        onPress={async () => {
          if (!declared || !user) return;
          try {
            await submit.mutateAsync({
              draft,
              template,
              declaration: {
                text: declarationText,
                declaredAt: new Date().toISOString(),
                declaredBy: user.id,
                declaredByName: user.name,
              },
            });
          } catch {
            return; // shown above from submit.error
          }
          void syncNow();
          router.replace(todayHref);
        }}
      />
    </View>
  );
}

const styles = StyleSheet.create({
  submit: { gap: space.lg },
});
