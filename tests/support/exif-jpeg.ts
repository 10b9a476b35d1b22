/**
 * JPEGs with metadata for the EXIF tests, written by an independent encoder (piexifjs) rather than by
 * the code under test. The image is the smallest baseline JPEG header (SOI, APP0 JFIF, SOF0 1×1 grey,
 * SOS, two scan bytes, EOI): enough for JPEG and EXIF readers, whose job ends before the pixels.
 */
import piexif from 'piexifjs';

const bin = (bytes: number[]) => String.fromCharCode(...bytes);
const toBytes = (s: string) => Uint8Array.from(s, (c) => c.charCodeAt(0));
const toBinary = (b: Uint8Array) => String.fromCharCode(...b);

/** SOI · APP0 "JFIF" 1.01 · SOF0 (8-bit, 1×1, one component) · SOS · scan · EOI (ITU-T T.81 / JFIF 1.02). */
export function plainJpeg(): Uint8Array {
  return toBytes(
    bin([0xff, 0xd8]) +
      bin([
        0xff, 0xe0, 0x00, 0x10, 0x4a, 0x46, 0x49, 0x46, 0x00, 0x01, 0x01, 0x00, 0x00, 0x01, 0x00, 0x01, 0, 0,
      ]) +
      bin([0xff, 0xc0, 0x00, 0x0b, 0x08, 0x00, 0x01, 0x00, 0x01, 0x01, 0x01, 0x11, 0x00]) +
      bin([0xff, 0xda, 0x00, 0x08, 0x01, 0x01, 0x00, 0x00, 0x3f, 0x00]) +
      bin([0x7f, 0x00]) +
      bin([0xff, 0xd9]),
  );
}

/** [degrees, minutes, seconds] as EXIF RATIONAL pairs. */
const dms = (value: number): [number, number][] => {
  const a = Math.abs(value);
  const d = Math.floor(a);
  const m = Math.floor((a - d) * 60);
  const s = Math.round(((a - d) * 60 - m) * 60 * 10000);
  return [
    [d, 1],
    [m, 1],
    [s, 10000],
  ];
};

/**
 * The plain JPEG with an EXIF APP1 inserted by piexifjs, holding the EXIF 2.3 tags the app reads:
 * DateTimeOriginal (0x9003, Exif IFD), GPSLatitudeRef/GPSLatitude (0x0001/0x0002) and
 * GPSLongitudeRef/GPSLongitude (0x0003/0x0004) in the GPS IFD; plus what must never reach the server:
 * Make/Model (0x010F/0x0110) and a MakerNote (0x927C).
 */
export function jpegWithExif(opts: { dateTimeOriginal: string; lat: number; lon: number }): Uint8Array {
  const exif = piexif.dump({
    '0th': { [piexif.ImageIFD.Make]: 'Fieldcam', [piexif.ImageIFD.Model]: 'FC-7' },
    Exif: {
      [piexif.ExifIFD.DateTimeOriginal]: opts.dateTimeOriginal,
      [piexif.ExifIFD.MakerNote]: 'serial 0042-secret',
    },
    GPS: {
      [piexif.GPSIFD.GPSLatitudeRef]: opts.lat < 0 ? 'S' : 'N',
      [piexif.GPSIFD.GPSLatitude]: dms(opts.lat),
      [piexif.GPSIFD.GPSLongitudeRef]: opts.lon < 0 ? 'W' : 'E',
      [piexif.GPSIFD.GPSLongitude]: dms(opts.lon),
    },
  });
  return toBytes(piexif.insert(exif, toBinary(plainJpeg())));
}

/** Adds an XMP APP1 segment (Adobe XMP Part 3: "http://ns.adobe.com/xap/1.0/\0" then the packet). */
export function withXmp(jpeg: Uint8Array, packet: string): Uint8Array {
  const payload = `http://ns.adobe.com/xap/1.0/\0${packet}`;
  const length = payload.length + 2;
  const segment = toBytes(bin([0xff, 0xe1, length >> 8, length & 0xff]) + payload);
  const out = new Uint8Array(jpeg.length + segment.length);
  out.set(jpeg.subarray(0, 2));
  out.set(segment, 2);
  out.set(jpeg.subarray(2), 2 + segment.length);
  return out;
}
