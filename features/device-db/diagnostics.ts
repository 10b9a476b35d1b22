import type { DeviceDb } from '@/features/device-db/connection';

/** Only the web build has a page console to inspect the device database from. */
export function exposeDiagnostics(_db: DeviceDb): void {}
