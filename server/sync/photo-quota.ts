/**
 * Each person's photo upload quota, counted from the stored photos themselves (`photos.uploaded_by`,
 * `stored_at`, `bytes`), so it holds across restarts and across every phone the person uses: at most
 * `perHour` new photos in any rolling hour and `bytesPerDay` new bytes in any rolling 24 hours. Bytes the
 * server already has are not counted (a re-sent photo stores nothing), so a phone retrying after a lost
 * answer is never refused. Over the quota the answer is 429 with Retry-After; the phone keeps the photo and
 * sends it at a later sync.
 */
import { and, eq, gt, sql } from 'drizzle-orm';

import { photos } from '@/db/server/inspections';
import type { Db } from '@/server/db';
import { HttpError } from '@/server/http/errors';

export type PhotoQuota = { perHour: number; bytesPerDay: number };

const HOUR_MS = 3_600_000;
const DAY_MS = 24 * HOUR_MS;

const megabytes = (n: number) => `${(n / 1048576).toFixed(1)} MB`;

/** The refusal: 429 with the seconds until the oldest counted upload leaves the window. */
export class QuotaExceeded extends HttpError {
  constructor(
    message: string,
    readonly retryAfterS: number,
  ) {
    super(429, 'upload_quota', message);
  }
}

function window(db: Pick<Db, 'select'>, userId: string, since: Date) {
  return (
    db
      .select({
        count: sql<number>`count(*)`,
        bytes: sql<number>`coalesce(sum(${photos.bytes}), 0)`,
        oldest: sql<string | null>`min(${photos.storedAt})`,
      })
      .from(photos)
      .where(and(eq(photos.uploadedBy, userId), gt(photos.storedAt, since.toISOString())))
      .get() ?? { count: 0, bytes: 0, oldest: null }
  );
}

const secondsUntil = (oldest: string | null, spanMs: number, now: Date) =>
  oldest === null ? 60 : Math.max(1, Math.ceil((Date.parse(oldest) + spanMs - now.getTime()) / 1000));

/**
 * Null when `userId` may store `incomingBytes` more now (0 when the size is not known yet: then only the
 * count and the bytes already used are checked); otherwise the refusal to throw.
 */
export function photoQuotaRefusal(
  db: Pick<Db, 'select'>,
  userId: string,
  quota: PhotoQuota,
  now: Date,
  incomingBytes = 0,
): QuotaExceeded | null {
  const hour = window(db, userId, new Date(now.getTime() - HOUR_MS));
  if (hour.count >= quota.perHour)
    return new QuotaExceeded(
      `You have sent ${hour.count} new photos in the last hour, the most the server takes from one person. ` +
        'The rest stay on the phone and go with a later sync.',
      secondsUntil(hour.oldest, HOUR_MS, now),
    );
  const day = window(db, userId, new Date(now.getTime() - DAY_MS));
  if (day.bytes + incomingBytes > quota.bytesPerDay)
    return new QuotaExceeded(
      `You have sent ${megabytes(day.bytes)} of new photos in the last 24 hours; the server takes at most ` +
        `${megabytes(quota.bytesPerDay)} a day from one person. The rest stay on the phone and go with a later sync.`,
      secondsUntil(day.oldest, DAY_MS, now),
    );
  return null;
}
