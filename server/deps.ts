import type { Config } from '@/server/config';
import type { Db } from '@/server/db';
import type { Logger } from '@/server/logger';

/** What the app and its routers need from outside; tests pass their own. */
export type ApiDeps = {
  db: Db;
  config: Config;
  logger: Logger;
  /** Failed sign-ins allowed per IP and window; defaults to 10 per 15 minutes. */
  signInLimit?: { windowMs: number; max: number };
  /** The clock for due dates and timestamps; tests pin it. Defaults to the system clock. */
  now?: () => Date;
};

export const nowOf = (deps: Pick<ApiDeps, 'now'>): Date => deps.now?.() ?? new Date();
