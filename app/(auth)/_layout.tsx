import { Redirect, Slot } from 'expo-router';

import { FullScreenWait } from '@/components/full-screen-wait';
import { roleHome, useSession } from '@/features/auth/api';

/** Signed-in users have no business on the sign-in page: send them to their home. */
export default function AuthLayout() {
  const session = useSession();
  if (session.isPending) return <FullScreenWait />;
  if (session.data) return <Redirect href={roleHome[session.data.user.role]} />;
  return <Slot />;
}
