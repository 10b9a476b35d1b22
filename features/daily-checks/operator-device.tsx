import { useState } from 'react';

import { type DeviceDb, bindDeviceOwner, noteSession } from '@/features/device-db';
import { DeviceDbProvider } from '@/features/device-db/ui';
import { tokenStore } from '@/features/session';
import { BackgroundSync } from '@/features/sync/ui';

/**
 * The operator's phone database, for the daily check screen only: bound to the person like an
 * inspector's (features/shell/signed-in-frame.tsx) and with sync running while it is open. Only this
 * screen holds it, so an operator's other pages (notices, rides) keep working in any number of tabs.
 */
export function OperatorDevice({ userId, children }: { userId: string; children: React.ReactNode }) {
  const [prepare] = useState(() => async (dev: DeviceDb) => {
    await bindDeviceOwner(dev, userId);
    // Records are signed with a key made for this sign-in.
    const stored = await tokenStore.get();
    if (stored) await noteSession(dev, stored.token);
  });
  return (
    <DeviceDbProvider prepare={prepare}>
      <BackgroundSync />
      {children}
    </DeviceDbProvider>
  );
}
