/**
 * The worker thread that analyses a ride cycle for `POST /api/loads/cycle` (started by pool.ts, never
 * imported). It validates, analyses, cuts the series to the asked resolution, serialises and (when the
 * client takes gzip) compresses, so the main thread only sends bytes.
 */
import zlib from 'node:zlib';

import type { CycleResolution } from '@/features/loads/cycle-resolution-schema';
import { analyseCycleBody } from '@/features/loads/schema';
import { cycleAnswer } from '@/server/compute/cycle-series';
import { serveJobs } from '@/server/compute/worker-side';

export type CycleJobInput = { body: unknown; resolution: CycleResolution; gzip: boolean };
export type CycleJobOutput =
  | { ok: true; json: string }
  | { ok: true; gzip: Uint8Array }
  | { ok: false; issues: { path: string; message: string }[] };

// As analyseCycleRequest (features/loads/schema.ts), but the typed arrays are cut before they become JSON.
serveJobs(({ body, resolution, gzip }: CycleJobInput): CycleJobOutput => {
  const analysed = analyseCycleBody(body);
  if (!analysed.ok) return analysed;
  const answer = cycleAnswer(analysed.value, resolution);
  if (!answer.ok) return answer;
  const json = JSON.stringify(answer.value);
  // Level 1: within a few per cent of the default level's size here, in half its time.
  return gzip ? { ok: true, gzip: zlib.gzipSync(json, { level: 1 }) } : { ok: true, json };
});
