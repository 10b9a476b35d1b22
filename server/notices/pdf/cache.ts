/**
 * Notice PDFs cached in the server's storage (server/storage), one per notice and paper size:
 * `cache/notice-pdfs/<notice>.<size>.<key>.pdf` (on the disk under DATA_DIR). Rendering one takes
 * 0.5–1.7 s of the event loop; the notice's document is frozen when it is issued, so the same PDF can be
 * served again. The key is a hash of everything the PDF prints from:
 * the document, the paper size, its record-chain mark, which of its photos the server holds (a photo uploaded after the notice
 * was issued appears in the next PDF), and the code that draws it (the renderer, its words and fonts:
 * a new version of Pivotwatch renders afresh). Objects are stored whole, so a reader never sees half a
 * PDF; an older one for the same notice and size is removed when a newer one is written.
 */
import { createHash } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';

import { inArray } from 'drizzle-orm';

import { photos } from '@/db/server/inspections';
import type { NoticeDocument } from '@/features/notices/schema';
import type { Db } from '@/server/db';
import { noticeChainMark } from '@/server/ledger/notice-mark';
import { repoRoot } from '@/server/paths';
import { storedFolders, type ObjectStorage } from '@/server/storage';

type PageSize = 'A4' | 'LETTER';

/** Where the disk driver keeps the cache when STORAGE_URL is unset. */
export const noticePdfCacheDirOf = (dataDir: string) =>
  path.join(dataDir, ...storedFolders.noticePdfs.split('/'));

/** What draws a notice: its renderer, the shared PDF parts, the words and formats in lib/, the fonts. */
const rendererSources = ['server/notices/pdf', 'server/pdf', 'server/notices', 'lib', 'fonts'];

let rendererStamp: string | undefined;

/** A hash of the drawing code's files, read once per process (the code changes only with a restart). */
function stampOfRenderer(): string {
  if (rendererStamp !== undefined) return rendererStamp;
  const hash = createHash('sha256');
  for (const dir of rendererSources) {
    const abs = path.join(repoRoot, dir);
    let names: string[];
    try {
      names = fs.readdirSync(abs).sort();
    } catch {
      continue;
    }
    for (const name of names) {
      const file = path.join(abs, name);
      if (!fs.statSync(file).isFile()) continue;
      hash.update(`${dir}/${name}\0`);
      hash.update(fs.readFileSync(file));
    }
  }
  rendererStamp = hash.digest('hex');
  return rendererStamp;
}

function keyOf(db: Pick<Db, 'select' | 'get'>, doc: NoticeDocument, pageSize: PageSize): string {
  const json = JSON.stringify(doc);
  const named = [...new Set(json.match(/\b[0-9a-f]{64}\b/g) ?? [])];
  const held =
    named.length === 0
      ? []
      : db
          .select({ sha256: photos.sha256 })
          .from(photos)
          .where(inArray(photos.sha256, named))
          .all()
          .map((r) => r.sha256)
          .sort();
  return createHash('sha256')
    .update(
      `${stampOfRenderer()}\0${pageSize}\0${held.join(',')}\0${JSON.stringify(noticeChainMark(db, doc))}\0${json}`,
    )
    .digest('hex')
    .slice(0, 32);
}

/**
 * The notice's PDF from the cache, or rendered by `render` and cached. `cached` says which, for the log
 * and the tests. A cache that cannot be written (a full disk, storage out of reach) still answers the rendered PDF.
 */
export async function cachedNoticePdf(
  db: Db,
  storage: ObjectStorage,
  notice: { id: string; document: NoticeDocument; pageSize: PageSize },
  render: () => Promise<Buffer>,
): Promise<{ pdf: Buffer; cached: boolean }> {
  const folder = storedFolders.noticePdfs;
  // Notice ids are UUIDs; anything else is hashed so it can never leave the folder.
  const safeId = /^[0-9a-zA-Z-]{1,64}$/.test(notice.id)
    ? notice.id
    : createHash('sha256').update(notice.id).digest('hex');
  const prefix = `${safeId}.${notice.pageSize}.`;
  const name = `${prefix}${keyOf(db, notice.document, notice.pageSize)}.pdf`;
  try {
    const held = await storage.get(`${folder}/${name}`);
    if (held) return { pdf: held, cached: true };
  } catch {
    // The storage could not be read just now: render below.
  }
  const pdf = await render();
  try {
    await storage.put(`${folder}/${name}`, pdf);
    const stale = (await storage.list(folder)).filter(
      (other) => other.startsWith(prefix) && other.endsWith('.pdf') && other !== name,
    );
    await Promise.all(stale.map((other) => storage.remove(`${folder}/${other}`)));
  } catch {
    // The cache is only a cache: the PDF is answered all the same.
  }
  return { pdf, cached: false };
}
