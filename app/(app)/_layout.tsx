import { Redirect, Slot } from 'expo-router';

import { FullScreenWait } from '@/components/full-screen-wait';
import { useSession } from '@/features/auth/api';
import { DeviceDbProvider } from '@/features/device-db/provider';
import { AppShell } from '@/features/shell/app-shell';
import { BackgroundSync } from '@/features/sync/background-sync';

/** Everything in this group needs a session; signed-out visitors go to sign-in. */
export default function AppLayout() {
  const session = useSession();
  if (session.isPending) return <FullScreenWait />;
  if (!session.data) return <Redirect href="/sign-in" />;
  const shell = (
    <AppShell user={session.data.user} offline={session.data.offline}>
      <Slot />
    </AppShell>
  );
  // Only inspectors record in the field; desk roles need no device database (and no single-tab lock).
  return session.data.user.role === 'inspector' ? (
    <DeviceDbProvider>
      <BackgroundSync />
      {shell}
    </DeviceDbProvider>
  ) : (
    shell
  );
}
