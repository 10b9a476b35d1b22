/**
 * The worker thread that analyses ride cycles (started by pool.ts, never imported), so the main thread
 * only reads rows and sends bytes:
 * - `request`: a `POST /api/loads/cycle` body. It validates, analyses, cuts the series to the asked
 *   resolution, serialises and (when the client takes gzip) compresses.
 * - `inspection`: the cycle behind a stored inspection's load check (`GET /api/inspections/:id/cycle`),
 *   from the stored record and design data as their JSON text. The answer is kept by the route
 *   (server/review/cycle.ts), so it comes in every form a client may ask for, with its ETag.
 * Bytes are transferred to the main thread, not copied.
 */
import { createHash } from 'node:crypto';
import zlib from 'node:zlib';

import type { DesignData } from '@/features/loads/design-schema';
import type { CycleResolution } from '@/features/loads/cycle-resolution-schema';
import { analyseCycleBody } from '@/features/loads/schema';
import { analyseRecord } from '@/features/records/analysis';
import type { InspectionRecord } from '@/features/records/schema';
import type { ChecklistContent } from '@/features/registry/schema';
import { cycleAnswerBytes } from '@/server/compute/cycle-series';
import { ownBytes, serveJobs } from '@/server/compute/worker-side';

type Issue = { path: string; message: string };

export type CycleJobInput =
  | { kind: 'request'; body: unknown; resolution: CycleResolution; gzip: boolean }
  | {
      kind: 'inspection';
      /** The design version's data and the inspection's record, as stored (JSON text). */
      designJson: string;
      recordJson: string;
      template: ChecklistContent | null;
      samples: number;
      resolution: CycleResolution;
    };

/** An answer in every form sent: JSON bytes, gzip, brotli, and a weak ETag over the JSON. */
type Bytes = Uint8Array<ArrayBuffer>;
export type EncodedAnswer = { body: Bytes; gzip: Bytes; br: Bytes; etag: string };

export type CycleJobOutput =
  | { ok: true; body: Bytes; gzip: boolean }
  | { ok: true; answer: EncodedAnswer }
  | { ok: false; issues: Issue[] }
  /** The stored inputs could not be analysed (the engine's message). */
  | { ok: false; failed: string };

/**
 * Huffman coding alone: the series are shortest round-trip decimals, which repeat too little for
 * LZ77's matches to pay. On a three-body, 3,600-sample bounded answer (221 kB of JSON) it is smaller than
 * level 1 (104.6 kB against 105.4 kB) in a third of the time (about 1 ms against 3 ms).
 */
const GZIP = { level: 1, strategy: zlib.constants.Z_HUFFMAN_ONLY };
/** Brotli's quality 1 is smaller still here (99.5 kB) in about 1 ms; higher qualities gain nothing on digits. */
const BROTLI = (size: number) => ({
  params: {
    [zlib.constants.BROTLI_PARAM_QUALITY]: 1,
    [zlib.constants.BROTLI_PARAM_MODE]: zlib.constants.BROTLI_MODE_TEXT,
    [zlib.constants.BROTLI_PARAM_SIZE_HINT]: size,
  },
});

function requestCycle({
  body,
  resolution,
  gzip,
}: Extract<CycleJobInput, { kind: 'request' }>): CycleJobOutput {
  const analysed = analyseCycleBody(body);
  if (!analysed.ok) return analysed;
  const answer = cycleAnswerBytes(analysed.value, resolution);
  if (!answer.ok) return answer;
  // The bytes are a view of the writer's buffer: compressed, or copied once, before they leave.
  const sent = gzip ? ownBytes(zlib.gzipSync(answer.bytes, GZIP)) : new Uint8Array(answer.bytes);
  return { ok: true, body: sent, gzip };
}

function inspectionCycle(input: Extract<CycleJobInput, { kind: 'inspection' }>): CycleJobOutput {
  const design = JSON.parse(input.designJson) as DesignData;
  const record = JSON.parse(input.recordJson) as InspectionRecord;
  let cycle;
  try {
    // The stored analysis's own computation: readings, recorded cycles, the design's stops, checklist values.
    const {
      models: _m,
      loadCases: _c,
      governingCase: _g,
      periodChecks: _p,
      ...result
    } = analyseRecord(design, record, input.template, input.samples);
    cycle = result;
  } catch (error) {
    return { ok: false, failed: error instanceof Error ? error.message : String(error) };
  }
  const answer = cycleAnswerBytes(cycle, input.resolution);
  if (!answer.ok) return answer;
  const body = answer.bytes;
  const hash = createHash('sha1').update(body).digest('base64url');
  return {
    ok: true,
    answer: {
      body: new Uint8Array(body),
      gzip: ownBytes(zlib.gzipSync(body, GZIP)),
      br: ownBytes(zlib.brotliCompressSync(body, BROTLI(body.length))),
      etag: `W/"${body.length.toString(16)}-${hash}"`,
    },
  };
}

serveJobs(
  (input: CycleJobInput): CycleJobOutput =>
    input.kind === 'request' ? requestCycle(input) : inspectionCycle(input),
  (output) => {
    if (!output.ok) return [];
    if ('body' in output) return [output.body.buffer];
    const { body, gzip, br } = output.answer;
    return [body.buffer, gzip.buffer, br.buffer];
  },
);
