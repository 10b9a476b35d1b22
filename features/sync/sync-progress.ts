/**
 * How far one sync run has got, step by step, as the engine reports it (no React: the controller
 * publishes it, the sync panel draws it). The three steps run in order: send the outbox (records, in
 * batches), upload photos (count and bytes, and the photo going up now), fetch the server's update
 * (pages; how many is not known until the server says there are no more).
 *
 * Counts only rise within a run. A run that stops keeps every count where it stopped (`outcome:
 * 'stopped'`, the step that failed `stopped`, later steps `waiting`): what was sent stays sent, and
 * what was not is still on the phone for the next run.
 */

export type Count = { done: number; total: number };

/** `waiting`: not reached (yet, or at all in a stopped run). */
export type StepState = 'waiting' | 'running' | 'done' | 'stopped';

/** The photo going up now: bytes sent of its size. */
export type PhotoProgress = { sha256: string; sentBytes: number; totalBytes: number };

export type SyncProgress = {
  outcome: 'running' | 'finished' | 'stopped';
  send: { state: StepState; records: Count; batches: Count };
  photos: { state: StepState; photos: Count; bytes: Count; current: PhotoProgress | null };
  update: { state: StepState; pages: number; more: boolean };
};

/** What the push reports after claiming a batch and after each answer. */
export type PushProgress = { records: Count; batches: Count };

/** What the photo upload reports: the whole run's photos and bytes, and the one going up. */
export type PhotosProgress = { photos: Count; bytes: Count; current: PhotoProgress | null };

export const syncStarting = (): SyncProgress => ({
  outcome: 'running',
  send: { state: 'waiting', records: { done: 0, total: 0 }, batches: { done: 0, total: 0 } },
  photos: {
    state: 'waiting',
    photos: { done: 0, total: 0 },
    bytes: { done: 0, total: 0 },
    current: null,
  },
  update: { state: 'waiting', pages: 0, more: true },
});

const rise = (before: Count, next: Count): Count => {
  const done = Math.max(before.done, next.done);
  return { done, total: Math.max(done, next.total) };
};

export const onPush = (p: SyncProgress, push: PushProgress): SyncProgress => ({
  ...p,
  send: {
    state: 'running',
    records: rise(p.send.records, push.records),
    batches: rise(p.send.batches, push.batches),
  },
});

export const onPhotos = (p: SyncProgress, photos: PhotosProgress): SyncProgress => ({
  ...p,
  photos: {
    state: 'running',
    photos: rise(p.photos.photos, photos.photos),
    bytes: rise(p.photos.bytes, photos.bytes),
    current: photos.current,
  },
});

export const onUpdatePage = (p: SyncProgress, pages: number, more: boolean): SyncProgress => ({
  ...p,
  update: { state: 'running', pages: Math.max(p.update.pages, pages), more },
});

export const stepStarted = (p: SyncProgress, step: 'send' | 'photos' | 'update'): SyncProgress => ({
  ...p,
  [step]: { ...p[step], state: 'running' },
});

/** A step has ended: `done` when it went through, `stopped` where it failed (its counts stay). */
export function stepEnded(p: SyncProgress, step: 'send' | 'photos' | 'update', ok: boolean): SyncProgress {
  if (step === 'photos')
    return { ...p, photos: { ...p.photos, state: ok ? 'done' : 'stopped', current: null } };
  if (step === 'update')
    return { ...p, update: { ...p.update, state: ok ? 'done' : 'stopped', more: false } };
  return { ...p, send: { ...p.send, state: ok ? 'done' : 'stopped' } };
}

export const runEnded = (p: SyncProgress, ok: boolean): SyncProgress => ({
  ...p,
  outcome: ok ? 'finished' : 'stopped',
});
