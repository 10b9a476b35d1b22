/**
 * The shape both platform versions of `storage-space` answer with, and the rule for "space is running
 * out". Pure: the card, the banner and the tests share it.
 */

/**
 * `persisted`: the browser promised not to clear this app's storage on its own. `best_effort`: it may
 * clear it when the disk fills. `unknown`: the browser does not say. `device`: an installed app's files,
 * which the phone never clears by itself.
 */
export type StoragePersistence = 'persisted' | 'best_effort' | 'unknown' | 'device';

export type StorageSpace = {
  /** What this app uses, when the platform says (a browser counts everything the site stores). */
  usedBytes: number | null;
  /** Room the app still has: the browser's quota less the usage, or the phone's free space. */
  availableBytes: number;
  /** The browser's quota for this site, or the phone's whole storage. */
  totalBytes: number;
  persistence: StoragePersistence;
};

const MB = 1_000_000;
/** Under this the phone is short whatever its size: about a hundred photographed inspections. */
export const LOW_SPACE_FLOOR_BYTES = 200 * MB;
/** A tenth of the room left counts as low, but never past this: 10 % of a large phone is still plenty. */
export const LOW_SPACE_SHARE = 0.1;
export const LOW_SPACE_SHARE_CAP_BYTES = 1000 * MB;

/** Low when under 200 MB, or under a tenth of the total while also under 1 GB. */
export function isSpaceLow(space: Pick<StorageSpace, 'availableBytes' | 'totalBytes'>): boolean {
  const share = Math.min(space.totalBytes * LOW_SPACE_SHARE, LOW_SPACE_SHARE_CAP_BYTES);
  return space.availableBytes < Math.max(LOW_SPACE_FLOOR_BYTES, share);
}
