import type { Href } from 'expo-router';

import { accountHref, roleHome } from '@/features/auth';
import { calculatorHref } from '@/features/calculator';
import type { Role } from '@/features/session/schema';
import { noticesHref } from '@/features/notices';
import { ridesHref } from '@/features/rides';

export type NavIcon = 'sun' | 'inbox' | 'home' | 'users' | 'activity' | 'user' | 'list' | 'file-text';
export type NavItem = {
  href: Extract<Href, string>;
  label: string;
  icon: NavIcon;
  /** Other path prefixes that belong to this item (the register's pages sit under "Rides"). */
  also?: readonly string[];
};

const rides: NavItem = { href: ridesHref, label: 'Rides', icon: 'list', also: ['/register'] };
/** Notices to operators: an operator's own company's, every notice for the inspection body's staff. */
const notices: NavItem = { href: noticesHref, label: 'Notices', icon: 'file-text' };
const loadCheck: NavItem = { href: calculatorHref, label: 'Load check', icon: 'activity' };
const account: NavItem = { href: accountHref, label: 'Account', icon: 'user' };

/** What each role sees in the navigation, in order. The first item is the role's home. */
export const navItems: Record<Role, NavItem[]> = {
  inspector: [{ href: roleHome.inspector, label: 'Today', icon: 'sun' }, rides, notices, loadCheck, account],
  supervisor: [
    { href: roleHome.supervisor, label: 'Review', icon: 'inbox' },
    rides,
    notices,
    loadCheck,
    account,
  ],
  operator: [{ href: roleHome.operator, label: 'My rides', icon: 'home' }, notices, account],
  admin: [{ href: roleHome.admin, label: 'Admin', icon: 'users' }, rides, notices, loadCheck, account],
};

const under = (prefix: string, pathname: string) => pathname === prefix || pathname.startsWith(`${prefix}/`);

/** True when `pathname` belongs to the nav item (exact or a sub-route, or one of its other prefixes). */
export function isActive(item: NavItem, pathname: string): boolean {
  return under(item.href, pathname) || (item.also ?? []).some((p) => under(p, pathname));
}
