/**
 * The worker thread that analyses a ride cycle for `POST /api/loads/cycle` (started by pool.ts, never
 * imported). It validates, analyses and serialises, so the main thread neither computes nor builds the
 * large JSON answer.
 */
import { analyseCycleRequest } from '@/features/loads/schema';
import { serveJobs } from '@/server/compute/worker-side';

export type CycleJobOutput =
  { ok: true; json: string } | { ok: false; issues: { path: string; message: string }[] };

serveJobs((body: unknown): CycleJobOutput => {
  const outcome = analyseCycleRequest(body);
  return outcome.ok ? { ok: true, json: JSON.stringify(outcome.value) } : outcome;
});
