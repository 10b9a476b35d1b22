import { Redirect, Slot, useGlobalSearchParams } from 'expo-router';

import { FullScreenWait } from '@/components/full-screen-wait';
import { useSession } from '@/features/auth/api';
import { roleHome } from '@/features/auth/hrefs';
import { nextPathAfterSignIn } from '@/features/auth/next-path';

/**
 * Signed-in users have no business on the sign-in page: send them on to the page they came for (`next`,
 * when it is one of ours) or to their home.
 */
export function AuthLayout() {
  const session = useSession();
  const { next } = useGlobalSearchParams<{ next?: string }>();
  if (session.isPending) return <FullScreenWait />;
  if (session.data) return <Redirect href={nextPathAfterSignIn(next) ?? roleHome[session.data.user.role]} />;
  return <Slot />;
}
