/** Uploads stored by content (photos, NDT reports) name their SHA-256 in the address; the bytes must match. */
import { createHash } from 'node:crypto';

import { HttpError } from '@/server/http/errors';

/** Throws a 400 naming the hash the bytes really have when they do not match the address. */
export function assertContentHash(bytes: Uint8Array, sha256: string): void {
  const actual = createHash('sha256').update(bytes).digest('hex');
  if (actual !== sha256)
    throw new HttpError(
      400,
      'hash_mismatch',
      'The bytes received do not match the SHA-256 in the address; the upload was cut short or changed. ' +
        'Nothing was stored; send it again.',
      [{ path: 'params.sha256', message: `The bytes hash to ${actual}` }],
    );
}
