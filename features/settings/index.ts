/** What other features and the server may use from settings: runs anywhere (no React Native). */
export { useUnitSystem } from '@/features/settings/unit-system';
export { photoPlaceAllowed, usePhotoPlaceAllowed } from '@/features/settings/photo-place';
