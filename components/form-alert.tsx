import { StyleSheet, View } from 'react-native';

import { Text } from '@/components/text';
import { colors, radius, space } from '@/components/theme';

export type FormProblem = {
  message: string;
  /** Problems the form has no field for, each already in words ("Row 4, column massKg: …"). */
  details?: string[];
};

/** What went wrong with a save, in plain words, above the submit button. */
export function FormAlert({ problem }: { problem: FormProblem | null | undefined }) {
  if (!problem) return null;
  return (
    <View style={styles.box} role="alert">
      <Text variant="heading" color={colors.danger}>
        {problem.message}
      </Text>
      {problem.details?.map((d, i) => (
        <Text key={i} variant="small">
          • {d}
        </Text>
      ))}
    </View>
  );
}

const styles = StyleSheet.create({
  box: {
    backgroundColor: colors.overSoft,
    borderLeftWidth: 4,
    borderLeftColor: colors.danger,
    borderRadius: radius.sm,
    padding: space.md,
    gap: space.xs,
  },
});
