/**
 * Photo bytes on the phone, addressed by their SHA-256 (the same key the server uses), so putting the
 * same photo twice stores it once and an upload can be retried without thought.
 */
import { sha256 } from '@noble/hashes/sha256';
import { bytesToHex } from '@noble/hashes/utils';
import { fromByteArray, toByteArray } from 'base64-js';
import { and, asc, eq, inArray, sql } from 'drizzle-orm';

import { type PhotoBlobRow, type PhotoUploadState, photoBlobs } from '@/db/device/schema';
import type { DeviceDb } from '@/features/device-db/connection';
import { getDeviceOwner, ownedBy } from '@/features/device-db/device-owner';
import { DeviceDataError } from '@/features/device-db/errors';
import { jpegMetadataKinds } from '@/lib/jpeg-metadata';
import type { PhotoRef } from '@/features/records/schema';

type PhotoMime = PhotoRef['mime'];

/** Larger than any photo compressed on the phone (long edge ≤ 1600 px); a guard against the wrong file. */
const MAX_PHOTO_BYTES = 10 * 1024 * 1024;

/** The file signatures of the formats a photo may have (JPEG SOI marker, PNG signature, RIFF…WEBP). */
export function sniffImageMime(bytes: Uint8Array): PhotoMime | null {
  if (bytes.length >= 3 && bytes[0] === 0xff && bytes[1] === 0xd8 && bytes[2] === 0xff) return 'image/jpeg';
  const png = [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a];
  if (bytes.length >= 8 && png.every((b, i) => bytes[i] === b)) return 'image/png';
  const ascii = (from: number, to: number) => String.fromCharCode(...bytes.subarray(from, to));
  if (bytes.length >= 12 && ascii(0, 4) === 'RIFF' && ascii(8, 12) === 'WEBP') return 'image/webp';
  return null;
}

export function sha256Hex(bytes: Uint8Array): string {
  return bytesToHex(sha256(bytes));
}

export type PhotoBlob = Omit<PhotoBlobRow, 'data'>;

/**
 * Stores a photo's bytes. Checks that they are an image of the stated type and within the size limit,
 * and — when the caller names the hash — that they hash to it. Returns the hash and whether it was new.
 */
export async function putPhotoBlob(
  dev: DeviceDb,
  input: ({ bytes: Uint8Array } | { base64: string }) & { mime: PhotoMime; sha256?: string },
  now = new Date(),
): Promise<{ sha256: string; created: boolean }> {
  const { mime } = input;
  let bytes: Uint8Array;
  try {
    bytes = 'bytes' in input ? input.bytes : toByteArray(input.base64);
  } catch {
    throw new DeviceDataError('The photo data is not valid base64.');
  }
  if (bytes.length === 0) throw new DeviceDataError('The photo is empty.');
  if (bytes.length > MAX_PHOTO_BYTES)
    throw new DeviceDataError(
      `The photo is ${(bytes.length / 1048576).toFixed(1)} MB; the limit is ${MAX_PHOTO_BYTES / 1048576} MB.`,
    );
  const sniffed = sniffImageMime(bytes);
  if (sniffed === null) throw new DeviceDataError('The file is not a JPEG, PNG or WebP image.');
  if (sniffed !== mime) throw new DeviceDataError(`The file is ${sniffed}, not ${mime} as stated.`);
  // The server stores no photo metadata and its copy must hash to the same name, so none is kept here.
  const metadata = sniffed === 'image/jpeg' ? jpegMetadataKinds(bytes) : [];
  if (metadata.length > 0)
    throw new DeviceDataError(
      `The photo still carries ${[...new Set(metadata)].join(' and ')} metadata; it must be removed before the photo is kept.`,
    );
  const hash = sha256Hex(bytes);
  if (input.sha256 !== undefined && input.sha256 !== hash)
    throw new DeviceDataError('The photo does not match its SHA-256; it was changed or cut short.', [
      { path: 'sha256', message: `Expected ${input.sha256}, the bytes hash to ${hash}` },
    ]);
  const at = now.toISOString();
  return dev.transaction(async (tx) => {
    const existing = await tx.db
      .select({ sha256: photoBlobs.sha256 })
      .from(photoBlobs)
      .where(eq(photoBlobs.sha256, hash))
      .get();
    if (existing) return { sha256: hash, created: false };
    const authorId = await getDeviceOwner(tx);
    await tx.db
      .insert(photoBlobs)
      .values({
        sha256: hash,
        mime,
        bytes: bytes.length,
        data: fromByteArray(bytes),
        uploadState: 'local',
        createdAt: at,
        updatedAt: at,
        authorId,
      })
      .run();
    return { sha256: hash, created: true };
  });
}

