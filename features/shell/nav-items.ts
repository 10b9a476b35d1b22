import type { Role } from '@/features/auth/schema';

export type NavIcon = 'sun' | 'inbox' | 'home' | 'users' | 'activity' | 'user' | 'list';
export type NavItem = { href: string; label: string; icon: NavIcon };

/** What each role sees in the navigation, in order. The first item is the role's home. */
export const navItems: Record<Role, NavItem[]> = {
  inspector: [
    { href: '/today', label: 'Today', icon: 'sun' },
    { href: '/loads', label: 'Load check', icon: 'activity' },
    { href: '/account', label: 'Account', icon: 'user' },
  ],
  supervisor: [
    { href: '/review', label: 'Review', icon: 'inbox' },
    { href: '/loads', label: 'Load check', icon: 'activity' },
    { href: '/account', label: 'Account', icon: 'user' },
  ],
  operator: [
    { href: '/my-rides', label: 'My rides', icon: 'home' },
    { href: '/account', label: 'Account', icon: 'user' },
  ],
  admin: [
    { href: '/admin', label: 'Admin', icon: 'users' },
    { href: '/loads', label: 'Load check', icon: 'activity' },
    { href: '/account', label: 'Account', icon: 'user' },
  ],
};

/** True when `pathname` belongs to the nav item (exact or a sub-route). */
export function isActive(item: NavItem, pathname: string): boolean {
  return pathname === item.href || pathname.startsWith(`${item.href}/`);
}
