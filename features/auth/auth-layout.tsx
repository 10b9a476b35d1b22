import { Redirect, Slot, useGlobalSearchParams, usePathname } from 'expo-router';

import { FullScreenWait } from '@/components/full-screen-wait';
import { useSession } from '@/features/auth/api';
import { roleHome } from '@/features/auth/hrefs';
import { nextPathAfterSignIn } from '@/features/auth/next-path';

/**
 * Signed-in users have no business on the sign-in page: send them on to the page they came for (`next`,
 * when it is one of ours) or to their home. The set-password page is the exception (see below).
 */
export function AuthLayout() {
  const session = useSession();
  const { next } = useGlobalSearchParams<{ next?: string }>();
  const pathname = usePathname();
  if (session.isPending) return <FullScreenWait />;
  // A set-password link opened on a device someone is signed in on still works: it signs its owner in.
  if (pathname === '/set-password') return <Slot />;
  if (session.data) return <Redirect href={nextPathAfterSignIn(next) ?? roleHome[session.data.user.role]} />;
  return <Slot />;
}
