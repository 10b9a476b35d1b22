/**
 * JSON body parsers by size. Everything takes the small one, mounted for the whole app; the two routes
 * whose bodies are legitimately large mount theirs after `requireAuth`, so nobody without a valid token can
 * make the server read (and buffer) megabytes: their requests are answered 401 before the body is read.
 */
import express, { type RequestHandler } from 'express';

import { refuseDeepJson } from '@/server/http/json-depth';

/** Paths that parse their own larger bodies (after authentication); the small parser leaves them alone. */
const largeBodyPaths = ['/api/sync/push', '/api/fatigue/'];

const small = express.json({ limit: '2mb', verify: refuseDeepJson });

/** The app-wide parser: 2 MB, except on the paths above, whose routers parse after sign-in. */
export const smallJsonBody: RequestHandler = (req, res, next) => {
  const url = req.path;
  if (largeBodyPaths.some((p) => url === p || url.startsWith(p))) {
    next();
    return;
  }
  small(req, res, next);
};

/**
 * A phone's push batch (up to 50 inspections with their readings) may exceed 2 MB; a 413 there would make
 * the phone re-send the same batch for ever.
 */
export const syncPushJsonBody = express.json({ limit: '16mb', verify: refuseDeepJson });

/** A history of 1,000,000 values for rainflow counting is about 20 MB of JSON. */
export const fatigueJsonBody = express.json({ limit: '32mb', verify: refuseDeepJson });
