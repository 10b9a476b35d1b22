import { StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { FormAlert, type FormProblem } from '@/components/form-alert';
import { Text } from '@/components/text';
import { colors, radius, space } from '@/components/theme';

/**
 * The frame every form on a finding shares (report an action, verify and close, reopen): its heading and
 * what it does, the fields, the problem the last try ran into, and send or cancel (cancel waits for a send).
 */
export function FindingFormFrame({
  label,
  title,
  intro,
  problem,
  submitLabel,
  submitTone,
  onSubmit,
  busy,
  onCancel,
  children,
}: {
  /** What a screen reader calls the form. */
  label: string;
  title: string;
  intro?: string;
  problem: FormProblem | null;
  submitLabel: string;
  submitTone: 'accent' | 'danger';
  onSubmit: () => void;
  busy: boolean;
  onCancel: () => void;
  children: React.ReactNode;
}) {
  return (
    <View style={styles.frame} accessibilityLabel={label}>
      <Text variant="heading">{title}</Text>
      {intro ? (
        <Text variant="small" muted>
          {intro}
        </Text>
      ) : null}
      {children}
      <FormAlert problem={problem} />
      <View style={styles.buttons}>
        <Button label={submitLabel} tone={submitTone} onPress={onSubmit} busy={busy} />
        <Button label="Cancel" tone="quiet" onPress={onCancel} disabled={busy} />
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  frame: {
    gap: space.md,
    padding: space.md,
    borderRadius: radius.md,
    borderWidth: 2,
    borderColor: colors.base,
    backgroundColor: colors.surface,
  },
  buttons: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
});
