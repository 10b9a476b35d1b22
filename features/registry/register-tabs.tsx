import { type Href, Link, usePathname } from 'expo-router';
import { Pressable, ScrollView, StyleSheet, View } from 'react-native';

import { Text } from '@/components/text';
import { colors, layout, radius, space } from '@/components/theme';
import { useWide } from '@/components/use-wide';
import type { Role } from '@/features/session/schema';
import {
  auditHref,
  bulletinsHref,
  checklistsHref,
  companiesHref,
  instrumentsHref,
  roundsHref,
  schedulesHref,
  sitesHref,
} from '@/features/registry/hrefs';
import { ridesHref } from '@/features/rides';

type Tab = { href: Extract<Href, string>; label: string; roles: readonly Role[] };

const staff = ['admin', 'supervisor', 'inspector'] as const;
const planners = ['admin', 'supervisor'] as const;

/** The register's pages. Schedules and the audit log are for the people who plan and approve. */
const registerTabs: Tab[] = [
  { href: ridesHref, label: 'Rides', roles: staff },
  { href: schedulesHref, label: 'Schedules', roles: planners },
  { href: roundsHref, label: 'Rounds', roles: planners },
  { href: checklistsHref, label: 'Checklists', roles: staff },
  { href: bulletinsHref, label: 'Bulletins', roles: staff },
  { href: companiesHref, label: 'Companies', roles: staff },
  { href: sitesHref, label: 'Sites', roles: staff },
  { href: instrumentsHref, label: 'Instruments', roles: staff },
  { href: auditHref(), label: 'Audit log', roles: planners },
];

function tabsFor(role: Role): Tab[] {
  return registerTabs.filter((t) => t.roles.includes(role));
}

/**
 * Links between the register's pages: one row on a desktop; on a phone they wrap onto as many rows as
 * they need (a row that scrolled sideways hid the later tabs, the current one among them, past the edge
 * with nothing to say they were there).
 */
export function RegisterTabs({ role }: { role: Role }) {
  const pathname = usePathname();
  const wide = useWide();
  const tabs = tabsFor(role);
  if (tabs.length < 2) return null;
  const links = tabs.map((t) => {
    const active = pathname === t.href || pathname.startsWith(`${t.href}/`);
    return (
      <Link key={t.href} href={t.href} asChild>
        <Pressable
          role="link"
          aria-current={active ? 'page' : undefined}
          style={StyleSheet.flatten([styles.tab, active && styles.tabActive])}
        >
          <Text variant="label" color={active ? colors.baseText : colors.text}>
            {t.label}
          </Text>
        </Pressable>
      </Link>
    );
  });
  return wide ? (
    <ScrollView
      horizontal
      showsHorizontalScrollIndicator={false}
      contentContainerStyle={styles.row}
      role="navigation"
      accessibilityLabel="Register"
    >
      {links}
    </ScrollView>
  ) : (
    <View style={[styles.row, styles.wrap]} role="navigation" accessibilityLabel="Register">
      {links}
    </View>
  );
}

const styles = StyleSheet.create({
  row: { gap: space.xs, paddingVertical: 2 },
  wrap: { flexDirection: 'row', flexWrap: 'wrap' },
  tab: {
    minHeight: layout.touchTarget - 4,
    paddingVertical: space.xs,
    paddingHorizontal: space.lg,
    justifyContent: 'center',
    borderRadius: radius.md,
    borderWidth: 1.5,
    borderColor: colors.border,
    backgroundColor: colors.surface,
  },
  tabActive: { backgroundColor: colors.base, borderColor: colors.base },
});
