/**
 * The server process logs an uncaught exception or an unhandled promise rejection and exits non-zero, for
 * its supervisor to restart it (server/main.ts `exitOnCrash`, installed by the start block only: a test or
 * a harness that starts the server in its own process keeps its own handlers).
 */
import { spawnSync } from 'node:child_process';
import path from 'node:path';

import { exitOnCrash } from '@/server/main';
import type { Logger } from '@/server/logger';

jest.setTimeout(90_000);

test('both handlers log at fatal and exit 1; uninstalling removes them', () => {
  const fatal = jest.fn();
  const exit = jest.fn();
  const before = {
    exception: process.listeners('uncaughtException').length,
    rejection: process.listeners('unhandledRejection').length,
  };
  const uninstall = exitOnCrash({ fatal } as unknown as Logger, exit);
  try {
    const onRejection = process.listeners('unhandledRejection').at(-1) as (e: unknown) => void;
    const onException = process.listeners('uncaughtException').at(-1) as (e: unknown) => void;
    const error = new Error('lost promise');
    onRejection(error);
    onException(new Error('thrown in a timer'));
    expect(exit.mock.calls).toEqual([[1], [1]]);
    expect(fatal.mock.calls[0]).toEqual([
      { err: error },
      expect.stringMatching(/^unhandled promise rejection/),
    ]);
    expect(fatal.mock.calls[1][1]).toMatch(/^uncaught exception/);
  } finally {
    uninstall();
  }
  expect(process.listeners('uncaughtException')).toHaveLength(before.exception);
  expect(process.listeners('unhandledRejection')).toHaveLength(before.rejection);
});

test('in a real process, a rejection nobody handles is logged as one JSON line and the process exits 1', () => {
  const code = [
    "const { exitOnCrash } = require('@/server/main');",
    "const { createLogger } = require('@/server/logger');",
    "exitOnCrash(createLogger({ logLevel: 'info' }));",
    "Promise.reject(new Error('no one awaited this'));",
    // Without the handler the process would still be alive here; with it, this never prints.
    "setTimeout(() => console.log('still running'), 5000);",
  ].join('\n');
  const run = spawnSync(process.execPath, ['--import', 'tsx', '-e', code], {
    cwd: path.resolve(__dirname, '../..'),
    encoding: 'utf8',
    timeout: 80_000,
  });
  expect(run.status).toBe(1);
  expect(run.stdout).not.toContain('still running');
  const line = JSON.parse(run.stdout.trim().split('\n').at(-1) ?? '{}');
  // pino's numeric level for fatal is 60.
  expect(line).toMatchObject({ level: 60, name: 'pivotwatch', err: { message: 'no one awaited this' } });
  expect(line.msg).toMatch(/^unhandled promise rejection/);
});
