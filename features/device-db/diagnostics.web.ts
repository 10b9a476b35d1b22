/**
 * Support and browser tests need to look at what the phone holds without a screen for it. Only when
 * `localStorage['pivotwatch:diagnostics'] === '1'` (set by hand in the console, or by a test before the
 * page loads) the open database and its draft functions are put on `window.pivotwatchDevice`. It gives a
 * page script nothing it could not already reach: the same origin can open the same storage.
 */
import type { DeviceDb } from '@/features/device-db/connection';
import { countOutbox, listOutbox } from '@/features/device-db/outbox';
import { deleteDraft, listDrafts, loadDraft, saveDraft, submitDraft } from '@/features/device-db/drafts';
import { putPhotoBlob } from '@/features/device-db/photos';

export const DIAGNOSTICS_FLAG = 'pivotwatch:diagnostics';

export function exposeDiagnostics(db: DeviceDb): void {
  let enabled = false;
  try {
    enabled = window.localStorage.getItem(DIAGNOSTICS_FLAG) === '1';
  } catch {
    // Storage blocked (privacy mode): no diagnostics.
  }
  if (!enabled) return;
  Object.assign(window, {
    pivotwatchDevice: {
      db,
      saveDraft: (input: Parameters<typeof saveDraft>[1]) => saveDraft(db, input),
      loadDraft: (id: string) => loadDraft(db, id),
      listDrafts: () => listDrafts(db),
      deleteDraft: (id: string) => deleteDraft(db, id),
      submitDraft: (record: unknown) => submitDraft(db, record),
      putPhotoBlob: (input: Parameters<typeof putPhotoBlob>[1]) => putPhotoBlob(db, input),
      listOutbox: () => listOutbox(db),
      countOutbox: () => countOutbox(db),
    },
  });
}
