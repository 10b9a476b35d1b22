import { pino, type Logger } from 'pino';

import type { Config } from '@/server/config';

export type { Logger };

export function createLogger(config: Pick<Config, 'logLevel'>): Logger {
  return pino({
    name: 'pivotwatch',
    level: config.logLevel,
    // Session tokens and passwords must never reach the logs.
    redact: {
      paths: ['req.headers.authorization', 'req.headers.cookie', 'password', '*.password'],
      censor: '[redacted]',
    },
  });
}
