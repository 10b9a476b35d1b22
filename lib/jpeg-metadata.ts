/**
 * JPEG metadata segments, pure: which a file carries and a copy without them. Photos are stored without
 * EXIF: the phone strips it before hashing (features/photos/photo-capture.ts), so the SHA-256 that names
 * a photo in the signed record is the hash of the bytes uploaded and stored, and the server refuses a
 * JPEG that still carries any (server/routes/photos.ts).
 *
 * JPEG layout (ITU-T T.81 Annex B): SOI (FF D8), then marker segments FF xx with a 2-byte big-endian
 * length that counts itself, up to SOS (FF DA), after which the entropy-coded data runs to EOI. EXIF lives
 * in APP1 ("Exif\0\0", CIPA DC-008 / EXIF 2.3), XMP in APP1 too ("http://ns.adobe.com/xap/1.0/\0"), IPTC
 * in APP13 ("Photoshop 3.0\0"). APP0 (JFIF), APP2 (ICC colour profile) and APP14 (Adobe colour transform)
 * say how to draw the pixels and stay.
 */
/** The metadata a JPEG carries about its taking, by kind. */
export type JpegMetadataKind = 'EXIF' | 'XMP' | 'IPTC' | 'APP1';

const APP1 = 0xe1;
const APP13 = 0xed;
const SOS = 0xda;

const startsWith = (bytes: Uint8Array, at: number, text: string) =>
  at + text.length <= bytes.length && [...text].every((c, i) => bytes[at + i] === c.charCodeAt(0));

type Segment = { marker: number; start: number; end: number };

/**
 * The marker segments before the scan, or null when the bytes are not a JPEG whose header can be walked
 * (not starting with SOI, or a length running past the end).
 */
function headerSegments(bytes: Uint8Array): { segments: Segment[]; scanAt: number } | null {
  if (bytes.length < 4 || bytes[0] !== 0xff || bytes[1] !== 0xd8) return null;
  const segments: Segment[] = [];
  let at = 2;
  while (at + 4 <= bytes.length) {
    if (bytes[at] !== 0xff) return null;
    const marker = bytes[at + 1];
    // Fill bytes (FF FF…) may pad between segments.
    if (marker === 0xff) {
      at += 1;
      continue;
    }
    if (marker === SOS) return { segments, scanAt: at };
    const length = (bytes[at + 2] << 8) | bytes[at + 3];
    const end = at + 2 + length;
    if (length < 2 || end > bytes.length) return null;
    segments.push({ marker, start: at, end });
    at = end;
  }
  return null;
}

function kindOf(bytes: Uint8Array, s: Segment): JpegMetadataKind | null {
  const payload = s.start + 4;
  if (s.marker === APP1) {
    if (startsWith(bytes, payload, 'Exif\0')) return 'EXIF';
    if (startsWith(bytes, payload, 'http://ns.adobe.com/')) return 'XMP';
    return 'APP1';
  }
  if (s.marker === APP13) return 'IPTC';
  return null;
}

/**
 * The metadata segments a JPEG still carries (EXIF, XMP, IPTC or another APP1), in file order; empty
 * for a JPEG without any, and for bytes whose header cannot be walked (nothing there can be read either).
 */
export function jpegMetadataKinds(bytes: Uint8Array): JpegMetadataKind[] {
  const walked = headerSegments(bytes);
  if (!walked) return [];
  return walked.segments.map((s) => kindOf(bytes, s)).filter((k): k is JpegMetadataKind => k !== null);
}

/**
 * The same JPEG without its APP1 (EXIF, with its GPS block, maker notes and thumbnail; XMP) and APP13
 * (IPTC) segments. Pixels are untouched: the scan and every other segment are copied byte for byte.
 * Throws when the bytes are not a JPEG whose header can be walked.
 */
export function stripJpegMetadata(bytes: Uint8Array): Uint8Array {
  const walked = headerSegments(bytes);
  if (!walked) throw new Error('The photo is not a well-formed JPEG, so its EXIF could not be removed.');
  const kept = walked.segments.filter((s) => s.marker !== APP1 && s.marker !== APP13);
  if (kept.length === walked.segments.length) return bytes;
  const tail = bytes.subarray(walked.scanAt);
  const size = 2 + kept.reduce((n, s) => n + s.end - s.start, 0) + tail.length;
  const out = new Uint8Array(size);
  out.set([0xff, 0xd8]);
  let at = 2;
  for (const s of kept) {
    out.set(bytes.subarray(s.start, s.end), at);
    at += s.end - s.start;
  }
  out.set(tail, at);
  return out;
}
