/**
 * An in-memory stand-in for the sync endpoints with the behaviour the real server must have: records
 * kept once by their client UUID, a batch's answer kept by its batch id, photos kept once by SHA-256.
 * Faults are scripted per call: cut the connection before or after the server stored the batch, or
 * answer 502.
 */
import { createHash } from 'node:crypto';

import { ApiRequestError, OfflineError } from '@/lib/api-errors';
import { keyIdOf, recordHashOf, verifyHex } from '@/features/ledger';
import type { InspectionRecord, PushResult } from '@/features/records/schema';
import type { PhotoUpload, SyncApi } from '@/features/sync/api';

export type Fault = 'ok' | 'cut-before' | 'cut-after' | '502' | 'garbage';

export class FakeSyncServer implements SyncApi {
  records = new Map<string, InspectionRecord>();
  batches = new Map<string, PushResult>();
  photos = new Map<string, Uint8Array>();
  photoPuts = 0;
  /** Every batch id the server was sent, in order (re-sends included). */
  batchIdsSeen: string[] = [];
  pushFaults: Fault[] = [];
  photoFaults: (Fault | 'not-image' | 'too-large')[] = [];
  /** Records with this rideId are rejected with a reason, like the server's validation would. */
  rejectRideId = 'ride-does-not-exist';
  /** Leave these record ids out of the answer (a server bug the device must survive). */
  omitFromAnswer = new Set<string>();
  pullPages: unknown[] = [];
  pullCursorsSeen: (string | null)[] = [];
  /** Public keys registered by the phone, by key id; a withdrawn one is refused like the server does. */
  keys = new Map<string, string>();
  revokedKeys = new Set<string>();
  keyRegistrations = 0;

  async registerKey(key: { publicKey: string; label: string }): Promise<void> {
    const keyId = keyIdOf(key.publicKey);
    if (this.revokedKeys.has(keyId))
      throw new ApiRequestError(409, 'key_revoked', 'This phone’s signing key was withdrawn; sign in again.');
    this.keyRegistrations++;
    this.keys.set(keyId, key.publicKey);
  }

  /** Why the server would refuse this record's signature (the checks of server/sync/ingest.ts), or null. */
  private signatureIssue(rec: InspectionRecord, signature: { keyId: string; signature: string } | undefined) {
    if (!signature) return 'not signed';
    const publicKey = this.keys.get(signature.keyId);
    if (!publicKey) return 'unknown key';
    if (this.revokedKeys.has(signature.keyId)) return 'key withdrawn';
    return verifyHex(publicKey, recordHashOf(rec), signature.signature) ? null : 'does not verify';
  }

  async push(batch: {
    batchId: string;
    records: InspectionRecord[];
    signatures: Record<string, { keyId: string; signature: string }>;
  }): Promise<PushResult> {
    this.batchIdsSeen.push(batch.batchId);
    const fault = this.pushFaults.shift() ?? 'ok';
    if (fault === 'cut-before') throw new OfflineError(new TypeError('Failed to fetch'));
    if (fault === '502') throw new ApiRequestError(502, 'http_error', 'Request failed (502).');
    if (fault === 'garbage') return { nonsense: true } as unknown as PushResult;
    const stored = this.batches.get(batch.batchId);
    const result: PushResult = stored
      ? {
          batchId: batch.batchId,
          results: stored.results.map((r) => (r.status === 'accepted' ? { ...r, status: 'duplicate' } : r)),
        }
      : {
          batchId: batch.batchId,
          results: batch.records
            .filter((rec) => !this.omitFromAnswer.has(rec.id))
            .map((rec) => {
              const unsigned = this.signatureIssue(rec, batch.signatures[rec.id]);
              if (unsigned)
                return {
                  id: rec.id,
                  status: 'rejected' as const,
                  issues: [{ path: 'signature', message: `Signature: ${unsigned}` }],
                };
              if (rec.rideId === this.rejectRideId)
                return {
                  id: rec.id,
                  status: 'rejected' as const,
                  issues: [{ path: 'rideId', message: 'No such ride' }],
                };
              if (this.records.has(rec.id)) return { id: rec.id, status: 'duplicate' as const };
              this.records.set(rec.id, rec);
              return { id: rec.id, status: 'accepted' as const };
            }),
        };
    if (!stored) this.batches.set(batch.batchId, result);
    if (fault === 'cut-after') throw new OfflineError(new TypeError('network error: connection reset'));
    return result;
  }

  async putPhoto(photo: PhotoUpload, onProgress?: (sent: number, total: number) => void): Promise<void> {
    const fault = this.photoFaults.shift() ?? 'ok';
    if (fault === 'cut-before') throw new OfflineError(new TypeError('Failed to fetch'));
    if (fault === '502') throw new ApiRequestError(502, 'http_error', 'Request failed (502).');
    if (fault === 'not-image')
      throw new ApiRequestError(415, 'not_an_image', 'The file is not a JPEG, PNG or WebP image.');
    if (fault === 'too-large') throw new ApiRequestError(413, 'too_large', 'The photo is larger than 8 MB.');
    const hash = createHash('sha256').update(photo.bytes).digest('hex');
    if (hash !== photo.sha256)
      throw new ApiRequestError(400, 'hash_mismatch', 'The bytes do not match the hash.');
    onProgress?.(photo.bytes.length / 2, photo.bytes.length);
    this.photoPuts++;
    if (!this.photos.has(hash)) this.photos.set(hash, photo.bytes);
    onProgress?.(photo.bytes.length, photo.bytes.length);
  }

  async pull(cursor: string | null): Promise<unknown> {
    this.pullCursorsSeen.push(cursor);
    const page = this.pullPages.shift();
    if (page === undefined) return { cursor: cursor ?? 'c0' };
    if (page instanceof Error) throw page;
    return page;
  }
}
