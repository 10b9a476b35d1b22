/**
 * A bar at the bottom of the screen when a new version of the app is ready. Registering the service
 * worker happens here too, so mounting this once in the root layout is all the web build needs.
 */
import { StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { Text } from '@/components/text';
import { colors, space } from '@/components/theme';
import { useAppUpdate } from '@/features/sync/service-worker';

export function UpdatePrompt() {
  const { updateReady, applyUpdate } = useAppUpdate();
  if (!updateReady) return null;
  return (
    <View style={styles.bar} accessibilityRole="alert">
      <Text color={colors.baseText} style={styles.text}>
        A new version of Pivotwatch is ready. Your drafts are saved.
      </Text>
      <Button label="Update now" tone="accent" onPress={applyUpdate} />
    </View>
  );
}

const styles = StyleSheet.create({
  bar: {
    position: 'absolute',
    left: space.md,
    right: space.md,
    bottom: space.md,
    flexDirection: 'row',
    flexWrap: 'wrap',
    alignItems: 'center',
    gap: space.md,
    padding: space.md,
    borderRadius: 12,
    backgroundColor: colors.base,
  },
  text: { flexGrow: 1, flexShrink: 1, minWidth: 180 },
});
