import type { ImagePickerAsset } from 'expo-image-picker';
import { parse } from 'exifr/dist/mini.umd.js';

import type { ExifTags } from '@/features/photos/exif';

/**
 * Web: the picker gives no EXIF, so exifr reads the original file (before it is redrawn and compressed).
 * Dates stay as EXIF wrote them (`reviveValues: false`), so features/photos/exif.ts applies the offset or
 * the zone itself. Unreadable EXIF is no EXIF: the photo keeps the device's time.
 */
export async function originalExif(asset: ImagePickerAsset): Promise<ExifTags | null> {
  try {
    const data = asset.file ? await asset.file.arrayBuffer() : await (await fetch(asset.uri)).arrayBuffer();
    const tags: unknown = await parse(data, { tiff: true, exif: true, gps: true, reviveValues: false });
    return tags && typeof tags === 'object' ? (tags as ExifTags) : null;
  } catch {
    return null;
  }
}
