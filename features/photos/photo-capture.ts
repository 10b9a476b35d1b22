import { SaveFormat, manipulateAsync } from 'expo-image-manipulator';
import * as ImagePicker from 'expo-image-picker';

/** Photos are kept small on the phone: long edge at most this many pixels, JPEG. */
const PHOTO_LONG_EDGE_PX = 1600;
const JPEG_QUALITY = 0.78;

type CapturedPhoto = {
  base64: string;
  mime: 'image/jpeg';
  width: number;
  height: number;
  bytes: number;
};

/** The resize that brings the long edge down to the limit (none when it is already within it). */
function resizeFor(width: number, height: number, longEdge = PHOTO_LONG_EDGE_PX) {
  if (Math.max(width, height) <= longEdge) return null;
  return width >= height ? { width: longEdge } : { height: longEdge };
}

/** Decoded size of a base64 string, without decoding it. */
function base64Bytes(b64: string): number {
  const padding = b64.endsWith('==') ? 2 : b64.endsWith('=') ? 1 : 0;
  return Math.floor((b64.length * 3) / 4) - padding;
}

/**
 * Takes a photo (camera; on a phone browser this opens the camera) or picks one, then compresses it
 * on the device. Null when the person cancels.
 */
export async function capturePhoto(source: 'camera' | 'library'): Promise<CapturedPhoto | null> {
  const options: ImagePicker.ImagePickerOptions = { mediaTypes: ['images'], quality: 1, exif: false };
  const picked =
    source === 'camera'
      ? await ImagePicker.launchCameraAsync(options)
      : await ImagePicker.launchImageLibraryAsync(options);
  if (picked.canceled || !picked.assets?.[0]) return null;
  const asset = picked.assets[0];
  const resize = resizeFor(asset.width, asset.height);
  const out = await manipulateAsync(asset.uri, resize ? [{ resize }] : [], {
    compress: JPEG_QUALITY,
    format: SaveFormat.JPEG,
    base64: true,
  });
  if (!out.base64) throw new Error('The photo could not be read.');
  return {
    base64: out.base64,
    mime: 'image/jpeg',
    width: out.width,
    height: out.height,
    bytes: base64Bytes(out.base64),
  };
}
