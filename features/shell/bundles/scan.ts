/** Scanning plates: the camera view and its QR decoder (jsqr), loaded only when Scan is opened. */
export { ScanScreen } from '@/features/inspections/scan-screen';
