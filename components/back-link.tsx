import { Link, type Href } from 'expo-router';
import { Pressable, StyleSheet } from 'react-native';

import Feather from '@/components/feather-icon';
import { Text } from '@/components/text';
import { colors, layout, space } from '@/components/theme';

/** The way back up one level ("‹ Rides"): the app shell has no stack header on the web. */
export function BackLink({ href, label }: { href: Href; label: string }) {
  return (
    <Link href={href} asChild>
      <Pressable role="link" accessibilityLabel={`Back to ${label}`} style={styles.link}>
        <Feather name="chevron-left" size={20} color={colors.accent} />
        <Text variant="heading" color={colors.accent}>
          {label}
        </Text>
      </Pressable>
    </Link>
  );
}

const styles = StyleSheet.create({
  link: {
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.xs,
    minHeight: layout.touchTarget,
    alignSelf: 'flex-start',
    paddingRight: space.md,
  },
});
