/**
 * The people screens, the password change card and the set-password page against a stand-in API: what
 * each sends, what each shows back, and that bad input is caught in words before anything is sent. The
 * people are invented demo staff.
 */
import type { QueryClient } from '@tanstack/react-query';
import { Text } from 'react-native';
import { fireEvent, screen, waitFor } from 'expo-router/testing-library';

import { PeopleScreen } from '@/features/admin/people-screen';
import { PersonScreen } from '@/features/admin/person-screen';
import { PasswordChangeCard } from '@/features/auth/ui';
import { SetPasswordScreen } from '@/features/auth/set-password-screen';
import type { SessionUser } from '@/features/session/schema';

import { renderScreens, sessionClient } from '@/tests/support/app-screens';
import { ok, standInApi } from '@/tests/support/stand-in-api';

jest.setTimeout(30_000);

const mockTokenSet = jest.fn(async (_s: unknown) => {});
jest.mock('@/features/session/token-store', () => ({
  tokenStore: { get: async () => null, set: (s: unknown) => mockTokenSet(s), clear: async () => {} },
}));

const admin: SessionUser = {
  id: 'u-admin',
  email: 'gwen.ashdown@halvard.test',
  name: 'Gwen Ashdown',
  role: 'admin',
  companyId: null,
  companyName: null,
};
const at = '2026-11-20T09:30:00.000Z';
const person = (id: string, name: string, extra: object = {}) => ({
  id,
  email: `${id}@halvard.test`,
  name,
  role: 'inspector',
  companyId: null,
  companyName: null,
  createdAt: at,
  disabledAt: null,
  state: 'active',
  lastChangeAt: at,
  ...extra,
});
const list = {
  users: [
    person('u-admin', 'Gwen Ashdown', { role: 'admin', email: admin.email }),
    person('u-tomas', 'Tomas Brightwell'),
    person('u-odile', 'Odile Marsh', {
      role: 'operator',
      companyId: 'c1',
      companyName: 'Tamsworth Pier Leisure',
    }),
    person('u-ivo', 'Ivo Castellane', { disabledAt: at, state: 'disabled' }),
  ],
  companies: [{ id: 'c1', name: 'Tamsworth Pier Leisure' }],
};

const clients: QueryClient[] = [];
const client = () => {
  const c = sessionClient(admin);
  clients.push(c);
  return c;
};
afterEach(() => {
  for (const c of clients.splice(0)) c.clear();
  jest.restoreAllMocks();
  mockTokenSet.mockClear();
});

describe('people list', () => {
  test('lists everyone; search and the account filter narrow it', async () => {
    standInApi({ '/api/admin/users': () => ok(list) });
    renderScreens(client(), { 'admin/people': PeopleScreen }, '/admin/people');
    await screen.findByText('Tomas Brightwell');
    expect(screen.getByText('Odile Marsh')).toBeTruthy();
    fireEvent.changeText(screen.getByLabelText('Search people'), 'tamsworth');
    await waitFor(() => expect(screen.queryByText('Tomas Brightwell')).toBeNull());
    expect(screen.getByText('Odile Marsh')).toBeTruthy();
    fireEvent.changeText(screen.getByLabelText('Search people'), '');
    fireEvent.press(screen.getByRole('radio', { name: /Disabled/ }));
    await waitFor(() => expect(screen.queryByText('Tomas Brightwell')).toBeNull());
    expect(screen.getByText('Ivo Castellane')).toBeTruthy();
  });

  test('an invitation sends name, e-mail and role and no password, then says where it went', async () => {
    const api = standInApi({
      '/api/admin/users': (call) =>
        call.method === 'POST'
          ? {
              status: 201,
              body: {
                invited: true,
                user: person('u-wren', 'Wren Aldous', { email: 'wren@halvard.test', state: 'invited' }),
              },
            }
          : ok(list),
    });
    renderScreens(client(), { 'admin/people': PeopleScreen }, '/admin/people');
    fireEvent.press(await screen.findByRole('button', { name: 'Add a person' }));
    fireEvent.changeText(screen.getByLabelText('Name'), 'Wren Aldous');
    fireEvent.changeText(screen.getByLabelText('E-mail'), 'Wren@Halvard.test');
    fireEvent.press(screen.getByRole('button', { name: 'Send invitation' }));
    await screen.findByText(/Invitation sent to wren@halvard.test/);
    expect(api.callsTo('POST', '/api/admin/users').map((c) => c.body)).toEqual([
      { name: 'Wren Aldous', email: 'Wren@Halvard.test', role: 'inspector', companyId: null },
    ]);
  });

  test('a password the rule refuses is caught before anything is sent', async () => {
    const api = standInApi({ '/api/admin/users': () => ok(list) });
    renderScreens(client(), { 'admin/people': PeopleScreen }, '/admin/people');
    fireEvent.press(await screen.findByRole('button', { name: 'Add a person' }));
    fireEvent.press(screen.getByRole('radio', { name: 'Set a password' }));
    fireEvent.changeText(screen.getByLabelText('Name'), 'Wren Aldous');
    fireEvent.changeText(screen.getByLabelText('E-mail'), 'wren@halvard.test');
    fireEvent.changeText(screen.getByLabelText('Password'), 'short');
    fireEvent.press(screen.getByRole('button', { name: 'Create account' }));
    await screen.findByText('Use at least 12 characters');
    expect(api.callsTo('POST', '/api/admin/users')).toHaveLength(0);
  });
});

