import { Link, usePathname } from 'expo-router';
import { Pressable, StyleSheet, View } from 'react-native';
import { useSafeAreaInsets } from 'react-native-safe-area-context';

import Feather from '@/components/feather-icon';
import { Logo } from '@/components/logo';
import { Text } from '@/components/text';
import { colors, layout, space } from '@/components/theme';
import { useWide } from '@/components/use-wide';
import { roleLabel } from '@/features/auth';
import { LowStorageBanner } from '@/features/device-db/ui';
import type { SessionUser } from '@/features/session/schema';
import { type NavItem, isActive, navItems } from '@/features/shell/nav-items';
import { useOnline } from '@/features/sync/ui';

/**
 * Phone: content with a bottom bar. Desktop (≥ 1024 px): a side rail with the same items. The connection
 * banner follows the network and the last request (`useOnline`), not how the session was loaded: a
 * session checked online an hour ago says nothing about the signal now.
 */
export function AppShell({ user, children }: { user: SessionUser; children: React.ReactNode }) {
  const offline = !useOnline();
  const wide = useWide();
  const pathname = usePathname();
  const insets = useSafeAreaInsets();
  const items = navItems[user.role];

  if (wide) {
    return (
      <View style={styles.wideRoot}>
        <View style={styles.side} role="navigation">
          <View style={styles.sideLogo}>
            <Logo size={32} onDark />
          </View>
          <View style={styles.sideItems}>
            {items.map((item) => (
              <SideItem key={item.href} item={item} active={isActive(item, pathname)} />
            ))}
          </View>
          <View style={styles.sideUser}>
            <Text variant="heading" color={colors.chromeText}>
              {user.name}
            </Text>
            <Text variant="small" color={colors.chromeMuted}>
              {roleLabel[user.role]}
              {user.companyName ? ` · ${user.companyName}` : ''}
            </Text>
          </View>
        </View>
        <View style={styles.wideMain}>
          {offline ? <OfflineBanner /> : null}
          <LowStorageBanner />
          {children}
        </View>
      </View>
    );
  }

  return (
    <View style={[styles.phoneRoot, { paddingTop: insets.top }]}>
      <View style={styles.topBar}>
        <Logo size={26} onDark />
        <Text variant="small" color={colors.chromeMuted} numberOfLines={1}>
          {roleLabel[user.role]}
        </Text>
      </View>
      {offline ? <OfflineBanner /> : null}
      <LowStorageBanner />
      <View style={styles.phoneMain}>{children}</View>
      <View
        style={[styles.bottomBar, { paddingBottom: Math.max(insets.bottom, space.xs) }]}
        role="navigation"
      >
        {items.map((item) => (
          <BottomItem key={item.href} item={item} active={isActive(item, pathname)} />
        ))}
      </View>
    </View>
  );
}

function OfflineBanner() {
  return (
    <View style={styles.offline} accessibilityLiveRegion="polite" role="status">
      <Feather name="cloud-off" size={16} color={colors.near} />
      <Text variant="small" color={colors.near}>
        No connection — working from what is saved on this device.
      </Text>
    </View>
  );
}

function SideItem({ item, active }: { item: NavItem; active: boolean }) {
  return (
    <Link href={item.href} asChild>
      <Pressable
        accessibilityRole="link"
        accessibilityState={{ selected: active }}
        // Link (asChild) hands its style to the DOM node as-is on web: pass one flat object, not an array.
        style={StyleSheet.flatten([styles.sideItem, active && styles.sideItemActive])}
      >
        <Feather name={item.icon} size={20} color={active ? colors.chromeText : colors.chromeMuted} />
        <Text variant="heading" color={active ? colors.chromeText : colors.chromeMuted}>
          {item.label}
        </Text>
      </Pressable>
    </Link>
  );
}

function BottomItem({ item, active }: { item: NavItem; active: boolean }) {
  return (
    <Link href={item.href} asChild>
      <Pressable
        accessibilityRole="link"
        accessibilityState={{ selected: active }}
        accessibilityLabel={item.label}
        style={styles.bottomItem}
      >
        <View style={[styles.bottomPill, active && styles.bottomPillActive]}>
          <Feather name={item.icon} size={22} color={active ? colors.base : colors.textMuted} />
        </View>
        <Text variant="label" color={active ? colors.base : colors.textMuted}>
          {item.label}
        </Text>
      </Pressable>
    </Link>
  );
}

const styles = StyleSheet.create({
  wideRoot: { flex: 1, flexDirection: 'row', backgroundColor: colors.bg },
  side: {
    width: layout.sideNavWidth,
    backgroundColor: colors.chrome,
    paddingVertical: space.xl,
    paddingHorizontal: space.md,
  },
  sideLogo: { paddingHorizontal: space.sm, marginBottom: space.xxl },
  sideItems: { gap: space.xs, flex: 1 },
  sideItem: {
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.md,
    minHeight: layout.touchTarget,
    paddingHorizontal: space.md,
    borderRadius: 10,
  },
  sideItemActive: {
    backgroundColor: colors.chromeRaised,
    borderLeftWidth: 4,
    borderLeftColor: colors.chromeAccent,
  },
  sideUser: {
    borderTopWidth: 1,
    borderTopColor: colors.chromeRaised,
    paddingTop: space.lg,
    paddingHorizontal: space.sm,
    gap: 2,
  },
  wideMain: { flex: 1 },
  phoneRoot: { flex: 1, backgroundColor: colors.bg },
  topBar: {
    backgroundColor: colors.chrome,
    flexDirection: 'row',
    alignItems: 'center',
    justifyContent: 'space-between',
    paddingHorizontal: space.lg,
    paddingVertical: space.md,
    gap: space.md,
  },
  phoneMain: { flex: 1 },
  offline: {
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.sm,
    backgroundColor: colors.nearSoft,
    paddingHorizontal: space.lg,
    paddingVertical: space.sm,
  },
  bottomBar: {
    flexDirection: 'row',
    backgroundColor: colors.surface,
    borderTopWidth: 1,
    borderTopColor: colors.border,
    paddingTop: space.xs,
  },
  bottomItem: { flex: 1, alignItems: 'center', gap: 2, minHeight: 56, justifyContent: 'center' },
  bottomPill: { paddingHorizontal: space.lg, paddingVertical: 3, borderRadius: 14 },
  bottomPillActive: { backgroundColor: colors.accentSoft },
});
