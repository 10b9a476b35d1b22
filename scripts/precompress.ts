/**
 * Writes `<file>.br` (brotli, quality 11) and `<file>.gz` (gzip, level 9) beside every compressible file
 * of the web export, so the server sends the smallest bytes the browser accepts without compressing
 * anything per request (`server/web.ts`). Quality 11 costs seconds once at build time; on the fly the
 * `compression` middleware can afford only gzip 6.
 *
 * A variant is written only when it is smaller than the file by a useful margin; stale or orphaned
 * variants from an earlier run are removed, so the folder never holds bytes of another build.
 *
 * Run: `npx tsx scripts/precompress.ts [distDir]` (default dist/), or call `precompressDir(distDir)`
 * (`scripts/build-web.ts` does, after the service worker is written).
 */
import { readdir, readFile, rm, stat, writeFile } from 'node:fs/promises';
import { join } from 'node:path';
import { promisify } from 'node:util';
import { brotliCompress, constants, gzip } from 'node:zlib';

const brotli = promisify(brotliCompress);
const gz = promisify(gzip);

/** Text and binary formats that shrink; PNG, JPEG and WOFF2 are compressed already. */
export const COMPRESSIBLE = /\.(html|js|mjs|css|json|webmanifest|svg|ico|txt|xml|wasm|ttf|otf)$/i;
const VARIANT = /\.(br|gz)$/;
const TEXT = /\.(html|js|mjs|css|json|webmanifest|svg|txt|xml)$/i;

/** Below this a compressed copy saves less than the request's own headers. */
const MIN_BYTES = 256;
/** A variant must save at least this share of the file to be worth a second representation. */
const MIN_SAVING = 0.05;

export type PrecompressResult = { files: number; rawBytes: number; brBytes: number; gzBytes: number };

async function walk(dir: string): Promise<string[]> {
  const out: string[] = [];
  for (const entry of await readdir(dir, { withFileTypes: true })) {
    const full = join(dir, entry.name);
    if (entry.isDirectory()) out.push(...(await walk(full)));
    else if (entry.isFile()) out.push(full);
  }
  return out;
}

async function writeVariant(file: string, ext: '.br' | '.gz', raw: Buffer, packed: Buffer): Promise<number> {
  if (packed.length > raw.length * (1 - MIN_SAVING)) {
    await rm(file + ext, { force: true });
    return raw.length;
  }
  await writeFile(file + ext, packed);
  return packed.length;
}

async function compressOne(file: string) {
  const raw = await readFile(file);
  const [br, gzipped] = await Promise.all([
    brotli(raw, {
      params: {
        [constants.BROTLI_PARAM_QUALITY]: constants.BROTLI_MAX_QUALITY,
        [constants.BROTLI_PARAM_MODE]: TEXT.test(file)
          ? constants.BROTLI_MODE_TEXT
          : constants.BROTLI_MODE_GENERIC,
        [constants.BROTLI_PARAM_SIZE_HINT]: raw.length,
      },
    }),
    gz(raw, { level: 9 }),
  ]);
  return {
    raw: raw.length,
    br: await writeVariant(file, '.br', raw, br),
    gz: await writeVariant(file, '.gz', raw, gzipped),
  };
}

/** Compresses every compressible file under `distDir` (two at a time: the machine has two cores). */
export async function precompressDir(distDir: string): Promise<PrecompressResult> {
  const all = await walk(distDir);
  const originals = new Set(all.filter((f) => !VARIANT.test(f)));
  // A variant whose original is gone, or was rewritten after it, would serve another build's bytes.
  for (const f of all.filter((f) => VARIANT.test(f))) {
    const original = f.slice(0, -3);
    if (!originals.has(original) || (await stat(original)).mtimeMs > (await stat(f)).mtimeMs)
      await rm(f, { force: true });
  }
  const todo: string[] = [];
  for (const f of originals) {
    if (COMPRESSIBLE.test(f) && (await stat(f)).size >= MIN_BYTES) todo.push(f);
  }
  const result: PrecompressResult = { files: 0, rawBytes: 0, brBytes: 0, gzBytes: 0 };
  const worker = async () => {
    for (let f = todo.pop(); f !== undefined; f = todo.pop()) {
      const r = await compressOne(f);
      result.files += 1;
      result.rawBytes += r.raw;
      result.brBytes += r.br;
      result.gzBytes += r.gz;
    }
  };
  await Promise.all([worker(), worker()]);
  return result;
}

export function describePrecompress(r: PrecompressResult): string {
  const kb = (n: number) => `${(n / 1024).toFixed(0)} KB`;
  return `${r.files} files precompressed: ${kb(r.rawBytes)} raw → ${kb(r.brBytes)} brotli, ${kb(r.gzBytes)} gzip`;
}

if (require.main === module) {
  const dir = process.argv[2] ?? join(__dirname, '..', 'dist');
  precompressDir(dir).then(
    (r) => console.log(`[pivotwatch] ${describePrecompress(r)}`),
    (err: unknown) => {
      console.error(err);
      process.exit(1);
    },
  );
}
