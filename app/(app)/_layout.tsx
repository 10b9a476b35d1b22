import { Redirect, Slot } from 'expo-router';

import { FullScreenWait } from '@/components/full-screen-wait';
import { useSession } from '@/features/auth/api';
import { AppShell } from '@/features/shell/app-shell';

/** Everything in this group needs a session; signed-out visitors go to sign-in. */
export default function AppLayout() {
  const session = useSession();
  if (session.isPending) return <FullScreenWait />;
  if (!session.data) return <Redirect href="/sign-in" />;
  return (
    <AppShell user={session.data.user} offline={session.data.offline}>
      <Slot />
    </AppShell>
  );
}
