import { Link } from 'expo-router';
import { StyleSheet, View } from 'react-native';

import { Logo } from '@/components/logo';
import { Text } from '@/components/text';
import { colors, space } from '@/components/theme';

export function NotFoundScreen() {
  return (
    <View style={styles.root}>
      <Logo />
      <Text variant="title">This page does not exist</Text>
      <Text muted>The link may be old, or the page was moved.</Text>
      <Link href="/" style={styles.link}>
        <Text variant="heading" color={colors.accent}>
          Go to your start page
        </Text>
      </Link>
    </View>
  );
}

const styles = StyleSheet.create({
  root: { flex: 1, alignItems: 'center', justifyContent: 'center', gap: space.md, padding: space.xl },
  link: { padding: space.md },
});
