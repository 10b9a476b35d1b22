/**
 * A photo's EXIF, pure (no React): what the record keeps of it (the capture time and, when allowed, the
 * place) and the words for it. The stored copy carries no EXIF at all (lib/jpeg-metadata.ts strips it).
 */
import { tzOffset } from '@date-fns/tz';

import type { PhotoFactSource, PhotoPlace } from '@/features/photos/metadata-schema';
import { formatDateTime } from '@/lib/dates';

// ——— reading the capture time and place ———

/**
 * EXIF tags as a reader hands them over: exifr's output with `reviveValues: false` (DateTimeOriginal as
 * "YYYY:MM:DD HH:MM:SS", GPSLatitude as [deg, min, sec]), or expo-image-picker's `asset.exif` (Android:
 * flat, GPS in decimal degrees; iOS: nested "{Exif}" and "{GPS}" dictionaries).
 */
export type ExifTags = Record<string, unknown>;

/** iOS's nested dictionaries under the flat EXIF 2.3 names. */
function flatten(tags: ExifTags): ExifTags {
  const out: ExifTags = { ...tags };
  const nested = (key: string) => {
    const v = tags[key];
    return v && typeof v === 'object' && !Array.isArray(v) ? (v as ExifTags) : {};
  };
  const exif = nested('{Exif}');
  const gps = nested('{GPS}');
  for (const key of ['DateTimeOriginal', 'OffsetTimeOriginal'])
    if (out[key] === undefined && exif[key] !== undefined) out[key] = exif[key];
  for (const key of ['Latitude', 'LatitudeRef', 'Longitude', 'LongitudeRef', 'HPositioningError'])
    if (out[`GPS${key}`] === undefined && gps[key] !== undefined) out[`GPS${key}`] = gps[key];
  return out;
}

const EXIF_DATE = /^(\d{4}):(\d{2}):(\d{2})[ T](\d{2}):(\d{2}):(\d{2})/;
const OFFSET = /^([+-])(\d{2}):(\d{2})$/;

/**
 * DateTimeOriginal (EXIF 2.3 tag 0x9003, the camera's wall clock) as an instant: with OffsetTimeOriginal
 * (0x9011) when the camera wrote one, else read as a wall time in `zone` (the device's, where it was taken).
 * Null for a missing or impossible value.
 */
export function exifCaptureTime(tags: ExifTags, zone: string): Date | null {
  const raw = tags.DateTimeOriginal;
  const m = typeof raw === 'string' ? EXIF_DATE.exec(raw.trim()) : null;
  if (!m) return null;
  const [y, mo, d, h, mi, s] = m.slice(1).map(Number);
  const wall = Date.UTC(y, mo - 1, d, h, mi, s);
  const check = new Date(wall);
  if (check.getUTCMonth() !== mo - 1 || check.getUTCDate() !== d || h > 23 || mi > 59 || s > 59) return null;
  const offset = typeof tags.OffsetTimeOriginal === 'string' ? OFFSET.exec(tags.OffsetTimeOriginal) : null;
  if (offset) {
    const minutes = (Number(offset[2]) * 60 + Number(offset[3])) * (offset[1] === '-' ? -1 : 1);
    return new Date(wall - minutes * 60_000);
  }
  // The zone's offset read twice, so a daylight-saving change between the guesses lands right.
  const first = wall - tzOffset(zone, new Date(wall)) * 60_000;
  return new Date(wall - tzOffset(zone, new Date(first)) * 60_000);
}

/** One GPS coordinate: decimal degrees, or [degrees, minutes, seconds] (EXIF GPSLatitude 0x0002). */
function degrees(value: unknown, ref: unknown, negative: string): number | null {
  let magnitude: number | null = null;
  let sign = 1;
  if (typeof value === 'number' && Number.isFinite(value)) {
    magnitude = Math.abs(value);
    sign = value < 0 ? -1 : 1;
  } else if (Array.isArray(value) && value.length === 3 && value.every((v) => typeof v === 'number')) {
    const [d, m, s] = value as number[];
    magnitude = d + m / 60 + s / 3600;
  }
  if (magnitude === null || !Number.isFinite(magnitude)) return null;
  if (typeof ref === 'string' && ref.trim().toUpperCase() === negative) sign = -1;
  return sign * magnitude;
}

