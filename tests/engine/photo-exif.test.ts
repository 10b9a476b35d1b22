/**
 * A photo's EXIF (features/photos/exif.ts): the capture time and place read from it, and the stored copy
 * without any of it. The JPEGs are written by piexifjs (tests/support/exif-jpeg.ts) and read back by
 * exifr, the reference reader: it must find the EXIF 2.3 tags before stripping and nothing after.
 */
import { gps, parse } from 'exifr';

import type { ImagePickerAsset } from 'expo-image-picker';

import { photoFacts, photoTakenLine } from '@/features/photos/exif';
import { originalExif } from '@/features/photos/original-exif.web';
import { jpegMetadataKinds, stripJpegMetadata } from '@/lib/jpeg-metadata';
import { jpegWithExif, plainJpeg, withXmp } from '@/tests/support/exif-jpeg';

const everything = { tiff: true, exif: true, gps: true, xmp: true, iptc: true, makerNote: true };
const read = (bytes: Uint8Array, options: object = everything) => parse(Buffer.from(bytes), options);

const shot = () => jpegWithExif({ dateTimeOriginal: '2026:12:03 14:05:09', lat: 51.5034, lon: -0.1276 });
const xmpPacket =
  '<x:xmpmeta xmlns:x="adobe:ns:meta/"><rdf:RDF xmlns:rdf="http://www.w3.org/1999/02/22-rdf-syntax-ns#">' +
  '<rdf:Description xmlns:exif="http://ns.adobe.com/exif/1.0/" exif:GPSLatitude="51,30.204N"/></rdf:RDF></x:xmpmeta>';

describe('stripping (exifr as the reference reader)', () => {
  it('exifr reads the EXIF 2.3 tags piexifjs wrote, GPS and maker note included', async () => {
    const tags = await read(shot(), { ...everything, reviveValues: false });
    expect(tags.DateTimeOriginal).toBe('2026:12:03 14:05:09');
    expect(tags.latitude).toBeCloseTo(51.5034, 4);
    expect(tags.longitude).toBeCloseTo(-0.1276, 4);
    expect(tags.Make).toBe('Fieldcam');
    expect(tags.makerNote).toBeDefined();
    expect(jpegMetadataKinds(shot())).toEqual(['EXIF']);
  });

  it('leaves no EXIF, GPS, maker note or XMP for exifr to find, and keeps the rest byte for byte', async () => {
    const original = withXmp(shot(), xmpPacket);
    expect(jpegMetadataKinds(original)).toEqual(['XMP', 'EXIF']);
    expect((await read(original))?.GPSLatitude).toBeDefined();
    const stripped = stripJpegMetadata(original);
    expect(await read(stripped)).toBeUndefined();
    expect(await gps(Buffer.from(stripped))).toBeUndefined();
    expect(jpegMetadataKinds(stripped)).toEqual([]);
    // What is left is exactly the JPEG piexifjs started from: JFIF header, frame, scan and EOI.
    expect(Buffer.from(stripped).equals(Buffer.from(plainJpeg()))).toBe(true);
  });

  it('returns a JPEG without metadata as it was, and refuses bytes that are not a JPEG', () => {
    const plain = plainJpeg();
    expect(stripJpegMetadata(plain)).toBe(plain);
    expect(() => stripJpegMetadata(new Uint8Array([0x89, 0x50, 0x4e, 0x47]))).toThrow(
      /not a well-formed JPEG/,
    );
    expect(jpegMetadataKinds(new Uint8Array([1, 2, 3]))).toEqual([]);
  });
});

