/**
 * A notice's PDF drawn in a worker thread (render-worker.ts), with a time limit, so a first GET of a
 * large notice does not stop the server answering everyone else. Same bytes as `noticePdf`.
 */
import path from 'node:path';

import { inArray } from 'drizzle-orm';

import { photos } from '@/db/server/inspections';
import type { NoticeDocument } from '@/features/notices/schema';
import { createWorkerPool, type WorkerPool } from '@/server/compute/pool';
import type { Db } from '@/server/db';
import { noticeChainMark } from '@/server/ledger/notice-mark';
import type { NoticePdfJob } from '@/server/notices/pdf/render-worker';
import type { ObjectStorage } from '@/server/storage';
import { readPhoto } from '@/server/sync/photo-store';

export type NoticePdfPool = WorkerPool<NoticePdfJob, Uint8Array>;

/** Drawing a notice with many photos takes under 2 s here; the limit leaves room for a busy machine. */
export function createNoticePdfPool(timeoutMs = 60_000): NoticePdfPool {
  return createWorkerPool<NoticePdfJob, Uint8Array>({
    file: path.join(__dirname, 'render-worker.ts'),
    timeoutMs,
    size: 1,
  });
}

export async function renderNoticePdfOffThread(
  pool: NoticePdfPool,
  db: Pick<Db, 'select' | 'get'>,
  storage: ObjectStorage,
  document: NoticeDocument,
  pageSize: 'A4' | 'LETTER',
): Promise<Buffer> {
  const named = [...new Set(JSON.stringify(document).match(/\b[0-9a-f]{64}\b/g) ?? [])];
  const held =
    named.length === 0
      ? []
      : db.select({ sha256: photos.sha256 }).from(photos).where(inArray(photos.sha256, named)).all();
  // Read here, through the storage, so the worker needs no driver of its own.
  const photoBytes: Record<string, Uint8Array> = {};
  for (const p of held) {
    const bytes = await readPhoto(storage, p.sha256).catch(() => null);
    if (bytes) photoBytes[p.sha256] = bytes;
  }
  const chain = noticeChainMark(db, document);
  const bytes = await pool.run({ document, pageSize, photoBytes, chain });
  return Buffer.from(bytes.buffer, bytes.byteOffset, bytes.length);
}
