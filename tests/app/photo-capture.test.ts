/**
 * Taking a photo (features/photos/photo-capture.ts, native path): the time and place come from the
 * picker's EXIF of the original, and the copy kept has none left. The "re-encoded" JPEG is written with
 * EXIF by piexifjs (as a manipulator that kept it would), and exifr, the reference reader, must find none
 * in what capturePhoto returns.
 */
import { fromByteArray, toByteArray } from 'base64-js';
import { parse } from 'exifr';

import { capturePhoto } from '@/features/photos/photo-capture';
import { jpegWithExif } from '@/tests/support/exif-jpeg';

const mockEncoded = jpegWithExif({ dateTimeOriginal: '2026:12:03 14:05:09', lat: 51.5034, lon: -0.1276 });

/** Read when the manipulator is called, after the module has set `mockEncoded`. */
const mockBase64 = () => fromByteArray(mockEncoded);

jest.mock('expo-image-picker', () => ({
  launchCameraAsync: jest.fn(async () => ({
    canceled: false,
    assets: [
      {
        uri: 'file:///shot.jpg',
        width: 4000,
        height: 3000,
        // As iOS's picker gives it: nested dictionaries.
        exif: {
          '{Exif}': { DateTimeOriginal: '2026:12:03 14:05:09', OffsetTimeOriginal: '+01:00' },
          '{GPS}': { Latitude: 51.5034, LatitudeRef: 'N', Longitude: 0.1276, LongitudeRef: 'W' },
        },
      },
    ],
  })),
  launchImageLibraryAsync: jest.fn(),
}));
jest.mock('expo-image-manipulator', () => ({
  SaveFormat: { JPEG: 'jpeg' },
  manipulateAsync: jest.fn(async () => ({ width: 1600, height: 1200, base64: mockBase64() })),
}));

test('keeps the EXIF time and, when allowed, the GPS place; the kept bytes carry no EXIF', async () => {
  expect((await parse(Buffer.from(mockEncoded), { gps: true }))?.latitude).toBeCloseTo(51.5034, 4);
  const shot = await capturePhoto('camera', { allowPlace: true });
  expect(shot?.facts).toEqual({
    // 14:05:09 at +01:00 is 13:05:09 UTC.
    takenAt: '2026-12-03T13:05:09.000Z',
    takenAtSource: 'exif',
    place: { lat: 51.5034, lon: -0.1276, source: 'exif' },
  });
  const kept = toByteArray(shot!.base64);
  expect(shot!.bytes).toBe(kept.length);
  expect(kept.length).toBeLessThan(mockEncoded.length);
  expect(await parse(Buffer.from(kept), { tiff: true, exif: true, gps: true, xmp: true })).toBeUndefined();

  const withoutPlace = await capturePhoto('camera');
  expect(withoutPlace?.facts).toEqual({ takenAt: '2026-12-03T13:05:09.000Z', takenAtSource: 'exif' });
});
