/** What other features may use from photos: everything else in the folder is its own. */
export { capturePhoto } from '@/features/photos/photo-capture';
export { usePhotoSource } from '@/features/photos/photo-source';
export { FullSizePhotoViewer } from '@/features/photos/photo-viewer';
