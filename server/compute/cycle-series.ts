/**
 * The series a ride cycle's HTTP answer carries. Bounded by default, so an answer's size no longer grows
 * with the samples analysed: a 10,000-sample measured record or a 100,000-point request answers in tens of
 * kilobytes, every series' peaks and troughs kept exactly (features/loads/engine/decimate.ts). Every
 * sample on request (`?resolution=full`) up to a cap on the numbers sent.
 */
import {
  BOUNDED_CYCLE_VALUES,
  ENGINE_ASSUMPTIONS,
  ENGINE_VERSION,
  boundCycle,
  cycleResultToJson,
  valuesPerSample,
  type CycleResult,
} from '@/features/loads/engine';
import type { CycleResolution, CycleSeriesFields } from '@/features/loads/cycle-resolution-schema';
import type { CycleResponse } from '@/features/loads/schema';

/** Numbers in a bounded answer's series (features/loads/engine/decimate.ts says how many that is). */
export const CYCLE_BOUNDED_VALUES = BOUNDED_CYCLE_VALUES;

/**
 * Numbers a full-resolution answer may carry: about 9 MB of JSON, e.g. a 10,000-sample measured record of
 * five bodies and two seats. Beyond it the bounded answer is the one to ask for.
 */
export const CYCLE_FULL_MAX_VALUES = 500_000;

export type CycleAnswer = CycleResponse & CycleSeriesFields;
type Issue = { path: string; message: string };

/** Why a full-resolution answer of this size is refused, or null when it is within the cap. */
export function fullResolutionIssue(samples: number, joints: number, seats: number): Issue | null {
  const values = samples * valuesPerSample(joints, seats);
  if (values <= CYCLE_FULL_MAX_VALUES) return null;
  return {
    path: 'query.resolution',
    message:
      `Full resolution is limited to ${CYCLE_FULL_MAX_VALUES.toLocaleString('en')} numbers; this cycle has ` +
      `${values.toLocaleString('en')} (${samples.toLocaleString('en')} samples × ` +
      `${valuesPerSample(joints, seats)} series). Leave resolution out for the bounded series (every peak ` +
      'kept), or ask for fewer samples',
  };
}

type Cut = { result: CycleResult; sampleIndex: number[] | null };

/** The analysis cut to the asked resolution (every sample for `full`), or why a full one is refused. */
function cut(
  result: CycleResult,
  resolution: CycleResolution,
): { ok: true; value: Cut } | { ok: false; issues: Issue[] } {
  if (resolution === 'full') {
    const issue = fullResolutionIssue(result.timeS.length, result.joints.length, result.seats.length);
    return issue ? { ok: false, issues: [issue] } : { ok: true, value: { result, sampleIndex: null } };
  }
  return { ok: true, value: boundCycle(result, CYCLE_BOUNDED_VALUES) };
}

const head = () => ({ engineVersion: ENGINE_VERSION, assumptions: ENGINE_ASSUMPTIONS });

/** The answer for an analysed cycle at the asked resolution; a full one beyond the cap is an issue. */
export function cycleAnswer(
  result: CycleResult,
  resolution: CycleResolution,
): { ok: true; value: CycleAnswer } | { ok: false; issues: Issue[] } {
  const bounded = cut(result, resolution);
  if (!bounded.ok) return bounded;
  const { sampleIndex } = bounded.value;
  const json = cycleResultToJson(bounded.value.result);
  return {
    ok: true,
    value: sampleIndex
      ? { ...head(), ...json, resolution: 'bounded', sampleIndex }
      : { ...head(), ...json, resolution: 'full' },
  };
}

/**
 * `JSON.stringify(cycleAnswer(result, resolution).value)` as UTF-8, byte for byte, written without the
 * plain copy of every series or one big string: each series is copied into one reused array and turned
 * into JSON by V8's own number formatting (its array fast path), straight into a reused buffer. Less
 * garbage per answer means fewer collections in the middle of one. The bytes are a view of that buffer,
 * good until the next call: copy or compress them before. The equality with the plain path is tested
 * (tests/server/cycle-answer-json.test.ts).
 */
export function cycleAnswerBytes(
  result: CycleResult,
  resolution: CycleResolution,
): { ok: true; bytes: Buffer } | { ok: false; issues: Issue[] } {
  const bounded = cut(result, resolution);
  if (!bounded.ok) return bounded;
  const { sampleIndex } = bounded.value;
  const answer = sampleIndex
    ? { ...head(), ...bounded.value.result, resolution: 'bounded', sampleIndex }
    : { ...head(), ...bounded.value.result, resolution: 'full' };
  out.length = 0;
  writeJson(answer);
  return { ok: true, bytes: out.buffer.subarray(0, out.length) };
}

/** The reused output: grows to the largest answer written (a full answer is at most ~9 MB). */
const out = { buffer: Buffer.allocUnsafe(256 * 1024), length: 0 };
/** The reused plain array each series passes through on its way to JSON. */
const scratch: number[] = [];

function emit(text: string): void {
  // UTF-8 takes at most three bytes per UTF-16 unit.
  if (out.length + text.length * 3 > out.buffer.length) {
    const bigger = Buffer.allocUnsafe(Math.max(out.buffer.length * 2, out.length + text.length * 3));
    out.buffer.copy(bigger, 0, 0, out.length);
    out.buffer = bigger;
  }
  out.length += out.buffer.write(text, out.length, 'utf8');
}

/**
 * Writes `value` as `JSON.stringify(cycleResultToJson(value))` would: a Float64Array as an array of its
 * numbers, any other object by its own enumerable keys, a key whose value JSON cannot hold (undefined, a
 * function) left out of an object and `null` in an array. False (nothing written) when the value itself
 * has no JSON.
 */
function writeJson(value: unknown): boolean {
  if (value instanceof Float64Array) {
    scratch.length = value.length;
    for (let k = 0; k < value.length; k++) scratch[k] = value[k];
    emit(JSON.stringify(scratch));
    return true;
  }
  if (Array.isArray(value)) {
    if (value.every((v) => typeof v === 'number')) {
      emit(JSON.stringify(value));
      return true;
    }
    emit('[');
    for (let k = 0; k < value.length; k++) {
      if (k > 0) emit(',');
      if (!writeJson(value[k])) emit('null');
    }
    emit(']');
    return true;
  }
  if (value !== null && typeof value === 'object') {
    emit('{');
    let first = true;
    for (const key of Object.keys(value)) {
      const v = (value as Record<string, unknown>)[key];
      if (v === undefined || typeof v === 'function' || typeof v === 'symbol') continue;
      emit(first ? `${JSON.stringify(key)}:` : `,${JSON.stringify(key)}:`);
      first = false;
      writeJson(v);
    }
    emit('}');
    return true;
  }
  const text = JSON.stringify(value) as string | undefined;
  if (text === undefined) return false;
  emit(text);
  return true;
}
