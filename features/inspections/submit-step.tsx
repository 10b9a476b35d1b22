import { router } from 'expo-router';
import { Pressable, StyleSheet, View } from 'react-native';

import { Card } from '@/components/card';
import Feather from '@/components/feather-icon';
import { Text } from '@/components/text';
import { TextField } from '@/components/text-field';
import { colors, layout, space } from '@/components/theme';
import type { SessionUser } from '@/features/session/schema';
import type { Draft } from '@/features/records';
import type { useSubmitDraftMutation } from '@/features/inspections/field-api';
import { todayHref } from '@/features/inspections/hrefs';
import type { DraftProblem } from '@/features/records/schema';
import { DeclarationConfirm } from '@/features/instruments/ui';
import type { ChecklistTemplate } from '@/features/registry/schema';

type SubmitInput = {
  draft: Draft;
  template: ChecklistTemplate | null;
  problems: DraftProblem[];
  /** A change of the draft is still being saved on the phone. */
  saving: boolean;
  user: SessionUser | null;
  declarationText: string;
  declared: boolean;
  submit: ReturnType<typeof useSubmitDraftMutation>;
  syncNow: () => Promise<unknown>;
};

/**
 * The submit that puts the inspection in the phone's outbox, for the action bar: open only with nothing
 * standing in the way, the last change saved and the declaration made.
 */
export function submitAction({
  draft,
  template,
  problems,
  saving,
  user,
  declarationText,
  declared,
  submit,
  syncNow,
}: SubmitInput) {
  const run = async () => {
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
      return; // shown in the submit step from submit.error
    }
    void syncNow();
    router.replace(todayHref);
  };
  return {
    disabled: problems.length > 0 || saving || !declared || !user,
    busy: submit.isPending,
    run,
  };
}

/**
 * The last step of recording: notes for the supervisor, what still stands in the way (each a tap away
 * from its item), and the inspector's declaration. The submit itself is in the bar under the page.
 */
export function SubmitStep({
  draft,
  problems,
  onNotes,
  user,
  declarationText,
  fromDefault,
  declared,
  setDeclared,
  submit,
  onProblem,
}: {
  draft: Draft;
  problems: DraftProblem[];
  onNotes: (text: string) => void;
  user: SessionUser | null;
  declarationText: string;
  /** The text is the standard one: no administrator has set the inspection body's own. */
  fromDefault: boolean;
  declared: boolean;
  setDeclared: (declared: boolean) => void;
  submit: ReturnType<typeof useSubmitDraftMutation>;
  /** Goes to the item (or the part) a problem is about. */
  onProblem: (problem: DraftProblem) => void;
}) {
  return (
    <View style={styles.submit}>
      <TextField label="Notes for the supervisor" value={draft.notes} onChangeText={onNotes} multiline />
      {problems.length > 0 ? (
        <Card>
          <Text variant="heading">Before you submit</Text>
          <Text variant="small" muted>
            Tap one to go to it.
          </Text>
          <View role="list" accessibilityLabel="Before you submit">
            {problems.map((p, i) => (
              // A list holds list items (ARIA's required children); each item holds its link.
              <View key={`${p.itemId}${i}`} role="listitem">
                <Pressable
                  role="link"
                  accessibilityLabel={`Go to: ${p.message}`}
                  onPress={() => onProblem(p)}
                  style={styles.problem}
                >
                  <Feather name="arrow-right" size={18} color={colors.near} />
                  <Text color={colors.near} style={styles.problemText}>
                    {p.message}
                  </Text>
                </Pressable>
              </View>
            ))}
          </View>
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
    </View>
  );
}

const styles = StyleSheet.create({
  submit: { gap: space.lg },
  problem: {
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.sm,
    minHeight: layout.touchTarget,
    borderTopWidth: 1,
    borderTopColor: colors.surfaceSunk,
  },
  problemText: { flex: 1 },
});
