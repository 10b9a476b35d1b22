/**
 * Uploads the photos submitted records need, one at a time (phones on a weak signal do better with one
 * stream), oldest first. The server keys photos by SHA-256, so a photo it already has is a success and a
 * re-sent photo is never stored twice. A 4xx answer (not an image, too large) is final for that photo
 * and kept visible with the server's message; anything else is retried later.
 */
import { and, eq, inArray } from 'drizzle-orm';

import { photoBlobs } from '@/db/device/schema';
import { type DeviceDb, ownedBy } from '@/features/device-db';
import { getPhotoBytes, markPhotoUploaded } from '@/features/device-db';
import type { SyncApi } from '@/features/sync/api';
import { type SendFailure, backoffMs, classifyFailure } from '@/features/sync/outbox-machine';
import type { PhotoProgress, PhotosProgress } from '@/features/sync/sync-progress';

export type { PhotoProgress } from '@/features/sync/sync-progress';

type PhotoUploadOptions = {
  now?: () => Date;
  force?: boolean;
  onProgress?: (progress: PhotoProgress) => void;
  /** The run's photos and bytes so far of those due, with the photo going up (its bytes as they go). */
  onOverall?: (progress: PhotosProgress) => void;
};

export type PhotoUploadReport = { uploaded: number; rejected: number; failure: SendFailure | null };

export async function uploadPhotos(
  api: SyncApi,
  dev: DeviceDb,
  options: PhotoUploadOptions = {},
): Promise<PhotoUploadReport> {
  const clock = options.now ?? (() => new Date());
  const report: PhotoUploadReport = { uploaded: 0, rejected: 0, failure: null };
  const waiting = await dev.db
    .select({
      sha256: photoBlobs.sha256,
      mime: photoBlobs.mime,
      bytes: photoBlobs.bytes,
      attempts: photoBlobs.attempts,
      nextAttemptAt: photoBlobs.nextAttemptAt,
    })
    .from(photoBlobs)
    // `uploading` here means a run was interrupted: it goes again.
    .where(and(inArray(photoBlobs.uploadState, ['pending', 'uploading']), ownedBy(photoBlobs.authorId)))
    .orderBy(photoBlobs.createdAt)
    .all();

  const start = clock().toISOString();
  const due = waiting.filter((p) => options.force || p.nextAttemptAt === null || p.nextAttemptAt <= start);
  // Counted up front: photos (and their bytes) gone through or refused; the bar stays where a failure stops it.
  const photos = { done: 0, total: due.length };
  const sent = { done: 0, total: due.reduce((sum, p) => sum + p.bytes, 0) };
  const reportOverall = (current: PhotoProgress | null) =>
    options.onOverall?.({
      photos: { ...photos },
      bytes: { done: Math.min(sent.total, sent.done + (current?.sentBytes ?? 0)), total: sent.total },
      current,
    });
  const finished = (photo: { bytes: number }) => {
    photos.done++;
    sent.done += photo.bytes;
    reportOverall(null);
  };
  if (due.length > 0) reportOverall(null);

  for (const photo of due) {
    const now = clock();
    const bytes = await getPhotoBytes(dev, photo.sha256);
    if (!bytes) {
      // Its bytes are gone from the store: nothing to send, so it leaves the count.
      photos.total--;
      sent.total -= photo.bytes;
      reportOverall(null);
      continue;
    }
    await dev.db
      .update(photoBlobs)
      .set({ uploadState: 'uploading', uploadedBytes: 0, updatedAt: now.toISOString() })
      .where(eq(photoBlobs.sha256, photo.sha256))
      .run();
    const going = (sentBytes: number, totalBytes: number) => {
      const current = { sha256: photo.sha256, sentBytes, totalBytes };
      options.onProgress?.(current);
      reportOverall(current);
    };
    going(0, bytes.length);
    try {
      await api.putPhoto({ sha256: photo.sha256, mime: photo.mime, bytes }, going);
    } catch (err) {
      const failure = classifyFailure(err);
      const at = clock();
      if (failure.kind === 'refused') {
        await dev.db
          .update(photoBlobs)
          .set({ uploadState: 'rejected', lastError: failure.message, updatedAt: at.toISOString() })
          .where(and(eq(photoBlobs.sha256, photo.sha256)))
          .run();
        report.rejected++;
        finished(photo);
        continue;
      }
      const attempts = failure.kind === 'auth' ? photo.attempts : photo.attempts + 1;
      await dev.db
        .update(photoBlobs)
        .set({
          uploadState: 'pending',
          uploadedBytes: 0,
          attempts,
          lastError: failure.message,
          nextAttemptAt:
            failure.kind === 'auth' ? null : new Date(at.getTime() + backoffMs(attempts)).toISOString(),
          updatedAt: at.toISOString(),
        })
        .where(eq(photoBlobs.sha256, photo.sha256))
        .run();
      report.failure = failure;
      break;
    }
    await markPhotoUploaded(dev, photo.sha256, clock());
    options.onProgress?.({ sha256: photo.sha256, sentBytes: bytes.length, totalBytes: bytes.length });
    report.uploaded++;
    finished(photo);
  }
  return report;
}

/** Puts a refused photo back in the queue (e.g. after the server's limit was raised). */
export async function requeuePhoto(dev: DeviceDb, sha: string, now = new Date()): Promise<void> {
  await dev.db
    .update(photoBlobs)
    .set({
      uploadState: 'pending',
      attempts: 0,
      lastError: null,
      nextAttemptAt: null,
      updatedAt: now.toISOString(),
    })
    .where(and(eq(photoBlobs.sha256, sha), eq(photoBlobs.uploadState, 'rejected')))
    .run();
}
