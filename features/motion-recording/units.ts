/**
 * The platforms' sensor readings in the one convention the recording uses: rates in rad/s about the
 * phone's x (right of the screen), y (top edge) and z (out of the screen), right-handed; specific force
 * in g, so a phone lying face up reads z = +1. Pure: tested against the platforms' documented values.
 */
import type { SensorSample } from '@/features/motion-recording/processing';

/** Standard gravity, m/s² (the conventional value of the CGPM, 1901). */
export const STANDARD_GRAVITY = 9.80665;
const DEG = Math.PI / 180;

/** The parts of a browser `devicemotion` event the recording reads (W3C DeviceOrientation and Motion). */
export type WebMotionLike = {
  timeStamp: number;
  /** deg/s: alpha about z, beta about x, gamma about y. */
  rotationRate: { alpha: number | null; beta: number | null; gamma: number | null } | null;
  /** m/s², the acceleration plus an acceleration equal and opposite to gravity (face up: z = +9.8). */
  accelerationIncludingGravity: { x: number | null; y: number | null; z: number | null } | null;
};

/** A browser event as a sample, or null when it carries no rotation rate (no gyroscope). */
export function fromWebMotion(e: WebMotionLike, startMs: number): SensorSample | null {
  const r = e.rotationRate;
  if (!r || r.alpha === null || r.beta === null || r.gamma === null) return null;
  const a = e.accelerationIncludingGravity;
  const force: [number, number, number] | null =
    a && a.x !== null && a.y !== null && a.z !== null
      ? [a.x / STANDARD_GRAVITY, a.y / STANDARD_GRAVITY, a.z / STANDARD_GRAVITY]
      : null;
  return {
    tS: (e.timeStamp - startMs) / 1000,
    rate: [r.beta * DEG, r.gamma * DEG, r.alpha * DEG],
    force,
  };
}

/**
 * expo-sensors' Gyroscope (rad/s about x, y, z on both platforms) and Accelerometer (in g) as a sample.
 * The accelerometer's sign differs: Android reports specific force (face up z = +1), iOS reports the
 * opposite (face up z = −1), so iOS readings are negated (`accelSign`, from accel-sign.ios.ts). expo's
 * DeviceMotion is not used for rates: its alpha/beta/gamma map to different axes on iOS and Android.
 */
export function fromNativeSensors(
  gyro: { x: number; y: number; z: number },
  accel: { x: number; y: number; z: number } | null,
  tS: number,
  accelSign: 1 | -1,
): SensorSample {
  return {
    tS,
    rate: [gyro.x, gyro.y, gyro.z],
    force: accel ? [accelSign * accel.x, accelSign * accel.y, accelSign * accel.z] : null,
  };
}
