import { Redirect } from 'expo-router';

import { roleHome, useSession } from '@/features/auth/api';

/** "/" lands each role on its own home. */
export default function Index() {
  const session = useSession();
  if (!session.data) return <Redirect href="/sign-in" />;
  return <Redirect href={roleHome[session.data.user.role]} />;
}
