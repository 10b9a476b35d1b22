import { useQueryClient } from '@tanstack/react-query';
import { useCallback, useEffect, useState } from 'react';

import {
  type DeviceDb,
  bindDeviceOwner,
  clearTodaySnapshot,
  followTodaySnapshot,
  seedTodayFromSnapshot,
} from '@/features/device-db';
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
      {user.role === 'inspector' ? <InspectorFrame user={user}>{shell}</InspectorFrame> : shell}
    </>
  );
}

/**
 * An inspector's pages sit on the device database, bound to them before any screen reads it. With a
 * snapshot of this person's Today (features/device-db/today-snapshot.ts) the pages render at once, Today from
 * the snapshot, while the database opens and is bound: every statement waits for that (provider.tsx,
 * `early`). Without one — a first visit, after a sign-out, another person — they wait as before.
 */
function InspectorFrame({ user, children }: { user: SessionUser; children: React.ReactNode }) {
  const client = useQueryClient();
  const [earlyFor] = useState(() => (seedTodayFromSnapshot(client, user.id) ? user.id : null));
  useEffect(() => followTodaySnapshot(client), [client]);
  const bind = useCallback(
    async (db: DeviceDb) => {
      const { changed } = await bindDeviceOwner(db, user.id);
      if (changed) {
        // Should the snapshot have outlived a change of person, nothing read before the binding stays:
        // the screens already showing read again (after the binding), the rest is forgotten.
        clearTodaySnapshot();
        await client.resetQueries({ predicate: (q) => q.queryKey[0] !== 'auth' }).catch(() => undefined);
      }
    },
    [client, user.id],
  );
  if (earlyFor === user.id)
    return (
      <DeviceDbProvider open={openOnce} prepare={bind} early>
        <BackgroundSync />
        {children}
      </DeviceDbProvider>
    );
  return (
    <DeviceDbProvider open={openOnce}>
      <DeviceOwnerGate userId={user.id}>
        <BackgroundSync />
        {children}
      </DeviceOwnerGate>
    </DeviceDbProvider>
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
