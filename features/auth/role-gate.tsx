import { Link } from 'expo-router';
import { StyleSheet, View } from 'react-native';

import { Text } from '@/components/text';
import { colors, space } from '@/components/theme';
import { useSession } from '@/features/auth/api';
import { roleHome } from '@/features/auth/hrefs';
import type { Role, SessionUser } from '@/features/session/schema';

/**
 * Shows its children only to the given roles. The server enforces the same rules; this only
 * keeps people from landing on screens that would answer 403.
 */
export function RoleGate({
  roles,
  children,
}: {
  roles: readonly Role[];
  children: (user: SessionUser) => React.ReactNode;
}) {
  const session = useSession();
  const user = session.data?.user;
  if (!user) return null;
  if (!roles.includes(user.role)) {
    return (
      <View style={styles.box} accessibilityRole="alert">
        <Text variant="title">Not part of your role</Text>
        <Text muted>This page is for other roles. Your own start page has what you need.</Text>
        <Link href={roleHome[user.role]}>
          <Text variant="heading" color={colors.accent}>
            Go to my start page
          </Text>
        </Link>
      </View>
    );
  }
  return <>{children(user)}</>;
}

const styles = StyleSheet.create({ box: { padding: space.xxl, gap: space.md, alignItems: 'flex-start' } });
