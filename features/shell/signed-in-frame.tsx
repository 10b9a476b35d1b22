import { useEffect, useState } from 'react';

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
            <BackgroundSyncSoon />
            {shell}
          </DeviceOwnerGate>
        </DeviceDbProvider>
      ) : (
        shell
      )}
    </>
  );
}

/** How long background sync waits at most for the first screen to be on and the page idle. */
const BACKGROUND_SYNC_AFTER_MS = 2000;

/**
 * Background sync (on connection return, every half minute) starts once the first screen has had its
 * turn: its first reads (outbox, photos, sync state) would otherwise queue ahead of the screen's own reads
 * of the device database, which runs one statement at a time. A screen that shows sync state (Today)
 * starts the same controller itself when it mounts, so nothing waits for this on that screen.
 */
function BackgroundSyncSoon() {
  const [on, setOn] = useState(false);
  useEffect(() => {
    const start = () => setOn(true);
    if (typeof requestIdleCallback === 'function') {
      const idle = requestIdleCallback(start, { timeout: BACKGROUND_SYNC_AFTER_MS });
      return () => cancelIdleCallback(idle);
    }
    const timer = setTimeout(start, BACKGROUND_SYNC_AFTER_MS);
    return () => clearTimeout(timer);
  }, []);
  return on ? <BackgroundSync /> : null;
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
