import { type QueryClient, useQueryClient } from '@tanstack/react-query';
import { useEffect, useState } from 'react';

import { type DeviceDb, bindDeviceOwner, fieldKeys, noteSession } from '@/features/device-db';
import { DeviceDbProvider, openDeviceDb } from '@/features/device-db/ui';
import { restoreGlimpse, saveGlimpse, tokenStore } from '@/features/session';
import type { Role, SessionUser } from '@/features/session/schema';
import { AppShell } from '@/features/shell/app-shell';
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
        <InspectorDevice key={user.id} userId={user.id}>
          <BackgroundSync />
          {shell}
        </InspectorDevice>
      ) : (
        shell
      )}
    </>
  );
}

/** What Today shows, kept as the inspector's glimpse (features/session/glimpse.ts). */
const glimpseKeys = [fieldKeys.rides(), fieldKeys.sent()];

/**
 * The inspector's device database, bound to them before any screen's statement runs: when the person
 * changed (someone signed in after another's token ran out, or after a sign-out whose wipe failed) the
 * shared caches are wiped first and the previous person's unsent work stays sealed
 * (features/device-db/device-owner). With a glimpse of their last Today on this browser, the screens
 * draw from it at once and read the database once it has opened.
 */
function InspectorDevice({ userId, children }: { userId: string; children: React.ReactNode }) {
  const client = useQueryClient();
  const [fromGlimpse] = useState(() => restoreGlimpse(client, userId));
  useEffect(() => keepGlimpse(client, userId), [client, userId]);
  const [prepare] = useState(() => async (dev: DeviceDb) => {
    const { changed } = await bindDeviceOwner(dev, userId);
    // The sign-in this phone now works under: records are signed with a key made for it.
    const stored = await tokenStore.get();
    if (stored) await noteSession(dev, stored.token);
    // Reads of the device made for someone else must not be shown from memory either. Not awaited: the
    // screens' reads start again on the database this very step is readying.
    if (changed) void client.resetQueries({ predicate: (q) => q.queryKey[0] !== 'auth' });
  });
  return (
    <DeviceDbProvider open={openOnce} prepare={prepare} early={fromGlimpse}>
      {children}
    </DeviceDbProvider>
  );
}

/** Saves the glimpse shortly after Today's reads change (several land together after a sync). */
function keepGlimpse(client: QueryClient, userId: string): () => void {
  let timer: ReturnType<typeof setTimeout> | null = null;
  const unsubscribe = client.getQueryCache().subscribe((event) => {
    if (event.type !== 'updated' || event.action.type !== 'success') return;
    const key = JSON.stringify(event.query.queryKey);
    if (!glimpseKeys.some((k) => JSON.stringify(k) === key)) return;
    if (timer) clearTimeout(timer);
    timer = setTimeout(() => {
      timer = null;
      saveGlimpse(client, userId, glimpseKeys);
    }, GLIMPSE_SAVE_DELAY_MS);
  });
  return () => {
    unsubscribe();
    if (timer) clearTimeout(timer);
  };
}

const GLIMPSE_SAVE_DELAY_MS = 300;

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
