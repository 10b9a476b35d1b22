/** What every signed-in page sits in: navigation, the update prompt, an inspector's device database. */
export { SignedInFrame } from '@/features/shell/signed-in-frame';
export { warmUp } from '@/features/shell/signed-in-frame';
