import type { ImagePickerAsset } from 'expo-image-picker';

import type { ExifTags } from '@/features/photos/exif';

/**
 * The EXIF 2.3 tags read, by IFD and number: exifr's mini build keeps no tag dictionary, so it answers
 * with numbers, kept per IFD (`mergeOutput: false`: the Interop IFD's tags 1 and 2 would otherwise collide
 * with GPS 1 and 2).
 */
const wanted = {
  exif: { 0x9003: 'DateTimeOriginal', 0x9011: 'OffsetTimeOriginal' },
  gps: {
    0x0001: 'GPSLatitudeRef',
    0x0002: 'GPSLatitude',
    0x0003: 'GPSLongitudeRef',
    0x0004: 'GPSLongitude',
    0x001f: 'GPSHPositioningError',
  },
} as const;

/**
 * Web: the picker gives no EXIF, so exifr reads the original file (before it is redrawn and compressed).
 * Dates stay as EXIF wrote them (`reviveValues: false`), so features/photos/exif.ts applies the offset or
 * the zone itself. Unreadable EXIF is no EXIF: the photo keeps the device's time.
 */
export async function originalExif(asset: ImagePickerAsset): Promise<ExifTags | null> {
  try {
    const data = asset.file ? await asset.file.arrayBuffer() : await (await fetch(asset.uri)).arrayBuffer();
    // Its own chunk, loaded at the first photo (the service worker keeps it for offline use): not in the
    // code every signed-in page shares, which Today's first visit pays for.
    const { parse } = await import('exifr/dist/mini.umd.js');
    const read: unknown = await parse(data, {
      tiff: true,
      exif: true,
      gps: true,
      reviveValues: false,
      mergeOutput: false,
    });
    if (!read || typeof read !== 'object') return null;
    const blocks = read as Record<string, Record<string, unknown> | undefined>;
    const tags: ExifTags = {};
    for (const [block, names] of Object.entries(wanted))
      for (const [tag, name] of Object.entries(names)) {
        const value = blocks[block]?.[tag];
        if (value !== undefined) tags[name] = value;
      }
    return tags;
  } catch {
    return null;
  }
}