describe('a person’s page', () => {
  test('disabling asks first, then posts; the server’s refusal is shown in its own words', async () => {
    const api = standInApi({
      '/api/admin/users': () => ok(list),
      '/api/admin/users/u-admin': () => ok({ person: { ...list.users[0], pendingLink: null, history: [] } }),
      '/api/admin/users/u-admin/disable': () => ({
        status: 409,
        body: { error: { code: 'last_admin', message: 'Gwen Ashdown is the only active administrator.' } },
      }),
    });
    renderScreens(client(), { 'admin/people/[id]': PersonScreen }, '/admin/people/u-admin');
    fireEvent.press(await screen.findByRole('button', { name: 'Disable account' }));
    expect(api.callsTo('POST', '/api/admin/users/u-admin/disable')).toHaveLength(0);
    await screen.findByText(/signed out on every device at once/);
    fireEvent.press(screen.getByRole('button', { name: 'Yes, disable account' }));
    await screen.findByText('Gwen Ashdown is the only active administrator.');
    expect(api.callsTo('POST', '/api/admin/users/u-admin/disable')).toHaveLength(1);
  });

  test('a lost phone’s key is withdrawn after asking once more; then it reads as withdrawn', async () => {
    const key = {
      keyId: '3f0c9a7b12d4e856',
      label: 'Chromium on Android',
      createdAt: at,
      revokedAt: null as string | null,
      revokedBy: null as string | null,
    };
    const api = standInApi({
      '/api/admin/users': () => ok(list),
      '/api/admin/users/u-tomas': () => ok({ person: { ...list.users[1], pendingLink: null, history: [] } }),
      '/api/devices/keys': (call) => (call.url.searchParams.get('userId') === 'u-tomas' ? ok([key]) : ok([])),
      [`/api/devices/keys/${key.keyId}/revoke`]: () => {
        Object.assign(key, { revokedAt: '2026-11-21T10:00:00.000Z', revokedBy: 'u-admin' });
        return ok({ key });
      },
    });
    renderScreens(client(), { 'admin/people/[id]': PersonScreen }, '/admin/people/u-tomas');
    await screen.findByText('Chromium on Android');
    expect(screen.getByText(/Key 3f0c9a7b12d4e856 · registered .* · in use/)).toBeTruthy();
    fireEvent.press(screen.getByRole('button', { name: 'Withdraw key' }));
    await screen.findByText(/will no longer be able to send inspections/);
    expect(api.callsTo('POST', `/api/devices/keys/${key.keyId}/revoke`)).toHaveLength(0);
    fireEvent.press(screen.getByRole('button', { name: 'Yes, withdraw key' }));
    await screen.findByText(/· withdrawn /);
    expect(api.callsTo('POST', `/api/devices/keys/${key.keyId}/revoke`)).toHaveLength(1);
    expect(screen.queryByRole('button', { name: 'Withdraw key' })).toBeNull();
  });
});

