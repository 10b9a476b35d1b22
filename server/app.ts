import compression from 'compression';
import express, { type Express } from 'express';
import helmet from 'helmet';
import { pinoHttp } from 'pino-http';

import type { ApiDeps } from '@/server/deps';
import { apiCachePolicy } from '@/server/http/cache-policy';
import { errorHandler, sendError } from '@/server/http/errors';
import { smallJsonBody } from '@/server/http/json-body';
import { apiRouter } from '@/server/routes';
import { webRouter } from '@/server/web';

export type { ApiDeps as AppDeps } from '@/server/deps';

/**
 * The whole HTTP app without `listen()`, so tests drive it with supertest and `startServer` wraps it.
 * Order matters: logging first, then headers, compression, the JSON body parser, the API (with its own
 * JSON 404), the web export and its SPA fallback, and last the one error handler.
 */
export function createApp(deps: ApiDeps): Express {
  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', deps.config.trustProxy);

  // Request lines are logged at `info`; below that level the middleware would only cost time.
  if (deps.logger.isLevelEnabled('info'))
    app.use(
      pinoHttp({
        logger: deps.logger,
        // Health checks would drown the log; everything else is one line per request.
        autoLogging: { ignore: (req) => req.url === '/api/health' },
        customLogLevel: (_req, res, err) => (err || res.statusCode >= 500 ? 'error' : 'info'),
        // One short line per request; headers (and the tokens in them) stay out of the log.
        serializers: {
          req: (req: { id: unknown; method: string; url: string }) => ({
            id: req.id,
            method: req.method,
            url: req.url,
          }),
          res: (res: { statusCode: number }) => ({ statusCode: res.statusCode }),
        },
      }),
    );

  app.use(
    helmet({
      contentSecurityPolicy: {
        useDefaults: false,
        directives: {
          defaultSrc: ["'self'"],
          // The SQLite worker compiles WebAssembly; nothing else needs eval.
          scriptSrc: ["'self'", "'wasm-unsafe-eval'"],
          workerSrc: ["'self'", 'blob:'],
          imgSrc: ["'self'", 'data:', 'blob:'],
          // react-native-web writes its styles at run time.
          styleSrc: ["'self'", "'unsafe-inline'"],
          fontSrc: ["'self'", 'data:'],
          connectSrc: ["'self'"],
          manifestSrc: ["'self'"],
          objectSrc: ["'none'"],
          baseUri: ["'self'"],
          formAction: ["'self'"],
          frameAncestors: ["'self'"],
          // No upgrade-insecure-requests: phones on a site's LAN reach the server over plain http.
        },
      },
      // The app needs no cross-origin isolation (the database runs through the async worker API).
      crossOriginEmbedderPolicy: false,
    }),
  );

  // API answers only: the web export is sent precompressed at build time (server/web.ts).
  app.use('/api', compression());
  // Before the parsers, so their 400/413 answers are no-store too.
  app.use('/api', apiCachePolicy);
  // 2 MB for everything; the sync push and fatigue routes parse their larger bodies after sign-in.
  app.use(smallJsonBody);

  app.use('/api', apiRouter(deps));
  app.use(webRouter(deps.config.webDir));

  // Only non-GET requests outside /api get here (GETs end in the SPA fallback).
  app.use((req, res) => {
    sendError(res, 404, 'not_found', `Nothing at ${req.method} ${req.path}.`);
  });
  app.use(errorHandler(deps.logger));

  return app;
}
