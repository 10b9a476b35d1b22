/**
 * Scanning plates: the camera view and its QR decoder (jsqr), and a plate's address opened in the app
 * (where a phone's camera app lands). Loaded only when one of them is opened.
 */
export { PlateScreen } from '@/features/inspections/plate-screen';
export { ScanScreen } from '@/features/inspections/scan-screen';
