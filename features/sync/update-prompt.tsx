/**
 * A bar across the top of the app when a new version is ready. It sits in the layout flow (above the
 * screens, not over them), so it never hides the navigation or a form's buttons. Registering the
 * service worker happens here too: mounting this once in the signed-in frame (after sign-in) is all the
 * web build needs.
 */
import { StyleSheet, View } from 'react-native';
import { useSafeAreaInsets } from 'react-native-safe-area-context';

import { Button } from '@/components/button';
import { Text } from '@/components/text';
import { colors, space } from '@/components/theme';
import { useAppUpdate } from '@/features/sync/service-worker';

export function UpdatePrompt() {
  const { updateReady, applyUpdate } = useAppUpdate();
  const insets = useSafeAreaInsets();
  if (!updateReady) return null;
  return (
    <View style={[styles.bar, { paddingTop: space.sm + insets.top }]} accessibilityRole="alert">
      <Text color={colors.baseText} style={styles.text}>
        A new version of Pivotwatch is ready. Your drafts are saved.
      </Text>
      <Button label="Update now" tone="accent" onPress={applyUpdate} />
    </View>
  );
}

const styles = StyleSheet.create({
  bar: {
    flexDirection: 'row',
    flexWrap: 'wrap',
    alignItems: 'center',
    gap: space.md,
    paddingHorizontal: space.lg,
    paddingBottom: space.sm,
    backgroundColor: colors.baseRaised,
  },
  text: { flexGrow: 1, flexShrink: 1, minWidth: 180 },
});