const blobColumns = {
  sha256: photoBlobs.sha256,
  mime: photoBlobs.mime,
  bytes: photoBlobs.bytes,
  uploadState: photoBlobs.uploadState,
  uploadedBytes: photoBlobs.uploadedBytes,
  attempts: photoBlobs.attempts,
  lastError: photoBlobs.lastError,
  nextAttemptAt: photoBlobs.nextAttemptAt,
  createdAt: photoBlobs.createdAt,
  updatedAt: photoBlobs.updatedAt,
  authorId: photoBlobs.authorId,
};

/** A photo's state without its bytes. */
export async function getPhotoBlob(dev: DeviceDb, sha: string): Promise<PhotoBlob | null> {
  return (await dev.db.select(blobColumns).from(photoBlobs).where(eq(photoBlobs.sha256, sha)).get()) ?? null;
}

export async function getPhotoBytes(dev: DeviceDb, sha: string): Promise<Uint8Array | null> {
  const row = await dev.db
    .select({ data: photoBlobs.data })
    .from(photoBlobs)
    .where(eq(photoBlobs.sha256, sha))
    .get();
  return row ? toByteArray(row.data) : null;
}

/** A `data:` URI for showing a stored photo in an <Image> without a file system. */
export async function getPhotoDataUri(dev: DeviceDb, sha: string): Promise<string | null> {
  const row = await dev.db
    .select({ data: photoBlobs.data, mime: photoBlobs.mime })
    .from(photoBlobs)
    .where(eq(photoBlobs.sha256, sha))
    .get();
  return row ? `data:${row.mime};base64,${row.data}` : null;
}

export async function listPhotoBlobs(dev: DeviceDb, states?: PhotoUploadState[]): Promise<PhotoBlob[]> {
  const query = dev.db.select(blobColumns).from(photoBlobs);
  return states
    ? query.where(inArray(photoBlobs.uploadState, states)).orderBy(asc(photoBlobs.createdAt)).all()
    : query.orderBy(asc(photoBlobs.createdAt)).all();
}

/** Like `listPhotoBlobs`, only the signed-in person's photos: what the sync status counts and uploads. */
export async function listOwnPhotoBlobs(dev: DeviceDb, states: PhotoUploadState[]): Promise<PhotoBlob[]> {
  return dev.db
    .select(blobColumns)
    .from(photoBlobs)
    .where(and(ownedBy(photoBlobs.authorId), inArray(photoBlobs.uploadState, states)))
    .orderBy(asc(photoBlobs.createdAt))
    .all();
}

export async function markPhotoUploaded(dev: DeviceDb, sha: string, now = new Date()): Promise<void> {
  await dev.db
    .update(photoBlobs)
    .set({
      uploadState: 'uploaded',
      uploadedBytes: sql`${photoBlobs.bytes}`,
      lastError: null,
      nextAttemptAt: null,
      updatedAt: now.toISOString(),
    })
    .where(eq(photoBlobs.sha256, sha))
    .run();
}

/** Moves photos only a draft used so far into the upload queue (a submitted record now needs them). */
export async function queuePhotosForUpload(dev: DeviceDb, shas: string[], now = new Date()): Promise<void> {
  if (shas.length === 0) return;
  await dev.db
    .update(photoBlobs)
    .set({ uploadState: 'pending', updatedAt: now.toISOString() })
    .where(and(inArray(photoBlobs.sha256, shas), eq(photoBlobs.uploadState, 'local')))
    .run();
}