/**
 * The place in EXIF's GPS block (GPSLatitudeRef 0x0001, GPSLatitude 0x0002, GPSLongitudeRef 0x0003,
 * GPSLongitude 0x0004, GPSHPositioningError 0x001F), or null when absent or out of range.
 */
export function exifPlace(tags: ExifTags): PhotoPlace | null {
  const lat = degrees(tags.GPSLatitude, tags.GPSLatitudeRef, 'S');
  const lon = degrees(tags.GPSLongitude, tags.GPSLongitudeRef, 'W');
  if (lat === null || lon === null || Math.abs(lat) > 90 || Math.abs(lon) > 180) return null;
  // 0, 0 is what some cameras write when they had no fix.
  if (lat === 0 && lon === 0) return null;
  const error = tags.GPSHPositioningError;
  const accuracyM = typeof error === 'number' && error > 0 && error <= 100_000 ? error : undefined;
  return { lat, lon, ...(accuracyM !== undefined ? { accuracyM } : {}), source: 'exif' };
}

/** A camera clock more than a day ahead of the device, or before digital cameras, is not believed. */
const EARLIEST = Date.UTC(1990, 0, 1);
const AHEAD_MS = 86_400_000;

export type PhotoFacts = { takenAt: string; takenAtSource: PhotoFactSource; place?: PhotoPlace };

/**
 * What the record keeps of a new photo. The time: EXIF DateTimeOriginal when present and believable, else
 * the device clock at capture. The place, only when `allowPlace`: EXIF GPS first (where the camera was),
 * else the device's position at capture; none otherwise.
 */
export function photoFacts(input: {
  exif: ExifTags | null | undefined;
  devicePlace: Omit<PhotoPlace, 'source'> | null;
  allowPlace: boolean;
  now: Date;
  zone: string;
}): PhotoFacts {
  const tags = input.exif ? flatten(input.exif) : {};
  const taken = exifCaptureTime(tags, input.zone);
  const believable =
    taken !== null && taken.getTime() >= EARLIEST && taken.getTime() <= input.now.getTime() + AHEAD_MS;
  const facts: PhotoFacts = believable
    ? { takenAt: taken.toISOString(), takenAtSource: 'exif' }
    : { takenAt: input.now.toISOString(), takenAtSource: 'device' };
  if (!input.allowPlace) return facts;
  const place =
    exifPlace(tags) ?? (input.devicePlace ? { ...input.devicePlace, source: 'device' as const } : null);
  return place ? { ...facts, place } : facts;
}

// ——— words ———

const hemisphere = (value: number, pos: string, neg: string) =>
  `${Math.abs(value).toFixed(4)}° ${value < 0 ? neg : pos}`;

const sourceWord: Record<PhotoFactSource, string> = { exif: 'camera', device: 'device' };

/** "51.5034° N, 0.1276° W (device, ±12 m)". */
export function formatPlace(place: PhotoPlace): string {
  const accuracy = place.accuracyM !== undefined ? `, ±${Math.round(place.accuracyM)} m` : '';
  return `${hemisphere(place.lat, 'N', 'S')}, ${hemisphere(place.lon, 'E', 'W')} (${sourceWord[place.source]}${accuracy})`;
}

/** Where the capture time came from, in words for the line beside a photo; older records say nothing. */
export const takenAtSourceWord = (source: PhotoFactSource | undefined) =>
  source === 'exif' ? ' (camera clock)' : source === 'device' ? ' (device clock)' : '';

/**
 * The line beside a photo: "Taken 3 Dec 2026, 14:05 (device clock) · 51.5034° N, 0.1276° W (device)",
 * the time in `zone` (the site's where the screen uses it, else the device's).
 */
export function photoTakenLine(
  photo: { takenAt: string; takenAtSource?: PhotoFactSource; place?: PhotoPlace | null },
  zone?: string | null,
): string {
  const when = `Taken ${formatDateTime(photo.takenAt, zone)}${takenAtSourceWord(photo.takenAtSource)}`;
  return photo.place ? `${when} · ${formatPlace(photo.place)}` : when;
}
