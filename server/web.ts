import fs from 'node:fs';
import path from 'node:path';

import express, { type Request, type Response, Router } from 'express';

/** Bundles and assets whose names carry a content hash (`icon.<md5>@2x.png`): safe to cache for a year. */
const hashedAsset = /(^|\/)_expo\/static\/|[.-][0-9a-f]{16,}(@\d+x)?\.[a-z0-9]+$/i;
const oneYearSeconds = 365 * 24 * 60 * 60;

const missingBuildPage = `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><title>Pivotwatch: web build missing</title></head>
<body style="font-family: system-ui, sans-serif; max-width: 40rem; margin: 3rem auto; padding: 0 1rem">
<h1>The web build is missing</h1>
<p>The API is running, but there is no web export to serve. Run <code>npm start</code>, which builds the
app first and then starts the server.</p>
</body></html>
`;

type Encoding = 'br' | 'gzip';
/** The formats `scripts/precompress.ts` writes copies of (kept in step with its COMPRESSIBLE). */
const compressible = /\.(html|js|mjs|css|json|webmanifest|svg|ico|txt|xml|wasm|ttf|otf)$/i;
const variantExt: Record<Encoding, string> = { br: '.br', gzip: '.gz' };

/**
 * The coding to send from `Accept-Encoding`: the highest q among brotli and gzip, brotli on a tie (it is
 * the smaller file; browsers list gzip first, so taking the header's order would never pick brotli).
 */
export function pickEncoding(header: string | undefined): Encoding | null {
  if (!header) return null;
  const q = new Map<string, number>();
  for (const part of header.split(',')) {
    const [name, ...params] = part.trim().toLowerCase().split(';');
    if (!name) continue;
    const qParam = params.map((p) => p.trim()).find((p) => p.startsWith('q='));
    const value = qParam ? Number(qParam.slice(2)) : 1;
    q.set(name, Number.isFinite(value) ? value : 0);
  }
  const weight = (coding: string) => q.get(coding) ?? q.get('*') ?? 0;
  const br = weight('br');
  const gzip = weight('gzip');
  if (br > 0 && br >= gzip) return 'br';
  return gzip > 0 ? 'gzip' : null;
}

function cacheControlFor(relative: string): string {
  // Everything else (service worker, manifest, favicon, index.html) must be revalidated so updates reach phones.
  return hashedAsset.test(relative) ? `public, max-age=${oneYearSeconds}, immutable` : 'no-cache';
}

/** The file a request path names inside `webDir`, or null (outside it, a dotfile, or undecodable). */
function fileInside(webDir: string, urlPath: string): string | null {
  let decoded: string;
  try {
    decoded = decodeURIComponent(urlPath);
  } catch {
    return null;
  }
  if (decoded.includes('\0') || decoded.split('/').some((segment) => segment.startsWith('.'))) return null;
  const file = path.join(webDir, decoded);
  return file.startsWith(webDir + path.sep) ? file : null;
}

/**
 * The precompressed copy of `file` written by `scripts/precompress.ts` for this coding, if there is one
 * at least as new as the file (a copy older than its file belongs to another build and is ignored).
 */
async function freshVariant(file: string, encoding: Encoding): Promise<string | null> {
  const variant = file + variantExt[encoding];
  try {
    const [original, packed] = await Promise.all([fs.promises.stat(file), fs.promises.stat(variant)]);
    return original.isFile() && packed.isFile() && packed.mtimeMs >= original.mtimeMs ? variant : null;
  } catch {
    return null;
  }
}

/**
 * Sends the export's `file` as the best precompressed copy the request accepts, with the cache header
 * its name earns; calls `fallback` when there is no such copy (or the file vanished meanwhile).
 */
async function sendPrecompressed(
  req: Request,
  res: Response,
  webDir: string,
  file: string,
  fallback: (err?: unknown) => void,
): Promise<void> {
  if (!compressible.test(file)) return fallback();
  // Whichever representation goes out, a cache must key it by Accept-Encoding.
  res.vary('Accept-Encoding');
  const encoding = pickEncoding(req.headers['accept-encoding']);
  const variant = encoding ? await freshVariant(file, encoding) : null;
  if (!variant || !encoding) return fallback();
  const relative = path.relative(webDir, file).split(path.sep).join('/');
  res.setHeader('Content-Encoding', encoding);
  res.setHeader('Cache-Control', cacheControlFor(relative));
  res.type(path.extname(file));
  res.sendFile(variant, { cacheControl: false, dotfiles: 'allow' }, (err) => {
    if (!err) return;
    if (res.headersSent) {
      fallback(err);
      return;
    }
    res.removeHeader('Content-Encoding');
    res.removeHeader('Content-Type');
    fallback();
  });
}

/**
 * The web export on the same origin: static files first, then `index.html` for any other GET so the app's
 * router can handle deep links. Mounted after `/api`, which answers its own 404s.
 *
 * Files are sent as compressed at build time (`scripts/precompress.ts`: brotli 11 and gzip 9 beside each
 * file), never compressed per request: smaller than on-the-fly gzip and no CPU per request. A file
 * without a copy (too small to gain, or a build that was not precompressed) goes out as it is.
 */
export function webRouter(webDir: string): Router {
  const router = Router();
  const root = path.resolve(webDir);
  const indexFile = path.join(root, 'index.html');

  router.use((req, res, next) => {
    if (req.method !== 'GET' && req.method !== 'HEAD') return next();
    const file = fileInside(root, req.path);
    if (!file) return next();
    sendPrecompressed(req, res, root, file, next).catch(next);
  });

  router.use(
    express.static(root, {
      index: false,
      setHeaders: (res, filePath) => {
        res.setHeader(
          'Cache-Control',
          cacheControlFor(path.relative(root, filePath).split(path.sep).join('/')),
        );
      },
    }),
  );

  router.get('/{*splat}', (req, res, next) => {
    // A missing file (a stale bundle name, a typo'd asset) is a 404, not the app's HTML under a .js name.
    if (path.extname(req.path) !== '') {
      res.status(404).type('text/plain').send('Not found.');
      return;
    }
    // Checked per request so a build finished after the server started is picked up.
    if (!fs.existsSync(indexFile)) {
      res.status(503).type('html').set('Cache-Control', 'no-store').send(missingBuildPage);
      return;
    }
    sendPrecompressed(req, res, root, indexFile, (err) =>
      err ? next(err) : res.sendFile(indexFile, { headers: { 'Cache-Control': 'no-cache' } }),
    ).catch(next);
  });

  return router;
}
