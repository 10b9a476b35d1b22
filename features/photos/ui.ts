/** What other features may render or hook into from photos (needs the app's runtime). */
export { capturePhoto } from '@/features/photos/photo-capture';
export { FullSizePhotoViewer } from '@/features/photos/photo-viewer';
export { askDevicePlace, devicePlaceAvailable } from '@/features/photos/device-place';
