import { StyleSheet, View } from 'react-native';

import { Spinner } from '@/components/spinner';
import { colors } from '@/components/theme';

export function FullScreenWait() {
  return (
    <View style={styles.root}>
      <Spinner size="large" color={colors.base} />
    </View>
  );
}

const styles = StyleSheet.create({
  root: { flex: 1, alignItems: 'center', justifyContent: 'center', backgroundColor: colors.bg },
});
