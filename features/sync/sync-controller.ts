/**
 * Keeps one device database in step with the server while the app runs: a sync when the connection
 * returns, on demand, when the app comes back to the foreground, and every half minute while anything
 * waits (each record's back-off decides whether it goes). While the network is down nothing is sent: a
 * push that cannot arrive only spends the records' back-off. Publishes a status snapshot for
 * `useSyncStatus`.
 */
import { randomUUID } from 'expo-crypto';

import {
  type DeviceDb,
  type OutboxItem,
  countOutbox,
  listOutbox,
  requeueRejected,
  type PhotoBlob,
  listOwnPhotoBlobs,
  getAllSyncMeta,
} from '@/features/device-db';
import { tokenStore } from '@/features/session';
import type { SyncApi } from '@/features/sync/api';
import {
  isOnline,
  networkKnown,
  onAppFocus,
  onConnectionLoss,
  onConnectionReturn,
} from '@/features/sync/network';
import { createHttpSyncApi } from '@/features/sync/http-api';
import { photosWaitingCount } from '@/features/sync/photo-counts';
import { type PhotoProgress, requeuePhoto } from '@/features/sync/photo-upload';
import type { SyncProgress } from '@/features/sync/sync-progress';
import { syncOnce } from '@/features/sync/sync-run';

const SYNC_INTERVAL_MS = 30_000;
/** With nothing to send, still pull now and then: new assignments and decisions arrive that way. */
const PULL_INTERVAL_MS = 5 * 60_000;

export type SyncStatus = {
  /** Records queued or being sent. */
  waiting: number;
  accepted: number;
  /** Records the server refused, with its reasons; they stay until the inspector acts. */
  needsAttention: OutboxItem[];
  /** Photos attached to submitted inspections and not yet uploaded (one per attachment). */
  photosWaiting: number;
  /** Bytes still to upload: each stored photo once, however often it is attached. */
  photoBytesWaiting: number;
  photosRefused: PhotoBlob[];
  /** The photo going up now, with bytes sent so far. */
  currentPhoto: PhotoProgress | null;
  /**
   * The current run step by step, or the last one's as it ended (kept so a stopped run shows where it
   * stopped); null before the first run.
   */
  progress: SyncProgress | null;
  lastSuccessAt: string | null;
  lastAttemptAt: string | null;
  lastError: string | null;
  running: boolean;
  online: boolean;
  /** False until the counts and the last sync's outcome have been read from the phone once. */
  loaded: boolean;
};

const emptySyncStatus: SyncStatus = {
  waiting: 0,
  accepted: 0,
  needsAttention: [],
  photosWaiting: 0,
  photoBytesWaiting: 0,
  photosRefused: [],
  currentPhoto: null,
  progress: null,
  lastSuccessAt: null,
  lastAttemptAt: null,
  lastError: null,
  running: false,
  online: true,
  loaded: false,
};

class SyncController {
  private status: SyncStatus = { ...emptySyncStatus, online: isOnline() };
  private listeners = new Set<() => void>();
  private teardown: (() => void) | null = null;
  private lastRunAt = 0;

  constructor(
    private readonly dev: DeviceDb,
    private readonly api: SyncApi,
    private readonly newId: () => string = randomUUID,
  ) {}

  getSnapshot = (): SyncStatus => this.status;

  /** Starts listening on the first subscriber, stops after the last. */
  subscribe = (listener: () => void): (() => void) => {
    this.listeners.add(listener);
    if (this.listeners.size === 1) this.start();
    return () => {
      this.listeners.delete(listener);
      if (this.listeners.size === 0) this.stop();
    };
  };

