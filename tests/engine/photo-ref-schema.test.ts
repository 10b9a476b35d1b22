/**
 * The photo's entry in the signed record (features/records/schema.ts photoRefSchema): the capture time's
 * source and the place are optional, so records from before them stay valid; bad ones are refused with
 * words that say what is wrong (WGS 84 ranges: latitude ±90°, longitude ±180°).
 */
import { photoRefSchema } from '@/features/records/schema';

const base = {
  id: '6f1c2d3e-4a5b-4c6d-8e7f-8091a2b3c4d5',
  sha256: 'a'.repeat(64),
  mime: 'image/jpeg',
  bytes: 2048,
  caption: 'Main pivot',
  joint: 0,
  checklistItemId: null,
  takenAt: '2026-12-03T14:05:00.000Z',
};

const messages = (value: unknown) => {
  const parsed = photoRefSchema.safeParse(value);
  return parsed.success ? [] : parsed.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`);
};

describe('photo entries in the record', () => {
  it('accepts entries without the new fields (older records) and with them', () => {
    expect(messages(base)).toEqual([]);
    expect(messages({ ...base, takenAtSource: 'exif' })).toEqual([]);
    expect(
      messages({
        ...base,
        takenAtSource: 'device',
        place: { lat: -33.8568, lon: 151.2153, accuracyM: 12, source: 'device' },
      }),
    ).toEqual([]);
    expect(photoRefSchema.parse({ ...base, place: { lat: 90, lon: -180, source: 'exif' } }).place).toEqual({
      lat: 90,
      lon: -180,
      source: 'exif',
    });
  });

  it('refuses malformed places and sources with clear messages', () => {
    expect(messages({ ...base, place: { lat: 91, lon: 0, source: 'device' } })).toEqual([
      'place.lat: Latitude must be between -90 and 90 degrees',
    ]);
    expect(messages({ ...base, place: { lat: 0, lon: -180.5, source: 'device' } })).toEqual([
      'place.lon: Longitude must be between -180 and 180 degrees',
    ]);
    expect(messages({ ...base, place: { lat: '51', lon: 0, source: 'device' } })).toEqual([
      'place.lat: Latitude must be a number of degrees',
    ]);
    expect(messages({ ...base, place: { lat: 1, lon: 1, accuracyM: 0, source: 'device' } })).toEqual([
      'place.accuracyM: Accuracy must be more than 0 m',
    ]);
    expect(messages({ ...base, place: { lat: 1, lon: 1, source: 'gps' } })).toEqual([
      'place.source: Must be "exif" or "device"',
    ]);
    expect(messages({ ...base, takenAtSource: 'guess' })).toEqual([
      'takenAtSource: Must be "exif" or "device"',
    ]);
  });
});
