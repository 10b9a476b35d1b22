/**
 * The e-mailed link to a notice: a signed-out visitor who opens /notices/<id> is sent to sign-in and,
 * once signed in, lands back on that notice. Only paths on this site are followed; anything that a
 * browser would read as another site (per the WHATWG URL standard, "//host" and "/\host" are
 * scheme-relative; from memory) sends the person to their own start page instead.
 */
import { QueryClientProvider } from '@tanstack/react-query';
import { Text } from 'react-native';
import { SafeAreaProvider } from 'react-native-safe-area-context';
import { fireEvent, renderRouter, screen, waitFor } from 'expo-router/testing-library';

import AppLayout from '@/app/(app)/_layout';
import AuthLayout from '@/app/(auth)/_layout';
import { makeQueryClient } from '@/features/api/query-client';
import { authKeys } from '@/features/auth/api';
import { safeNextPath } from '@/features/auth/next-path';
import type { SessionUser } from '@/features/session/schema';
import { SignInScreen } from '@/features/auth/sign-in-screen';
import { ok, standInApi } from '@/tests/support/stand-in-api';

let mockStored: { token: string; expiresAt: string; user: SessionUser } | null = null;
jest.mock('@/features/session/token-store', () => ({
  tokenStore: {
    get: async () => mockStored,
    set: async (s: typeof mockStored) => {
      mockStored = s;
    },
    clear: async () => {
      mockStored = null;
    },
  },
}));

const operator: SessionUser = {
  id: 'u-op',
  email: 'operator@pivotwatch.test',
  name: 'Priya Castellan',
  role: 'operator',
  companyId: 'co-tpl',
  companyName: 'Tamsworth Pier Leisure',
};

describe('safeNextPath', () => {
  test.each([
    ['/notices/n-7', '/notices/n-7'],
    ['/notices?rideId=ride-sky', '/notices?rideId=ride-sky'],
    ['/my-rides', '/my-rides'],
  ])('follows %s', (input, expected) => {
    expect(safeNextPath(input)).toBe(expected);
  });

  test.each([
    ['//evil.example/notices/n-7', 'scheme-relative: another host'],
    ['/\\evil.example', 'browsers read a backslash as a slash'],
    ['https://evil.example/notices/n-7', 'an absolute URL'],
    ['javascript:alert(1)', 'a script URL'],
    ['notices/n-7', 'not a path from the root'],
    ['/notices/n-7\n', 'a control character'],
    ['/ /evil.example', 'whitespace'],
    ['/sign-in?next=/notices/n-7', 'back to sign-in'],
    ['', 'empty'],
  ])('refuses %j (%s)', (input) => {
    expect(safeNextPath(input)).toBeNull();
  });

  test('refuses what is not a string; takes the first of repeated parameters', () => {
    expect(safeNextPath(undefined)).toBeNull();
    expect(safeNextPath(42)).toBeNull();
    expect(safeNextPath(['/notices/n-7', '//evil.example'])).toBe('/notices/n-7');
  });
});

describe('signing in from an e-mailed link', () => {
  let client: ReturnType<typeof makeQueryClient>;

  beforeEach(() => {
    mockStored = null;
    client = makeQueryClient();
    standInApi({
      '/api/auth/sign-in': () =>
        ok({ token: 'token-of-priya', expiresAt: '2099-01-01T00:00:00.000Z', user: operator }),
    });
  });

  afterEach(() => {
    client.clear();
    jest.useRealTimers();
    jest.restoreAllMocks();
  });

  function renderApp(initialUrl: string) {
    client.setQueryData(authKeys.session(), null);
    return renderRouter(
      {
        _layout: () => {
          const { Slot } = jest.requireActual('expo-router');
          return (
            <SafeAreaProvider
              initialMetrics={{
                frame: { x: 0, y: 0, width: 390, height: 844 },
                insets: { top: 0, left: 0, right: 0, bottom: 0 },
              }}
            >
              <QueryClientProvider client={client}>
                <Slot />
              </QueryClientProvider>
            </SafeAreaProvider>
          );
        },
        '(auth)/_layout': AuthLayout,
        '(auth)/sign-in': SignInScreen,
        '(app)/_layout': AppLayout,
        '(app)/notices/[id]': () => <Text>The notice, for its operator</Text>,
        '(app)/my-rides': () => <Text>The operator’s start page</Text>,
        '(app)/account': () => <Text>Account page</Text>,
      },
      { initialUrl },
    );
  }

  async function signIn() {
    fireEvent.changeText(await screen.findByLabelText('E-mail'), 'operator@pivotwatch.test');
    fireEvent.changeText(screen.getByLabelText('Password'), 'pivotwatch-demo');
    fireEvent.press(screen.getByRole('button', { name: 'Sign in' }));
  }

  test('the notice link goes to sign-in with the notice as `next`, and back to the notice after', async () => {
    const view = renderApp('/notices/n-7');
    expect(
      await screen.findByText('Sign in with your company’s account to open the notice you were sent.'),
    ).toBeTruthy();
    expect(view.getPathname()).toBe('/sign-in');
    expect(view.getSearchParams()).toEqual({ next: '/notices/n-7' });
    await signIn();
    expect(await screen.findByText('The notice, for its operator')).toBeTruthy();
    await waitFor(() => expect(view.getPathname()).toBe('/notices/n-7'));
  });

  test('a `next` pointing at another site is not followed: the operator lands on their start page', async () => {
    const view = renderApp('/sign-in?next=%2F%2Fevil.example%2Fnotices%2Fn-7');
    expect(
      await screen.findByText('Use the account your inspection body or ride company gave you.'),
    ).toBeTruthy();
    await signIn();
    expect(await screen.findByText('The operator’s start page')).toBeTruthy();
    expect(view.getPathname()).toBe('/my-rides');
  });

  test('signed out on the account page (where people sign out), sign-in leads to the start page', async () => {
    const view = renderApp('/account');
    expect(
      await screen.findByText('Use the account your inspection body or ride company gave you.'),
    ).toBeTruthy();
    expect(view.getSearchParams()).toEqual({});
    await signIn();
    expect(await screen.findByText('The operator’s start page')).toBeTruthy();
  });
});
