import { router, type Href } from 'expo-router';
import { useCallback, useEffect, useId, useRef, useState } from 'react';
import { StyleSheet, View, type View as ViewType } from 'react-native';

import { Button } from '@/components/button';
import Feather from '@/components/feather-icon';
import { FormAlert, type FormProblem } from '@/components/form-alert';
import { Text } from '@/components/text';
import { colors, radius, space } from '@/components/theme';
import { type RegisterDeletable, useRegisterDeleteMutation } from '@/features/registry/api';
import { focusFirstButton, useEscapeKey } from '@/features/registry/dialog-keys';
import { announceRemoval } from '@/features/registry/removal-notice';
import { ApiRequestError, OfflineError } from '@/lib/api-errors';

/** The server's own reason for a refusal (what is still attached), or what else went wrong. */
export function deleteProblem(err: unknown, name: string): FormProblem {
  if (err instanceof OfflineError)
    return { message: `No connection to the server. ${name} was not deleted; try again online.` };
  if (err instanceof ApiRequestError) {
    if (err.status === 409) return { message: `${name} was not deleted. ${err.message}` };
    if (err.status === 404) return { message: `${name} is no longer in the register.` };
    if (err.status === 403) return { message: `You may not delete ${name}.` };
    return { message: `${name} was not deleted. ${err.message}` };
  }
  return { message: `Something went wrong. ${name} was not deleted; try again.` };
}

/**
 * Deleting a record of the register, in two steps: the button opens a confirmation that names the record
 * and says what happens, with Cancel focused first (Escape on the web cancels too). Nothing is sent until
 * the second button. A refusal shows the server's reason and keeps the page; on success the person is
 * taken to `listHref`, where `RemovalNotice` says what went (or `onDeleted` is told, for a record listed
 * on the page itself). The server writes the audit entry.
 */
export function DeleteAction({
  kind,
  id,
  noun,
  name,
  consequence,
  listHref,
  onDeleted,
  verb = 'Delete',
}: {
  kind: RegisterDeletable;
  id: string;
  /** "site", "ride", "schedule"… */
  noun: string;
  /** The record's own name, as people know it. */
  name: string;
  /** What deleting does, in a sentence after "Delete <name>?". */
  consequence: string;
  /** Where to go once deleted (its list, which says what went)… */
  listHref?: Href;
  /** …or, for a record listed on the same page, what to do instead (the message says what went). */
  onDeleted?: (message: string) => void;
  /** "Archive" where the server keeps the record readable. */
  verb?: string;
}) {
  const remove = useRegisterDeleteMutation(kind);
  const [asking, setAsking] = useState(false);
  const [problem, setProblem] = useState<FormProblem | null>(null);
  const cancelRef = useRef<ViewType>(null);
  const openRef = useRef<ViewType>(null);
  const titleId = useId();
  const textId = useId();
  const past = verb === 'Archive' ? 'archived' : 'deleted';

  const cancel = useCallback(() => {
    setAsking(false);
    // Back to the button that opened the question, so the keyboard stays where it was.
    setTimeout(() => focusFirstButton(openRef.current), 0);
  }, []);
  useEscapeKey(asking && !remove.isPending, cancel);
  useEffect(() => {
    if (asking) focusFirstButton(cancelRef.current);
  }, [asking]);

  const confirm = () => {
    setProblem(null);
    remove.mutate(id, {
      onSuccess: () => {
        const message = `${name} was ${past}. The audit log keeps a record of it.`;
        if (onDeleted) {
          setAsking(false);
          onDeleted(message);
        } else {
          announceRemoval(message);
          if (listHref) router.replace(listHref);
        }
      },
      onError: (err) => {
        setAsking(false);
        setProblem(deleteProblem(err, name));
      },
    });
  };

  return (
    <View style={styles.wrap}>
      {asking ? (
        <View style={styles.ask} role="alertdialog" aria-labelledby={titleId} aria-describedby={textId}>
          <View style={styles.title}>
            <Feather name="alert-triangle" size={18} color={colors.danger} />
            <Text variant="heading" nativeID={titleId} role="heading" aria-level={2}>
              {`${verb} ${name}?`}
            </Text>
          </View>
          <Text nativeID={textId}>{consequence}</Text>
          <View style={styles.buttons}>
            <View ref={cancelRef}>
              <Button label="Cancel" tone="quiet" onPress={cancel} />
            </View>
            <Button
              label={`${verb} ${noun}`}
              accessibilityLabel={`${verb} ${name}`}
              tone="danger"
              busy={remove.isPending}
              onPress={confirm}
            />
          </View>
        </View>
      ) : (
        <View ref={openRef} style={styles.start}>
          <Button
            label={`${verb} ${noun}…`}
            tone="danger"
            icon={<Feather name="trash-2" size={18} color={colors.danger} />}
            onPress={() => {
              setProblem(null);
              setAsking(true);
            }}
          />
        </View>
      )}
      <FormAlert problem={problem} />
    </View>
  );
}

const styles = StyleSheet.create({
  wrap: { gap: space.sm },
  start: { alignSelf: 'flex-start' },
  ask: {
    gap: space.md,
    padding: space.md,
    borderRadius: radius.md,
    borderWidth: 1.5,
    borderColor: colors.danger,
    backgroundColor: colors.surface,
  },
  title: { flexDirection: 'row', alignItems: 'center', gap: space.sm },
  buttons: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
});
