/**
 * Motion readings in the browser: the `devicemotion` events (W3C DeviceOrientation and Motion), which
 * need a secure context, as the app's offline use does. Safari asks the person first
 * (`DeviceMotionEvent.requestPermission()`, which must run in a tap); other browsers fire without asking.
 */
import { fromWebMotion } from '@/features/motion-recording/units';
import type { SensorSample } from '@/features/motion-recording/processing';

type PermissionAsking = { requestPermission?: () => Promise<'granted' | 'denied' | 'default'> };

/** Asks for motion access where the browser wants it; a message when it cannot be had, else null. */
export async function askMotionPermission(): Promise<string | null> {
  if (typeof window === 'undefined' || typeof DeviceMotionEvent === 'undefined')
    return 'This browser gives no motion readings. Use a phone with a gyroscope.';
  if (!window.isSecureContext)
    return 'Motion readings need a secure (https) connection to the app. Open it from its https address.';
  const asking = DeviceMotionEvent as unknown as PermissionAsking;
  if (typeof asking.requestPermission === 'function') {
    try {
      const answer = await asking.requestPermission();
      if (answer !== 'granted')
        return 'Motion access was refused. Allow motion and orientation access for this site in the browser settings, then try again.';
    } catch {
      return 'The browser did not let the app ask for motion access. Tap Start again.';
    }
  }
  return null;
}

/** Calls `onSample` for every reading until the returned function is called. */
export function startMotionCapture(onSample: (s: SensorSample) => void, onNoGyro: () => void): () => void {
  let start: number | null = null;
  let got = 0;
  let without = 0;
  const handler = (e: DeviceMotionEvent) => {
    const sample = fromWebMotion(e, start ?? e.timeStamp);
    if (sample) {
      if (start === null) {
        start = e.timeStamp;
        sample.tS = 0;
      }
      got++;
      onSample(sample);
      // A browser may send an empty event or two of its own before the sensor's: only a run of them counts.
    } else if (got === 0 && ++without === 20) onNoGyro();
  };
  window.addEventListener('devicemotion', handler);
  return () => window.removeEventListener('devicemotion', handler);
}
