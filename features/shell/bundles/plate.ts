/** A plate's address opened in the app: where it leads, from the phone (no camera, no decoder). */
export { PlateScreen } from '@/features/inspections/plate-screen';
