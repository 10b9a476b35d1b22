import { useState } from 'react';
import { StyleSheet, View } from 'react-native';

import Feather from '@/components/feather-icon';
import { IconButton } from '@/components/icon-button';
import { Text } from '@/components/text';
import { colors, radius, space } from '@/components/theme';

/**
 * What was just deleted, said once on the list the person comes back to. Kept in memory, not in the URL:
 * a reload or a shared link must not announce a removal again.
 */
let pending: string | null = null;

/** Set before leaving a deleted record's page for its list. */
export function announceRemoval(message: string): void {
  pending = message;
}

/** Takes the message (once): the list shows it until dismissed or left. */
function takeRemoval(): string | null {
  const message = pending;
  pending = null;
  return message;
}

export function RemovalNotice() {
  const [message, setMessage] = useState<string | null>(takeRemoval);
  if (!message) return null;
  return (
    <View style={styles.bar} role="status" accessibilityLiveRegion="polite">
      <Feather name="check-circle" size={18} color={colors.within} />
      <Text style={styles.text}>{message}</Text>
      <IconButton icon="x" label="Dismiss" onPress={() => setMessage(null)} />
    </View>
  );
}

const styles = StyleSheet.create({
  bar: {
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.sm,
    paddingLeft: space.md,
    borderRadius: radius.md,
    borderWidth: 1,
    borderColor: colors.within,
    backgroundColor: colors.surface,
  },
  text: { flex: 1 },
});
