import { Redirect, Slot, usePathname } from 'expo-router';
import { useEffect } from 'react';

import { FullScreenWait } from '@/components/full-screen-wait';
import { rememberNextPath, signInHref, useSession } from '@/features/auth';
import { SignedInFrame, forgetStoredSessionPreload, preloadSignedIn } from '@/features/shell/lazy-screens';

/**
 * Everything in this group needs a session; signed-out visitors go to sign-in, which brings them back to
 * the page they asked for (an e-mailed link to a notice) once they are in.
 */
export function AppLayout() {
  const session = useSession();
  const pathname = usePathname();
  const role = session.data?.user.role;
  const signedOut = !session.isPending && !session.data;
  useEffect(() => {
    if (role) preloadSignedIn(role);
    else if (signedOut) forgetStoredSessionPreload();
  }, [role, signedOut]);
  if (session.isPending) {
    // While the session loads this layout renders no Slot, and the router falls back to "/" (which then
    // sends the person on): remember the page asked for, so "/" can bring them back to it.
    if (comeBackTo(pathname)) rememberNextPath(pathname);
    return <FullScreenWait />;
  }
  if (!session.data) {
    if (comeBackTo(pathname)) rememberNextPath(pathname);
    return (
      // A plain string: on the web, an href object here also carried the page's own params along.
      <Redirect href={signInHref(comeBackTo(pathname) ? pathname : null)} />
    );
  }
  // The frame (navigation, an inspector's device database) and every screen load after sign-in.
  return (
    <SignedInFrame user={session.data.user}>
      <Slot />
    </SignedInFrame>
  );
}

/**
 * Whether to return to this page after signing in. Not the start page ("/" picks each role's own) and
 * not the account page, where people sign out: whoever signs in next wants their own start page.
 */
const comeBackTo = (pathname: string | null) => !!pathname && pathname !== '/' && pathname !== '/account';
