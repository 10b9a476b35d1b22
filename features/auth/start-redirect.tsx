import { Redirect } from 'expo-router';

import { useSession } from '@/features/auth/api';
import { roleHome, signInHref } from '@/features/auth/hrefs';
import { forgetNextPath, nextPathAfterSignIn } from '@/features/auth/next-path';

/**
 * "/" lands each role on its own home, or on the page that was asked for before the session had loaded
 * (a reload, an e-mailed link to a notice).
 */
export function StartRedirect() {
  const session = useSession();
  if (!session.data) return <Redirect href={signInHref()} />;
  const next = nextPathAfterSignIn(null);
  forgetNextPath();
  return <Redirect href={next ?? roleHome[session.data.user.role]} />;
}
