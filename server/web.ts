import fs from 'node:fs';
import path from 'node:path';

import express, { Router } from 'express';

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

/**
 * The web export on the same origin: static files first, then `index.html` for any other GET so the app's
 * router can handle deep links. Mounted after `/api`, which answers its own 404s.
 */
export function webRouter(webDir: string): Router {
  const router = Router();
  const indexFile = path.join(webDir, 'index.html');

  router.use(
    express.static(webDir, {
      index: false,
      setHeaders: (res, filePath) => {
        const relative = path.relative(webDir, filePath).split(path.sep).join('/');
        // Everything else (service worker, manifest, favicon) must be revalidated so updates reach phones.
        res.setHeader(
          'Cache-Control',
          hashedAsset.test(relative) ? `public, max-age=${oneYearSeconds}, immutable` : 'no-cache',
        );
      },
    }),
  );

  router.get('/{*splat}', (req, res) => {
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
    res.sendFile(indexFile, { headers: { 'Cache-Control': 'no-cache' } });
  });

  return router;
}
