/** What other features may render or hook into from device-db (needs the app's runtime). */
export { DeviceDbProvider, useDeviceDb, useOptionalDeviceDb } from '@/features/device-db/provider';
// Started ahead of the provider by the signed-in frame (features/shell), which gets the same connection.
export { openDeviceDb } from '@/features/device-db/open-device-db';
export { PhoneStorageCard } from '@/features/device-db/storage-card';
export { LowStorageBanner } from '@/features/device-db/low-storage-banner';
