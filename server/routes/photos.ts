import express, { Router, type RequestHandler, type Response } from 'express';
import { rateLimit } from 'express-rate-limit';
import { z } from 'zod';

import { nowOf, type ApiDeps } from '@/server/deps';
import { companyScope } from '@/server/auth/scope';
import { assertContentHash } from '@/server/http/content-hash';
import { forbidden, HttpError, notFound, sendError } from '@/server/http/errors';
import { currentUser, requireAuth, requireRole } from '@/server/auth/require-auth';
import { validate } from '@/server/http/validate';
import { operatorMaySeePhoto } from '@/server/notices/photo-access';
import { storageOf } from '@/server/storage';
import { photoQuotaRefusal, type QuotaExceeded } from '@/server/sync/photo-quota';
import {
  findPhoto,
  jpegMetadataOf,
  MAX_PHOTO_BYTES,
  readPhoto,
  sniffImage,
  storePhoto,
  sweepPartialPhotos,
} from '@/server/sync/photo-store';

const byHash = validate({
  params: z.object({
    sha256: z.string().regex(/^[0-9a-f]{64}$/, 'Must be the photo’s SHA-256 as 64 lower-case hex digits'),
  }),
});

const megabytes = (n: number) => `${(n / 1048576).toFixed(1)} MB`;
const acceptedTypes = ['image/jpeg', 'image/png', 'image/webp', 'application/octet-stream'];

/** The raw body parser, with its "too large" turned into a message that says what the limit is. */
const rawPhoto: RequestHandler = (() => {
  const parse = express.raw({ type: acceptedTypes, limit: MAX_PHOTO_BYTES });
  const tooLarge = z.object({ type: z.literal('entity.too.large'), length: z.number().optional() });
  return (req, res, next) =>
    parse(req, res, (err?: unknown) => {
      const big = tooLarge.safeParse(err);
      if (big.success) {
        const size = big.data.length === undefined ? '' : ` (this one is ${megabytes(big.data.length)})`;
        next(
          new HttpError(
            413,
            'payload_too_large',
            `The photo is larger than the ${megabytes(MAX_PHOTO_BYTES)} limit${size}. Photos taken in the app ` +
              'are compressed well below it; send a smaller copy.',
          ),
        );
        return;
      }
      next(err);
    });
})();

const refuse = (res: Response, refusal: QuotaExceeded): never => {
  res.setHeader('Retry-After', String(refusal.retryAfterS));
  throw refusal;
};

/**
 * Photo bytes, addressed by their SHA-256. Staff read and upload any; operators upload their corrective
 * evidence, and read only photos on their company's notices, on corrective actions on those, or uploaded
 * by their company (403 for anything else). The uploader is recorded with the bytes.
 *
 * - `PUT /photos/:sha256` with the raw bytes (Content-Type image/jpeg, image/png or image/webp, at most
 *   8 MB) → 201 `{ stored: true, sha256 }` the first time, 200 `{ stored: false, sha256 }` when the server
 *   already has them. 400 `hash_mismatch` when the bytes do not hash to the path, 413 `payload_too_large`,
 *   415 `not_an_image` when the bytes are not a JPEG, PNG or WebP file (whatever the Content-Type said),
 *   415 `unsupported_media_type` for a body sent as something else entirely; 422 `photo_metadata` for a
 *   JPEG that still carries EXIF, XMP or IPTC (the phone strips them before hashing, so the name is the
 *   hash of what is stored; stripping here would change the bytes under their name). 429 `upload_quota` (with
 *   Retry-After) when the person has stored their hour's count or day's bytes of new photos
 *   (server/sync/photo-quota.ts; checked before the body is read, from Content-Length, and again after),
 *   or 429 `too_many_uploads` after twice the hour's count of attempts of any outcome.
 * - `GET /photos/:sha256` → the bytes with their type and a year's private cache (content never changes);
 *   404 JSON when the server does not have them.
 */
