/**
 * Removing a photo or a reading in the field, with an undo. Pure: no React, no database.
 *
 * The removal is saved on the phone at once, like every other change, so closing the app inside the undo
 * window leaves the draft as the inspector last saw it (without the item). What was removed is kept beside
 * it, with its place in the list, until the undo window passes; an undo puts the very same entry back where
 * it was. A photo's bytes stay in the device store when its entry leaves the draft (the store lets go of
 * photos no draft or record names only after days), so an undone photo still shows.
 */
import type { Draft } from '@/features/records';
import type { PhotoRef, Reading } from '@/features/records/schema';

export type Removed =
  { kind: 'photo'; entry: PhotoRef; index: number } | { kind: 'reading'; entry: Reading; index: number };

const touch = (d: Draft, now: Date): Draft => ({ ...d, updatedAt: now.toISOString() });

/** The draft without the photo or reading, and what an undo needs; null when the draft does not hold it. */
export function takeOut(
  d: Draft,
  kind: Removed['kind'],
  id: string,
  now: Date,
): { draft: Draft; removed: Removed } | null {
  if (kind === 'photo') {
    const index = d.photos.findIndex((p) => p.id === id);
    if (index < 0) return null;
    return {
      draft: touch({ ...d, photos: d.photos.filter((p) => p.id !== id) }, now),
      removed: { kind, entry: d.photos[index], index },
    };
  }
  const index = d.readings.findIndex((r) => r.id === id);
  if (index < 0) return null;
  return {
    draft: touch({ ...d, readings: d.readings.filter((r) => r.id !== id) }, now),
    removed: { kind, entry: d.readings[index], index },
  };
}

/** Inserts `entry` at `index` (or at the end when the list has since grown shorter); never twice. */
function insertAt<T extends { id: string }>(list: readonly T[], entry: T, index: number): T[] {
  if (list.some((x) => x.id === entry.id)) return [...list];
  const at = Math.min(Math.max(index, 0), list.length);
  return [...list.slice(0, at), entry, ...list.slice(at)];
}

/** The draft with the removed entry back in its place (unchanged when it is already there). */
export function putBack(d: Draft, removed: Removed, now: Date): Draft {
  return removed.kind === 'photo'
    ? touch({ ...d, photos: insertAt(d.photos, removed.entry, removed.index) }, now)
    : touch({ ...d, readings: insertAt(d.readings, removed.entry, removed.index) }, now);
}

/** The snackbar's words for a removal. */
export function removedText(removed: Removed): string {
  if (removed.kind === 'reading') return `Reading removed: ${removed.entry.label}`;
  return removed.entry.caption ? `Photo removed: ${removed.entry.caption}` : 'Photo removed';
}

/** How long the undo is offered: long enough to notice with gloves on, short enough not to linger. */
export const UNDO_WINDOW_MS = 8000;
