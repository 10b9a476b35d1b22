import { roleHome } from '@/features/auth/hrefs';
import { roles } from '@/features/session/schema';
import { isActive, navItems } from '@/features/shell/nav-items';

test.each(roles)('the first navigation item of %s is its home', (role) => {
  expect(navItems[role][0].href).toBe(roleHome[role]);
});

test('operators get no staff tools in their navigation', () => {
  expect(navItems.operator.map((i) => i.href)).not.toContain('/loads');
  expect(navItems.operator.map((i) => i.href)).not.toContain('/admin');
});

test('an item is active on its own path and its sub-routes, not on look-alike paths', () => {
  const item = { href: '/today' as const, label: 'Today', icon: 'sun' as const };
  expect(isActive(item, '/today')).toBe(true);
  expect(isActive(item, '/today/ride-1')).toBe(true);
  expect(isActive(item, '/todays-notes')).toBe(false);
});

test.each(roles)('%s has a Notices item that opens /notices and is active on a notice', (role) => {
  const item = navItems[role].find((i) => i.href === '/notices');
  expect(item?.label).toBe('Notices');
  expect(item && isActive(item, '/notices/n-7')).toBe(true);
});

test('an operator’s navigation: home, notices, account, in that order', () => {
  expect(navItems.operator.map((i) => i.href)).toEqual(['/my-rides', '/notices', '/account']);
});