export function photosRouter(deps: ApiDeps): Router {
  const router = Router();
  const signedIn = [requireAuth(deps), requireRole('inspector', 'supervisor', 'admin', 'operator')];
  const storage = storageOf(deps.config);
  sweepPartialPhotos(storage).catch((error: unknown) =>
    deps.logger.warn({ err: error }, 'could not sweep interrupted photo uploads'),
  );

  const quota = deps.config.photoQuota;
  // Every attempt counts here, refused ones too (each may be 8 MB to read and hash); kept in memory.
  const attempts = rateLimit({
    windowMs: 3_600_000,
    limit: quota.perHour * 2,
    keyGenerator: (_req, res) => `photos:${currentUser(res).id}`,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    // The key is the signed-in person, not an address.
    validate: { keyGeneratorIpFallback: false },
    handler: (_req, res) => {
      sendError(
        res,
        429,
        'too_many_uploads',
        'Too many photo uploads from you in the last hour; the phone keeps the photos and sends them later.',
      );
    },
  });
  // Before the body is read: a person over their quota does not get to send 8 MB first.
  const quotaBeforeBody: RequestHandler = (req, res, next) => {
    const { sha256 } = byHash.params(res);
    if (findPhoto(deps.db, sha256) === null) {
      const declared = Number(req.headers['content-length']);
      const refusal = photoQuotaRefusal(
        deps.db,
        currentUser(res).id,
        quota,
        nowOf(deps),
        Number.isFinite(declared) && declared > 0 ? declared : 0,
      );
      if (refusal) refuse(res, refusal);
    }
    next();
  };

  const quotaChecks = [attempts, quotaBeforeBody];

  router.put('/photos/:sha256', ...signedIn, byHash, ...quotaChecks, rawPhoto, async (req, res) => {
    const { sha256 } = byHash.params(res);
    const body: unknown = req.body;
    if (!Buffer.isBuffer(body))
      throw new HttpError(
        415,
        'unsupported_media_type',
        'Send the photo as its raw bytes with Content-Type image/jpeg, image/png or image/webp.',
      );
    const mime = sniffImage(body);
    if (mime === null)
      throw new HttpError(
        415,
        'not_an_image',
        body.length === 0
          ? 'The upload is empty; send the photo’s bytes.'
          : 'The file is not a JPEG, PNG or WebP image, so it was not stored.',
      );
    const metadata = mime === 'image/jpeg' ? jpegMetadataOf(body) : [];
    if (metadata.length > 0)
      throw new HttpError(
        422,
        'photo_metadata',
        `The JPEG still carries ${metadata.join(' and ')} metadata, so it was not stored. Photos are kept ` +
          'without EXIF (no GPS, camera or maker notes): remove it before hashing and send those bytes.',
      );
    assertContentHash(body, sha256);
    // Again with the bytes actually sent (a chunked upload declares no length).
    const refusal =
      findPhoto(deps.db, sha256) === null
        ? photoQuotaRefusal(deps.db, currentUser(res).id, quota, nowOf(deps), body.length)
        : null;
    if (refusal) refuse(res, refusal);
    const { stored } = await storePhoto(
      deps.db,
      storage,
      { sha256, mime, bytes: body, userId: currentUser(res).id },
      nowOf(deps),
    );
    res.status(stored ? 201 : 200).json({ stored, sha256 });
  });

  router.get('/photos/:sha256', ...signedIn, byHash, async (_req, res) => {
    const { sha256 } = byHash.params(res);
    const scope = companyScope(currentUser(res));
    if (scope !== null && !operatorMaySeePhoto(deps.db, scope, sha256))
      throw forbidden(
        'Operators see the photos on their company’s notices and their own corrective actions.',
      );
    const photo = findPhoto(deps.db, sha256);
    if (!photo)
      throw notFound('The server has no photo with this SHA-256 (it may not have been uploaded yet).');
    const bytes = await readPhoto(storage, sha256);
    if (!bytes) throw notFound('The photo is recorded but its file is missing on the server.');
    res.setHeader('Content-Type', photo.mime);
    // Private: the bytes are behind sign-in. Immutable: the address is the content's own hash.
    res.setHeader('Cache-Control', 'private, max-age=31536000, immutable');
    res.send(bytes);
  });

  return router;
}
