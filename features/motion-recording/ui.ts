/** React parts of motion-recording other features may use (they need the app's runtime). */
export { MeasuredRiderTable } from '@/features/motion-recording/measured-rider';
export type { ComputedRider } from '@/features/motion-recording/measured-rider';
export { MotionRecorder } from '@/features/motion-recording/recorder';
export { RateTrace } from '@/features/motion-recording/rate-trace';
