import type { PhotoPlace } from '@/features/photos/metadata-schema';

/** Web: the browser's geolocation, asked for only when the inspector turns "keep where photos are taken" on. */
export const devicePlaceAvailable = true;

const geolocation = () => (typeof navigator !== 'undefined' ? navigator.geolocation : undefined);

function position(options: PositionOptions): Promise<GeolocationPosition> {
  return new Promise((resolve, reject) => {
    const geo = geolocation();
    if (!geo) reject(new Error('unavailable'));
    else geo.getCurrentPosition(resolve, reject, options);
  });
}

/** Asks the browser for permission (its own prompt) by asking for a position once. */
export async function askDevicePlace(): Promise<'granted' | 'denied' | 'unavailable'> {
  if (!geolocation()) return 'unavailable';
  try {
    await position({ timeout: 20_000, maximumAge: 300_000 });
    return 'granted';
  } catch (err) {
    // PERMISSION_DENIED is 1 (W3C Geolocation API); a timeout or no fix still means permission was given.
    return (err as GeolocationPositionError | undefined)?.code === 1 ? 'denied' : 'granted';
  }
}

/**
 * Where the device is now, or null when it cannot say within a few seconds (no fix, no permission): the
 * photo is kept without a place rather than waiting.
 */
export async function currentDevicePlace(): Promise<Omit<PhotoPlace, 'source'> | null> {
  try {
    const { coords } = await position({ enableHighAccuracy: true, timeout: 8_000, maximumAge: 60_000 });
    const accuracy = coords.accuracy > 0 && coords.accuracy <= 100_000 ? coords.accuracy : undefined;
    return {
      lat: coords.latitude,
      lon: coords.longitude,
      ...(accuracy !== undefined ? { accuracyM: accuracy } : {}),
    };
  } catch {
    return null;
  }
}
