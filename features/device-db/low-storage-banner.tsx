/**
 * A strip under the top bar when the phone is running out of room for this app, before a photo or a
 * draft fails to save (or the browser clears the site). Only where a device database is open: desk
 * roles keep nothing that could be lost.
 */
import { Link } from 'expo-router';
import { StyleSheet, View } from 'react-native';

import Feather from '@/components/feather-icon';
import { Text } from '@/components/text';
import { colors, layout, space } from '@/components/theme';
import { accountHref } from '@/features/auth';
import { useOptionalDeviceDb } from '@/features/device-db/provider';
import { useStorageSpaceQuery } from '@/features/device-db/storage-api';
import { isSpaceLow } from '@/features/device-db/storage-space-types';
import { formatBytes } from '@/lib/bytes';

export function LowStorageBanner() {
  const dev = useOptionalDeviceDb();
  const space = useStorageSpaceQuery(dev !== null);
  if (!dev || !space.data || !isSpaceLow(space.data)) return null;
  return (
    <View style={styles.banner} role="alert">
      <Feather name="hard-drive" size={16} color={colors.near} />
      <Text variant="small" color={colors.near} style={styles.grow}>
        Low space: {formatBytes(space.data.availableBytes)} left on this phone for Pivotwatch. Send what is
        waiting, then free space in{' '}
        <Link href={accountHref} style={styles.link} accessibilityRole="link">
          Account
        </Link>
        .
      </Text>
    </View>
  );
}

const styles = StyleSheet.create({
  banner: {
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.sm,
    minHeight: layout.touchTarget,
    paddingHorizontal: space.lg,
    paddingVertical: space.xs,
    backgroundColor: colors.nearSoft,
  },
  grow: { flex: 1 },
  link: { textDecorationLine: 'underline', fontWeight: '600' },
});
