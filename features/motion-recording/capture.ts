/**
 * Motion readings on a phone: expo-sensors' Gyroscope (rad/s) and Accelerometer (g), asked for at
 * 100 Hz (the platforms may give less). Each gyro reading carries the latest accelerometer reading.
 */
import { Accelerometer, Gyroscope } from 'expo-sensors';

import { ACCEL_SIGN } from '@/features/motion-recording/accel-sign';
import type { SensorSample } from '@/features/motion-recording/processing';
import { fromNativeSensors } from '@/features/motion-recording/units';

const INTERVAL_MS = 10;

export async function askMotionPermission(): Promise<string | null> {
  try {
    if (!(await Gyroscope.isAvailableAsync())) return 'This phone has no gyroscope the app can read.';
    const answer = await Gyroscope.requestPermissionsAsync();
    if (!answer.granted) return 'Motion access was refused. Allow it for this app in the phone’s settings.';
  } catch {
    return 'The phone’s motion sensors could not be started.';
  }
  return null;
}

export function startMotionCapture(onSample: (s: SensorSample) => void, _onNoGyro: () => void): () => void {
  let accel: { x: number; y: number; z: number } | null = null;
  let start: number | null = null;
  Gyroscope.setUpdateInterval(INTERVAL_MS);
  Accelerometer.setUpdateInterval(INTERVAL_MS);
  const a = Accelerometer.addListener((m) => {
    accel = { x: m.x, y: m.y, z: m.z };
  });
  const g = Gyroscope.addListener((m) => {
    // The sensor's own timestamp (s) where it gives one: the JS thread's clock jitters with the UI.
    const t = typeof m.timestamp === 'number' && m.timestamp > 0 ? m.timestamp : Date.now() / 1000;
    if (start === null) start = t;
    onSample(fromNativeSensors(m, accel, t - start, ACCEL_SIGN));
  });
  return () => {
    a.remove();
    g.remove();
  };
}
