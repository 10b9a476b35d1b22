/**
 * The ride cycle's analysis over HTTP, bounded twice: by size before any work (samples × rows of output,
 * refused with a 400 naming `samples`), and by time while it runs in a worker thread (a job that overruns
 * is stopped). What it answers is bounded too (cycle-series.ts). The phone's own calculator runs the same engine locally and is not limited by this.
 */
import path from 'node:path';

import type { Response } from 'express';

import type { CycleJobInput, CycleJobOutput } from '@/server/compute/cycle-worker';
import {
  ComputeBusyError,
  ComputeTimeoutError,
  createWorkerPool,
  type WorkerPool,
} from '@/server/compute/pool';
import type { ApiDeps } from '@/server/deps';
import { HttpError } from '@/server/http/errors';

/**
 * Samples × (bodies + seats) one request may ask for: this keeps its analysis near a second on a small
 * server (the answer's size is bounded apart from it, server/compute/cycle-series.ts). It equals the
 * densest measured record the engine samples by itself (10,000 samples) times the most bodies (10), so a
 * request that leaves `samples` out is never refused by it.
 */
export const HTTP_CYCLE_MAX_POINTS = 100_000;

type Issue = { path: string; message: string };

const lengthOf = (value: unknown) => (Array.isArray(value) ? value.length : 0);
const plural = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;

/**
 * The size check, on the raw body before it is queued (cheap: it reads three fields). A body of the wrong
 * shape passes here and is refused by the full validation in the worker.
 */
export function cycleSizeIssue(body: unknown): Issue | null {
  if (typeof body !== 'object' || body === null) return null;
  const { samples, bodies, seats } = body as Record<string, unknown>;
  if (typeof samples !== 'number' || !Number.isFinite(samples)) return null;
  const bodyCount = lengthOf(bodies);
  const seatCount = lengthOf(seats);
  const rows = Math.max(1, bodyCount + seatCount);
  if (samples * rows <= HTTP_CYCLE_MAX_POINTS) return null;
  const most = Math.floor(HTTP_CYCLE_MAX_POINTS / rows);
  return {
    path: 'samples',
    message:
      `At most ${most.toLocaleString('en')} samples for ${plural(bodyCount, 'body', 'bodies')} and ` +
      `${plural(seatCount, 'seat', 'seats')} over the API ` +
      `(samples × (bodies + seats) ≤ ${HTTP_CYCLE_MAX_POINTS.toLocaleString('en')}); ask for fewer samples`,
  };
}

export type CyclePool = WorkerPool<CycleJobInput, CycleJobOutput>;

export function createCyclePool(timeoutMs: number): CyclePool {
  return createWorkerPool<CycleJobInput, CycleJobOutput>({
    file: path.join(__dirname, 'cycle-worker.ts'),
    timeoutMs,
  });
}

/** One pool per app for every cycle route (`POST /loads/cycle`, `GET /inspections/:id/cycle`). */
const pools = new WeakMap<ApiDeps, CyclePool>();
export function cyclePoolOf(deps: ApiDeps): CyclePool {
  let pool = pools.get(deps);
  if (!pool) {
    pool = createCyclePool(deps.config.computeTimeLimitMs);
    pools.set(deps, pool);
  }
  return pool;
}

/**
 * A cycle job's answer, with the pool's refusals as HTTP errors: a job that overran the server's limit
 * (COMPUTE_TIME_LIMIT_MS) is a 422 `too_much_work`; every worker busy and the line full, a 503 `busy`
 * with Retry-After.
 */
export function runCycleJob(pool: CyclePool, input: CycleJobInput, res: Response): Promise<CycleJobOutput> {
  return pool.run(input).catch((error: unknown) => {
    if (error instanceof ComputeTimeoutError)
      throw new HttpError(
        422,
        'too_much_work',
        `The analysis took longer than the server allows (${error.limitMs / 1000} s) and was stopped: ` +
          'ask for fewer samples or a shorter cycle.',
      );
    if (error instanceof ComputeBusyError) {
      res.setHeader('Retry-After', '5');
      throw new HttpError(503, 'busy', 'The server is busy with other analyses; try again in a few seconds.');
    }
    throw error;
  });
}
