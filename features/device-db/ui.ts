/** What other features may render or hook into from device-db (needs the app's runtime). */
export { DeviceDbProvider, useDeviceDb } from '@/features/device-db/provider';
