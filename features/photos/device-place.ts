import type { PhotoPlace } from '@/features/photos/metadata-schema';

/**
 * Native: the app has no location module, so a photo's place comes only from the camera's EXIF GPS
 * (expo-image-picker's `exif`). Asking is a no-op that says so.
 */
export const devicePlaceAvailable = false;

export async function askDevicePlace(): Promise<'granted' | 'denied' | 'unavailable'> {
  return 'unavailable';
}

export async function currentDevicePlace(): Promise<Omit<PhotoPlace, 'source'> | null> {
  return null;
}
