/**
 * What a photo's record keeps of where and when it was taken (issue #18): the capture time's source and,
 * only when the inspector allows it, the place. A contract: the record's schema (features/records) and the
 * server read it; the bytes themselves carry no EXIF (features/photos/exif.ts strips it before hashing).
 */
import { z } from 'zod';

/** Where a capture time or a place came from: the photo's own EXIF, or the device at capture. */
export const photoFactSources = ['exif', 'device'] as const;
export type PhotoFactSource = (typeof photoFactSources)[number];

const sourceSchema = z.enum(photoFactSources, { error: 'Must be "exif" or "device"' });

/** Decimal degrees, WGS 84 (what EXIF GPS and the browser's geolocation both give). */
export const photoPlaceSchema = z.object({
  lat: z
    .number({ error: 'Latitude must be a number of degrees' })
    .min(-90, 'Latitude must be between -90 and 90 degrees')
    .max(90, 'Latitude must be between -90 and 90 degrees'),
  lon: z
    .number({ error: 'Longitude must be a number of degrees' })
    .min(-180, 'Longitude must be between -180 and 180 degrees')
    .max(180, 'Longitude must be between -180 and 180 degrees'),
  /** The radius the position is good to, in metres, when the source said. */
  accuracyM: z
    .number({ error: 'Accuracy must be a number of metres' })
    .positive('Accuracy must be more than 0 m')
    .max(100_000, 'Accuracy must be at most 100 km')
    .optional(),
  source: sourceSchema,
});
export type PhotoPlace = z.infer<typeof photoPlaceSchema>;

export const photoTakenAtSourceSchema = sourceSchema;
