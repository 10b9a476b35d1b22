import { useEffect } from 'react';
import { StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { Text } from '@/components/text';
import { colors, layout, radius, space } from '@/components/theme';

/**
 * A short message with an Undo, for a removal that has been made but may be taken back. It closes by
 * itself after `windowMs`; `onExpire` then says the undo is no longer offered. A new message restarts
 * the window.
 */
export function UndoSnackbar({
  message,
  onUndo,
  onExpire,
  windowMs,
  token,
}: {
  message: string;
  onUndo: () => void;
  onExpire: () => void;
  windowMs: number;
  /** Changes with each removal, so the window starts again for the next one. */
  token: string;
}) {
  useEffect(() => {
    const timer = setTimeout(onExpire, windowMs);
    return () => clearTimeout(timer);
    // The window belongs to one removal: only a new one restarts it.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [token, windowMs]);
  return (
    <View style={styles.bar} role="status" accessibilityLiveRegion="polite">
      <Text color={colors.baseText} style={styles.text} numberOfLines={2}>
        {message}
      </Text>
      <Button label="Undo" tone="quiet" onPress={onUndo} accessibilityLabel={`Undo: ${message}`} />
    </View>
  );
}

const styles = StyleSheet.create({
  bar: {
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.md,
    minHeight: layout.touchTarget + space.md,
    paddingHorizontal: space.lg,
    paddingVertical: space.xs,
    marginHorizontal: space.md,
    marginBottom: space.sm,
    borderRadius: radius.md,
    backgroundColor: colors.base,
  },
  text: { flex: 1 },
});
