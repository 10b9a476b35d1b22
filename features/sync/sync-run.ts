/**
 * One sync: push the outbox, upload photos, pull the server's changes; then record the outcome in sync
 * meta (last success, last error). Runs one at a time per database: a second call while one is running
 * gets the running one.
 */
import {
  type DeviceDb,
  type PruneReport,
  getDeviceOwner,
  pruneDevice,
  setSyncMeta,
} from '@/features/device-db';
import type { SyncApi } from '@/features/sync/api';
import type { SendFailure } from '@/features/sync/outbox-machine';
import { type PhotoProgress, type PhotoUploadReport, uploadPhotos } from '@/features/sync/photo-upload';
import { type PullReport, pull } from '@/features/sync/pull';
import { type PushReport, pushOutbox } from '@/features/sync/push';
import {
  type SyncProgress,
  onPhotos,
  onPush,
  onUpdatePage,
  runEnded,
  stepEnded,
  stepStarted,
  syncStarting,
} from '@/features/sync/sync-progress';

type SyncRunOptions = {
  newId: () => string;
  now?: () => Date;
  force?: boolean;
  /**
   * Whose token the requests carry. When given and the phone is bound to someone else (a change of person
   * is under way), nothing is sent or pulled: the records would go under the wrong name.
   */
  signedInUserId?: string | null;
  onPhotoProgress?: (progress: PhotoProgress) => void;
  /** Every step of the run as it goes (features/sync/sync-progress.ts); the last one says how it ended. */
  onProgress?: (progress: SyncProgress) => void;
};

type SyncRunReport = {
  push: PushReport;
  photos: PhotoUploadReport | null;
  pull: PullReport | null;
  /** The first thing that went wrong, in words for the inspector; null when everything went through. */
  error: string | null;
  /** Sent work the phone let go of afterwards (features/device-db/prune.ts); null when it did not run. */
  pruned?: PruneReport | null;
};

const running = new WeakMap<DeviceDb, Promise<SyncRunReport>>();

export function syncOnce(api: SyncApi, dev: DeviceDb, options: SyncRunOptions): Promise<SyncRunReport> {
  const current = running.get(dev);
  if (current) return current;
  const run = runSync(api, dev, options).finally(() => running.delete(dev));
  running.set(dev, run);
  return run;
}

async function runSync(api: SyncApi, dev: DeviceDb, options: SyncRunOptions): Promise<SyncRunReport> {
  const clock = options.now ?? (() => new Date());
  if (options.signedInUserId !== undefined) {
    const owner = await getDeviceOwner(dev);
    if (options.signedInUserId === null || owner !== options.signedInUserId)
      return {
        push: { batches: 0, accepted: 0, rejected: 0, requeued: 0, failure: null },
        photos: null,
        pull: null,
        error: null,
      };
  }
  await setSyncMeta(dev, 'lastAttemptAt', clock().toISOString());
  const stop = (f: SendFailure | null) => f !== null && (f.kind === 'network' || f.kind === 'auth');
  let progress = syncStarting();
  const show = (next: SyncProgress) => {
    progress = next;
    options.onProgress?.(progress);
  };
  show(stepStarted(progress, 'send'));

  const push = await pushOutbox(api, dev, { ...options, onProgress: (p) => show(onPush(progress, p)) });
  show(stepEnded(progress, 'send', push.failure === null));
  let photos: PhotoUploadReport | null = null;
  let pulled: PullReport | null = null;
  let error: string | null = push.failure?.message ?? null;

  if (!stop(push.failure)) {
    show(stepStarted(progress, 'photos'));
    photos = await uploadPhotos(api, dev, {
      now: clock,
      force: options.force,
      onProgress: options.onPhotoProgress,
      onOverall: (p) => show(onPhotos(progress, p)),
    });
    show(stepEnded(progress, 'photos', photos.failure === null));
    error ??= photos.failure?.message ?? null;
    if (!stop(photos.failure)) {
      show(stepStarted(progress, 'update'));
      try {
        pulled = await pull(api, dev, {
          now: clock,
          onPage: (pages, more) => show(onUpdatePage(progress, pages, more)),
        });
        show(stepEnded(progress, 'update', true));
      } catch (err) {
        show(stepEnded(progress, 'update', false));
        error ??= err instanceof Error ? err.message : String(err);
      }
    }
  }
  show(runEnded(progress, error === null));

  if (error === null) {
    await setSyncMeta(dev, 'lastSuccessAt', clock().toISOString());
    await setSyncMeta(dev, 'lastError', null);
  } else {
    await setSyncMeta(dev, 'lastError', error);
  }
  const pruned = await pruneAfterRun(dev, clock(), {
    changed: push.accepted > 0 || (photos?.uploaded ?? 0) > 0 || (pulled?.decisions ?? 0) > 0,
  });
  return { push, photos, pull: pulled, error, pruned };
}

/**
 * Lets go of sent work the policy no longer keeps. It reads every record's photo list, so it runs when a
 * run changed what the policy looks at (records accepted, photos uploaded, decisions pulled), and
 * otherwise once an hour, since time alone also ends a keeping time. Whatever the network did.
 */
const PRUNE_EVERY_MS = 60 * 60_000;
const lastPruneAt = new WeakMap<DeviceDb, number>();

async function pruneAfterRun(dev: DeviceDb, now: Date, { changed }: { changed: boolean }) {
  const last = lastPruneAt.get(dev);
  if (!changed && last !== undefined && Math.abs(now.getTime() - last) < PRUNE_EVERY_MS) return null;
  try {
    const report = await pruneDevice(dev, { now });
    lastPruneAt.set(dev, now.getTime());
    return report;
  } catch {
    // Keeping more than needed is harmless; the next run tries again.
    return null;
  }
}
