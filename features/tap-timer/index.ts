/** What other features may use from tap-timer: everything else in the folder is its own. */
export { MotionPicture } from '@/features/tap-timer/motion-picture';
export { TapTimer } from '@/features/tap-timer/tap-timer';
