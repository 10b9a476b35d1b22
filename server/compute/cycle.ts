/**
 * The ride cycle's analysis over HTTP, bounded twice: by size before any work (samples × rows of output,
 * refused with a 400 naming `samples`), and by time while it runs in a worker thread (a job that overruns
 * is stopped). What it answers is bounded too (cycle-series.ts). The phone's own calculator runs the same engine locally and is not limited by this.
 */
import path from 'node:path';

import type { CycleJobInput, CycleJobOutput } from '@/server/compute/cycle-worker';
import { createWorkerPool, type WorkerPool } from '@/server/compute/pool';

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
