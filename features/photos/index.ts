/** What other features and the server may use from photos: runs anywhere (no React Native). */
export { usePhotoSource } from '@/features/photos/photo-source';
export { photoTakenLine } from '@/features/photos/exif';
export type { PhotoFacts } from '@/features/photos/exif';
