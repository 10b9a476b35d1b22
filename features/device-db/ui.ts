/** What other features may render or hook into from device-db (needs the app's runtime). */
export { DeviceDbProvider, useDeviceDb, useOptionalDeviceDb } from '@/features/device-db/provider';
export { PhoneStorageCard } from '@/features/device-db/storage-card';
export { LowStorageBanner } from '@/features/device-db/low-storage-banner';
