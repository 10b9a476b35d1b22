import type { DeviceDb } from '@/features/device-db';
import { DeviceDbProvider, openDeviceDb } from '@/features/device-db/ui';
import type { Role, SessionUser } from '@/features/session/schema';
import { AppShell } from '@/features/shell/app-shell';
import { DeviceOwnerGate } from '@/features/shell/device-owner-gate';
import { BackgroundSync, UpdatePrompt } from '@/features/sync/ui';

/**
 * What every signed-in page sits in, loaded after sign-in (app-layout.tsx). The update prompt mounts
 * here, and with it the service worker's registration: the worker precaches every chunk of the app, which
 * should not compete with the sign-in form on a weak signal.
 */
export function SignedInFrame({ user, children }: { user: SessionUser; children: React.ReactNode }) {
  const shell = <AppShell user={user}>{children}</AppShell>;
  return (
    <>
      <UpdatePrompt />
      {/* Only inspectors record in the field; desk roles need no device database (and no single-tab lock). */}
      {user.role === 'inspector' ? (
        <DeviceDbProvider open={openOnce}>
          <DeviceOwnerGate userId={user.id}>
            <BackgroundSync />
            {shell}
          </DeviceOwnerGate>
        </DeviceDbProvider>
      ) : (
        shell
      )}
    </>
  );
}

/** The device database's first opening, started by `warmUp` before the frame renders. */
let early: Promise<DeviceDb> | null = null;

/**
 * Starts what the role's first screen will wait for before it renders: an inspector's device database
 * (opened once; the provider takes this very attempt, so a refusal such as another tab holding the
 * database is shown by the provider as before).
 */
export function warmUp(role: Role): void {
  if (role !== 'inspector' || early) return;
  early = openDeviceDb();
  early.catch(() => undefined);
}

/** The provider's opener: the early attempt once, then a fresh one (its "Try again"). */
function openOnce(): Promise<DeviceDb> {
  const attempt = early ?? openDeviceDb();
  early = null;
  return attempt;
}
