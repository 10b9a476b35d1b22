import { StyleSheet, View } from 'react-native';

import Feather from '@/components/feather-icon';
import { Text } from '@/components/text';
import { colors, space } from '@/components/theme';
import { accountStateVocabulary, type AccountState } from '@/lib/vocabulary';

// Each state has its own icon as well as its word, so it never rests on colour.
const look: Record<AccountState, { icon: 'check-circle' | 'mail' | 'slash'; color: string }> = {
  active: { icon: 'check-circle', color: colors.within },
  invited: { icon: 'mail', color: colors.accent },
  disabled: { icon: 'slash', color: colors.textMuted },
};

/** Where an account stands, as an icon and its word; `described` adds what it means. */
export function AccountStateMark({ state, described }: { state: AccountState; described?: boolean }) {
  const words = accountStateVocabulary[state];
  return (
    <View style={styles.row}>
      <Feather name={look[state].icon} size={16} color={look[state].color} accessibilityElementsHidden />
      <Text variant="small" color={look[state].color}>
        {words.label}
        {described ? ` — ${words.description}` : ''}
      </Text>
    </View>
  );
}

const styles = StyleSheet.create({
  row: { flexDirection: 'row', alignItems: 'center', gap: space.xs, flexShrink: 1 },
});