  /** Reads the counts again (after a submit, say) without syncing. */
  refresh = async (): Promise<void> => {
    const [counts, outboxItems, photos, refused, meta] = await Promise.all([
      countOutbox(this.dev),
      listOutbox(this.dev),
      listOwnPhotoBlobs(this.dev, ['pending', 'uploading']),
      listOwnPhotoBlobs(this.dev, ['rejected']),
      getAllSyncMeta(this.dev),
    ]);
    this.set({
      waiting: counts.queued + counts.sending,
      accepted: counts.accepted,
      needsAttention: outboxItems.filter((o) => o.state === 'rejected'),
      photosWaiting: photosWaitingCount(
        outboxItems.map((o) => o.record),
        new Set(photos.map((p) => p.sha256)),
      ),
      photoBytesWaiting: photos.reduce((sum, p) => sum + p.bytes, 0),
      photosRefused: refused,
      lastSuccessAt: meta.lastSuccessAt ?? null,
      lastAttemptAt: meta.lastAttemptAt ?? null,
      lastError: meta.lastError ?? null,
      loaded: true,
    });
  };

  /**
   * `force` skips the back-off: the inspector asked, or the connection just came back. With the network
   * down it sends nothing and only re-reads the counts; the connection's return starts the sync.
   */
  syncNow = async ({ force = true }: { force?: boolean } = {}): Promise<void> => {
    if (!isOnline()) {
      this.set({ online: false });
      await this.refresh().catch(() => undefined);
      return;
    }
    this.set({ running: true, progress: null });
    this.lastRunAt = Date.now();
    try {
      await syncOnce(this.api, this.dev, {
        newId: this.newId,
        force,
        signedInUserId: (await tokenStore.get())?.user.id ?? null,
        onPhotoProgress: (p) => this.set({ currentPhoto: p }),
        onProgress: (progress) => this.set({ progress }),
      });
    } catch (err) {
      // The engine records its own failures; this is a database error, shown the same way.
      this.set({ lastError: err instanceof Error ? err.message : String(err) });
    } finally {
      this.set({ running: false, currentPhoto: null });
      await this.refresh().catch(() => undefined);
    }
  };

  retryRecord = async (id: string): Promise<void> => {
    await requeueRejected(this.dev, id);
    await this.syncNow();
  };

  retryPhoto = async (sha: string): Promise<void> => {
    await requeuePhoto(this.dev, sha);
    await this.syncNow();
  };

  private set(patch: Partial<SyncStatus>) {
    this.status = { ...this.status, ...patch };
    this.listeners.forEach((l) => l());
  }

  private start() {
    // The connection may have changed while nobody listened (e.g. signed out offline, signed in online).
    this.set({ online: isOnline() });
    const offReturn = onConnectionReturn(() => {
      this.set({ online: true });
      void this.syncNow();
    });
    const offLoss = onConnectionLoss(() => this.set({ online: false }));
    const due = () => {
      const somethingWaits = this.status.waiting > 0 || this.status.photosWaiting > 0;
      if (isOnline() && (somethingWaits || Date.now() - this.lastRunAt >= PULL_INTERVAL_MS))
        void this.syncNow({ force: false });
    };
    const offFocus = onAppFocus((focused) => (focused ? due() : undefined));
    const timer = setInterval(due, SYNC_INTERVAL_MS);
    this.teardown = () => {
      offReturn();
      offLoss();
      offFocus();
      clearInterval(timer);
    };
    // A phone reads its network state asynchronously: decide on the first sync once it is known.
    void Promise.all([this.refresh().catch(() => undefined), networkKnown()]).then(() => {
      this.set({ online: isOnline() });
      return isOnline() ? this.syncNow({ force: false }) : undefined;
    });
  }

  private stop() {
    this.teardown?.();
    this.teardown = null;
    // Nobody shows it now (signed out): the next person must not see this one's counts or refused records.
    this.status = { ...emptySyncStatus, online: isOnline() };
  }
}

const controllers = new WeakMap<DeviceDb, SyncController>();

/** One controller per open database, shared by every screen that shows sync state. */
export function getSyncController(dev: DeviceDb, api: SyncApi = createHttpSyncApi()): SyncController {
  let controller = controllers.get(dev);
  if (!controller) {
    controller = new SyncController(dev, api);
    controllers.set(dev, controller);
  }
  return controller;
}
