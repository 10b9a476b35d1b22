/** What other features may use from motion-recording: runs anywhere (no React Native). */
export {
  appendSample,
  attributeJoint,
  chooseAxis,
  defaultSign,
  emptyTrace,
  parentRateOf,
  trimToCycles,
} from '@/features/motion-recording/processing';
export type { SensorSample, SensorTrace, TrimChoice, Trimmed } from '@/features/motion-recording/processing';
export { STANDARD_GRAVITY, fromNativeSensors, fromWebMotion } from '@/features/motion-recording/units';
export type { WebMotionLike } from '@/features/motion-recording/units';
