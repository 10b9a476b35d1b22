import { type Href, Link, usePathname } from 'expo-router';
import { Pressable, ScrollView, StyleSheet } from 'react-native';

import { Text } from '@/components/text';
import { colors, layout, radius, space } from '@/components/theme';
import type { Role } from '@/features/session/schema';
import {
  auditHref,
  checklistsHref,
  companiesHref,
  instrumentsHref,
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
  { href: checklistsHref, label: 'Checklists', roles: staff },
  { href: companiesHref, label: 'Companies', roles: staff },
  { href: sitesHref, label: 'Sites', roles: staff },
  { href: instrumentsHref, label: 'Instruments', roles: staff },
  { href: auditHref(), label: 'Audit log', roles: planners },
];

function tabsFor(role: Role): Tab[] {
  return registerTabs.filter((t) => t.roles.includes(role));
}

/** A row of links between the register's pages; scrolls sideways on a phone. */
export function RegisterTabs({ role }: { role: Role }) {
  const pathname = usePathname();
  const tabs = tabsFor(role);
  if (tabs.length < 2) return null;
  return (
    <ScrollView
      horizontal
      showsHorizontalScrollIndicator={false}
      contentContainerStyle={styles.row}
      role="navigation"
      accessibilityLabel="Register"
    >
      {tabs.map((t) => {
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
      })}
    </ScrollView>
  );
}

const styles = StyleSheet.create({
  row: { gap: space.xs, paddingVertical: 2 },
  tab: {
    minHeight: layout.touchTarget - 4,
    paddingHorizontal: space.lg,
    justifyContent: 'center',
    borderRadius: radius.md,
    borderWidth: 1.5,
    borderColor: colors.border,
    backgroundColor: colors.surface,
  },
  tabActive: { backgroundColor: colors.base, borderColor: colors.base },
});