describe('PasswordChangeCard', () => {
  const Card = () => <PasswordChangeCard user={admin} />;
  const fill = (current: string, next: string, repeat: string) => {
    fireEvent.changeText(screen.getByLabelText('Current password'), current);
    fireEvent.changeText(screen.getByLabelText('New password'), next);
    fireEvent.changeText(screen.getByLabelText('New password again'), repeat);
    fireEvent.press(screen.getByRole('button', { name: 'Change password' }));
  };

  test('checks the new password first, then keeps the fresh session the server answers with', async () => {
    const api = standInApi({
      '/api/auth/password': () =>
        ok({ token: 'fresh', expiresAt: '2026-12-10T00:00:00.000Z', user: { ...admin } }),
    });
    renderScreens(client(), { account: Card }, '/account');
    fill('old one', admin.email, admin.email);
    await screen.findByText('The password may not be the e-mail address');
    fill('old one', 'a brand new secret', 'a brand new secreT');
    await screen.findByText('The two new passwords differ');
    expect(api.calls).toHaveLength(0);
    fill('old one', 'a brand new secret', 'a brand new secret');
    await screen.findByText(/Password changed/);
    expect(api.callsTo('POST', '/api/auth/password')[0].body).toEqual({
      currentPassword: 'old one',
      newPassword: 'a brand new secret',
    });
    expect(mockTokenSet).toHaveBeenCalledWith(expect.objectContaining({ token: 'fresh' }));
  });

  test('a wrong current password is shown at that field', async () => {
    standInApi({
      '/api/auth/password': () => ({
        status: 400,
        body: {
          error: {
            code: 'validation_failed',
            message: 'The current password is not right',
            issues: [{ path: 'currentPassword', message: 'The current password is not right' }],
          },
        },
      }),
    });
    renderScreens(client(), { account: Card }, '/account');
    fill('wrong', 'a brand new secret', 'a brand new secret');
    await screen.findByText('The current password is not right');
    expect(mockTokenSet).not.toHaveBeenCalled();
  });
});

describe('set-password page', () => {
  const Today = () => <Text>today page</Text>;
  const info = (state: string) => ({
    purpose: 'invite',
    name: 'Wren Aldous',
    email: 'wren@halvard.test',
    expiresAt: '2026-12-10T09:30:00.000Z',
    state,
  });

  test('a valid link sets the password, keeps the session and opens the person’s home', async () => {
    const api = standInApi((call) => {
      if (call.path !== '/api/auth/password-links/tok123') return undefined;
      return call.method === 'POST'
        ? ok({
            token: 'new-session',
            expiresAt: '2026-12-10T00:00:00.000Z',
            user: {
              ...admin,
              id: 'u-wren',
              role: 'inspector',
              email: 'wren@halvard.test',
              name: 'Wren Aldous',
            },
          })
        : ok(info('valid'));
    });
    renderScreens(
      client(),
      { 'set-password': SetPasswordScreen, today: Today },
      '/set-password?token=tok123',
    );
    await screen.findByText('Welcome to Pivotwatch');
    fireEvent.changeText(screen.getByLabelText('New password'), 'lantern wheel at dusk');
    fireEvent.changeText(screen.getByLabelText('New password again'), 'lantern wheel at dusk');
    fireEvent.press(screen.getByRole('button', { name: 'Set password and sign in' }));
    await screen.findByText('today page');
    expect(api.callsTo('POST', '/api/auth/password-links/tok123')[0].body).toEqual({
      password: 'lantern wheel at dusk',
    });
    // Anonymous: the link is the proof, no token is sent.
    expect(api.calls.every((c) => !('Authorization' in c.headers))).toBe(true);
    expect(mockTokenSet).toHaveBeenCalledWith(expect.objectContaining({ token: 'new-session' }));
  });

  test.each([
    ['used', 'This link has been used'],
    ['expired', 'This link has run out'],
  ])('a %s link says so and offers sign-in', async (state, words) => {
    standInApi({ '/api/auth/password-links/tok123': () => ok(info(state)) });
    renderScreens(client(), { 'set-password': SetPasswordScreen }, '/set-password?token=tok123');
    await screen.findByText(words);
    expect(screen.getByRole('button', { name: 'Go to sign-in' })).toBeTruthy();
  });
});
