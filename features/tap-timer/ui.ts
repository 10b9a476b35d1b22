/** What other features may render or hook into from tap-timer (needs the app's runtime). */
export { MotionPicture } from '@/features/tap-timer/motion-picture';
export { TapTimer } from '@/features/tap-timer/tap-timer';
