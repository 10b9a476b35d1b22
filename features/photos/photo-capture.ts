import { SaveFormat, manipulateAsync } from 'expo-image-manipulator';
import { fromByteArray, toByteArray } from 'base64-js';
import * as ImagePicker from 'expo-image-picker';

import { currentDevicePlace } from '@/features/photos/device-place';
import { photoFacts, type PhotoFacts } from '@/features/photos/exif';
import { originalExif } from '@/features/photos/original-exif';
import { deviceTimeZone } from '@/lib/dates';
import { jpegMetadataKinds, stripJpegMetadata } from '@/lib/jpeg-metadata';

/** Photos are kept small on the phone: long edge at most this many pixels, JPEG. */
const PHOTO_LONG_EDGE_PX = 1600;
const JPEG_QUALITY = 0.78;

type CapturedPhoto = {
  base64: string;
  mime: 'image/jpeg';
  width: number;
  height: number;
  bytes: number;
  /** When (and, if allowed, where) it was taken: from the original's EXIF, else the device at capture. */
  facts: PhotoFacts;
};

/** The resize that brings the long edge down to the limit (none when it is already within it). */
function resizeFor(width: number, height: number, longEdge = PHOTO_LONG_EDGE_PX) {
  if (Math.max(width, height) <= longEdge) return null;
  return width >= height ? { width: longEdge } : { height: longEdge };
}

/**
 * Takes a photo (camera; on a phone browser this opens the camera) or picks one, then compresses it
 * on the device. The capture time and, when `allowPlace`, the place are read from the original first
 * (its EXIF, else the device); the copy kept has no EXIF at all, so its SHA-256 names exactly the bytes
 * the server stores. Null when the person cancels.
 */
export async function capturePhoto(
  source: 'camera' | 'library',
  { allowPlace = false }: { allowPlace?: boolean } = {},
): Promise<CapturedPhoto | null> {
  const options: ImagePicker.ImagePickerOptions = { mediaTypes: ['images'], quality: 1, exif: true };
  const picked =
    source === 'camera'
      ? await ImagePicker.launchCameraAsync(options)
      : await ImagePicker.launchImageLibraryAsync(options);
  if (picked.canceled || !picked.assets?.[0]) return null;
  const asset = picked.assets[0];
  const now = new Date();
  const [exif, devicePlace] = await Promise.all([
    originalExif(asset),
    allowPlace ? currentDevicePlace() : Promise.resolve(null),
  ]);
  const facts = photoFacts({ exif, devicePlace, allowPlace, now, zone: deviceTimeZone() });
  const resize = resizeFor(asset.width, asset.height);
  const out = await manipulateAsync(asset.uri, resize ? [{ resize }] : [], {
    compress: JPEG_QUALITY,
    format: SaveFormat.JPEG,
    base64: true,
  });
  if (!out.base64) throw new Error('The photo could not be read.');
  // Re-encoding usually drops EXIF already; this makes sure (GPS, maker notes, XMP and all). Bytes whose
  // header cannot be walked carry nothing readable, and the phone's store and the server take them as they are.
  const encoded = toByteArray(out.base64);
  const stripped = jpegMetadataKinds(encoded).length > 0 ? stripJpegMetadata(encoded) : encoded;
  return {
    base64: fromByteArray(stripped),
    mime: 'image/jpeg',
    width: out.width,
    height: out.height,
    bytes: stripped.length,
    facts,
  };
}
