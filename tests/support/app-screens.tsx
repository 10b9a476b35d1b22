/**
 * Screens under test at their routes, through expo-router's test renderer. The app's own layout needs the
 * device database and a real session; a screen test gives each screen only what it needs: a query client
 * that already holds the session, and (through `wrap`) any provider of its own such as the device
 * database.
 */
import { type QueryClient, QueryClientProvider } from '@tanstack/react-query';
import type { ReactElement, ReactNode } from 'react';
import type { ReactTestInstance } from 'react-test-renderer';
import { renderRouter } from 'expo-router/testing-library';

import { makeQueryClient } from '@/features/api/query-client';
import { authKeys } from '@/features/auth/api';
import type { SessionUser } from '@/features/session/schema';

/** The screens by route (`'review/[id]': InspectionReviewScreen`); the layout is added here. */
export type Screens = Record<string, () => ReactElement | null>;

/** A query client holding the session as the app keeps it after sign-in (`offline` as after a start with no signal). */
export function sessionClient(user: SessionUser, offline = false): QueryClient {
  const client = makeQueryClient();
  client.setQueryData(authKeys.session(), { user, offline });
  return client;
}

/** Renders `screens` at `initialUrl` under a layout that provides `client` (and whatever `wrap` adds). */
export function renderScreens(
  client: QueryClient,
  screens: Screens,
  initialUrl: string,
  wrap: (slot: ReactNode) => ReactNode = (slot) => slot,
) {
  // Taken from the real module: some test files mock parts of expo-router.
  const { Slot } = jest.requireActual('expo-router');
  return renderRouter(
    {
      _layout: () => <QueryClientProvider client={client}>{wrap(<Slot />)}</QueryClientProvider>,
      ...screens,
    },
    { initialUrl },
  );
}

/**
 * The table row, link card or list item a link or button leads from (components/sortable-table.tsx,
 * components/link-card.tsx): the control holds the name only, its holder the rest of what it shows.
 */
export function holderOf(control: ReactTestInstance): ReactTestInstance {
  const holds = (n: ReactTestInstance) =>
    n.props.role === 'row' || n.props.role === 'listitem' || n.props.testID === 'link-card';
  let node: ReactTestInstance | null = control.parent;
  while (node && !holds(node)) node = node.parent;
  if (!node) throw new Error('The control sits in no table row, link card or list item');
  return node;
}
