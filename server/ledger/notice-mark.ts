import { sql } from 'drizzle-orm';

import type { NoticeDocument } from '@/features/notices/schema';
import type { Db } from '@/server/db';

/** What a notice's PDF prints of the record chain. */
export type NoticeChainMark = { entryHash: string; verifyUrl: string };

/**
 * The notice's entry hash (found by its reference, unique) and the app address that opens its ride's
 * verification: the ride's page with `?verify=1`, on the same app the notice's own link points to. Null for
 * a notice issued before the chain existed.
 */
export function noticeChainMark(
  db: Pick<Db, 'get'>,
  doc: Pick<NoticeDocument, 'url' | 'ride' | 'reference'>,
): NoticeChainMark | null {
  const row = db.get<{ entryHash: string }>(
    sql`SELECT e.entry_hash AS entryHash FROM notices n
        JOIN ledger_entries e ON e.ride_id = n.ride_id AND e.kind = 'notice' AND e.ref_id = n.id
        WHERE n.reference = ${doc.reference}
        ORDER BY e.seq LIMIT 1`,
  );
  if (!row) return null;
  const at = doc.url.lastIndexOf('/notices/');
  const app = at >= 0 ? doc.url.slice(0, at) : doc.url.replace(/\/+$/, '');
  return { entryHash: row.entryHash, verifyUrl: `${app}/rides/${encodeURIComponent(doc.ride.id)}?verify=1` };
}
