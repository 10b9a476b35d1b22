import type { IncomingMessage, ServerResponse } from 'node:http';

import { HttpError } from '@/server/http/errors';

/**
 * How deep a JSON body may nest. The deepest shape the API takes (a push batch: batch → records → record →
 * readings → reading → confirmation) is under ten levels; thousands of levels parse, but then overflow the
 * stack of whatever walks them (validation, a worker's structured clone, a later JSON.stringify).
 */
export const MAX_JSON_DEPTH = 64;

/** The deepest nesting of objects and arrays in JSON text, read from the bytes (strings skipped). */
export function jsonDepth(bytes: Uint8Array, stopAbove = Infinity): number {
  let depth = 0;
  let deepest = 0;
  let inString = false;
  for (let i = 0; i < bytes.length; i++) {
    const b = bytes[i];
    if (inString) {
      // UTF-8 continuation bytes are never ASCII, so a quote or backslash byte is always the character.
      if (b === 0x5c) i++;
      else if (b === 0x22) inString = false;
    } else if (b === 0x22) {
      inString = true;
    } else if (b === 0x7b || b === 0x5b) {
      depth++;
      if (depth > deepest) {
        deepest = depth;
        if (deepest > stopAbove) return deepest;
      }
    } else if (b === 0x7d || b === 0x5d) {
      depth--;
    }
  }
  return deepest;
}

/** `verify` for express.json: a body nested deeper than MAX_JSON_DEPTH is a 400 before it is parsed. */
export function refuseDeepJson(_req: IncomingMessage, _res: ServerResponse, body: Buffer): void {
  if (jsonDepth(body, MAX_JSON_DEPTH) > MAX_JSON_DEPTH)
    throw new HttpError(
      400,
      'too_deep',
      `The JSON body nests deeper than ${MAX_JSON_DEPTH} levels; no request of this API needs that.`,
    );
}
