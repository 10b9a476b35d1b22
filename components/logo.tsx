import { StyleSheet, View } from 'react-native';
import { SvgXml } from 'react-native-svg';

import { logoMarkSvg } from '@/lib/logo-mark';
import { Text } from '@/components/text';
import { colors, space } from '@/components/theme';

export function Logo({ size = 36, onDark = false }: { size?: number; onDark?: boolean }) {
  return (
    <View style={styles.row} accessibilityRole="header" accessibilityLabel="Pivotwatch">
      <SvgXml xml={logoMarkSvg(size)} width={size} height={size} />
      <Text
        variant="title"
        color={onDark ? colors.chromeText : colors.base}
        style={{ fontSize: size * 0.62 }}
      >
        Pivotwatch
      </Text>
    </View>
  );
}

const styles = StyleSheet.create({ row: { flexDirection: 'row', alignItems: 'center', gap: space.sm } });
