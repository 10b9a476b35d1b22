import { StyleSheet, View } from 'react-native';

import { CAUTION_FULL, CAUTION_SHORT } from '@/lib/caution-text';
import { Text } from '@/components/text';
import { colors, radius, space } from '@/components/theme';

export { CAUTION_FULL, CAUTION_SHORT };

export function Caution({ full = false }: { full?: boolean }) {
  return (
    <View style={styles.box} role="note">
      <Text variant="label" color={colors.accent}>
        SAFETY CAUTION
      </Text>
      <Text variant="small">{full ? CAUTION_FULL : CAUTION_SHORT}</Text>
    </View>
  );
}

const styles = StyleSheet.create({
  box: {
    borderLeftWidth: 4,
    borderLeftColor: colors.accent,
    backgroundColor: colors.accentSoft,
    borderRadius: radius.sm,
    padding: space.md,
    gap: space.xs,
  },
});
