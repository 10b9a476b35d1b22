import type { ImagePickerAsset } from 'expo-image-picker';

import type { ExifTags } from '@/features/photos/exif';

/** Native: the image picker reads the original's EXIF itself (`exif: true`). */
export async function originalExif(asset: ImagePickerAsset): Promise<ExifTags | null> {
  return asset.exif ?? null;
}