describe('capture time and place', () => {
  const now = new Date('2026-12-03T15:00:00Z');

  it('takes DateTimeOriginal and GPS from what exifr reads, in the device zone when no offset was written', async () => {
    const exif = await read(shot(), { ...everything, reviveValues: false });
    // 14:05:09 on a London clock in December is 14:05:09 UTC (GMT, IANA tz database).
    expect(photoFacts({ exif, devicePlace: null, allowPlace: true, now, zone: 'Europe/London' })).toEqual({
      takenAt: '2026-12-03T14:05:09.000Z',
      takenAtSource: 'exif',
      place: { lat: expect.closeTo(51.5034, 4), lon: expect.closeTo(-0.1276, 4), source: 'exif' },
    });
    // The same wall time in Auckland (NZDT, UTC+13 in December) is the evening before in UTC.
    expect(photoFacts({ exif, devicePlace: null, allowPlace: false, now, zone: 'Pacific/Auckland' })).toEqual(
      {
        takenAt: '2026-12-03T01:05:09.000Z',
        takenAtSource: 'exif',
      },
    );
  });

  it('uses OffsetTimeOriginal (0x9011) when the camera wrote one, and iOS picker dictionaries', () => {
    const exif = {
      '{Exif}': { DateTimeOriginal: '2026:07:01 09:30:00', OffsetTimeOriginal: '-04:00' },
      '{GPS}': { Latitude: 40.7, LatitudeRef: 'N', Longitude: 74.0, LongitudeRef: 'W', HPositioningError: 8 },
    };
    expect(photoFacts({ exif, devicePlace: null, allowPlace: true, now, zone: 'UTC' })).toEqual({
      takenAt: '2026-07-01T13:30:00.000Z',
      takenAtSource: 'exif',
      place: { lat: 40.7, lon: -74, accuracyM: 8, source: 'exif' },
    });
  });

  it('falls back to the device clock and position, and keeps no place unless allowed', () => {
    const device = { lat: -33.8568, lon: 151.2153, accuracyM: 12 };
    expect(photoFacts({ exif: null, devicePlace: device, allowPlace: true, now, zone: 'UTC' })).toEqual({
      takenAt: now.toISOString(),
      takenAtSource: 'device',
      place: { ...device, source: 'device' },
    });
    expect(
      photoFacts({
        exif: { GPSLatitude: 10, GPSLongitude: 10 },
        devicePlace: device,
        allowPlace: false,
        now,
        zone: 'UTC',
      }),
    ).toEqual({
      takenAt: now.toISOString(),
      takenAtSource: 'device',
    });
    // A camera clock two days ahead, an impossible date, or a 0,0 "no fix" are not believed.
    for (const DateTimeOriginal of ['2026:12:05 15:00:00', '2026:02:30 10:00:00', 'garbage'])
      expect(
        photoFacts({ exif: { DateTimeOriginal }, devicePlace: null, allowPlace: true, now, zone: 'UTC' }),
      ).toEqual({ takenAt: now.toISOString(), takenAtSource: 'device' });
    expect(
      photoFacts({
        exif: { GPSLatitude: 0, GPSLongitude: 0 },
        devicePlace: null,
        allowPlace: true,
        now,
        zone: 'UTC',
      }).place,
    ).toBeUndefined();
  });

  it('says it in words: time in the given zone, hemispheres, source', () => {
    expect(
      photoTakenLine(
        {
          takenAt: '2026-12-03T14:05:00Z',
          takenAtSource: 'device',
          place: { lat: 51.5034, lon: -0.1276, source: 'device' },
        },
        'Europe/London',
      ),
    ).toBe('Taken 3 Dec 2026, 14:05 (device clock) · 51.5034° N, 0.1276° W (device)');
    expect(photoTakenLine({ takenAt: '2026-12-03T14:05:00Z' }, 'Asia/Tokyo')).toBe('Taken 3 Dec 2026, 23:05');
  });
});

describe('the web reader (exifr mini over the picked file)', () => {
  it('gives the EXIF 2.3 tags by name, as exifr (full, with its tag dictionary) reads them', async () => {
    const bytes = withXmp(shot(), xmpPacket);
    // A File takes ArrayBuffer-backed bytes: slice() copies into one.
    const asset = {
      uri: 'blob:x',
      width: 1,
      height: 1,
      file: new File([bytes.slice()], 'shot.jpg'),
    } as ImagePickerAsset;
    const full = await read(bytes, { tiff: true, exif: true, gps: true, reviveValues: false });
    expect(await originalExif(asset)).toEqual({
      DateTimeOriginal: full.DateTimeOriginal,
      GPSLatitudeRef: full.GPSLatitudeRef,
      GPSLatitude: full.GPSLatitude,
      GPSLongitudeRef: full.GPSLongitudeRef,
      GPSLongitude: full.GPSLongitude,
    });
    const none = { ...asset, file: new File([plainJpeg().slice()], 'plain.jpg') } as ImagePickerAsset;
    expect(
      photoFacts({
        exif: await originalExif(none),
        devicePlace: null,
        allowPlace: true,
        now: new Date(),
        zone: 'UTC',
      }),
    ).toMatchObject({ takenAtSource: 'device' });
  });
});
