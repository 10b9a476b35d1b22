import { Router } from 'express';

import type { ApiDeps } from '@/server/deps';

export function noticesRouter(_deps: ApiDeps): Router {
  const router = Router();
  return router;
}
