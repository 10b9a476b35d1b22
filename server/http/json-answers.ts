import { createHash } from 'node:crypto';
import zlib from 'node:zlib';

import type { Request, Response } from 'express';

/** One remembered JSON answer: its bytes, its ETag, and its compressed forms once someone asked for them. */
export type JsonAnswer = { body: Buffer; etag: string; gzip?: Buffer; br?: Buffer };

type Encoding = 'br' | 'gzip' | 'identity';

/**
 * Below this size compressing costs more than it saves (the `compression` middleware's default threshold,
 * which is what answered these requests before).
 */
const COMPRESS_FROM_BYTES = 1024;
/**
 * Each answer is compressed once per stamp and then sent many times, so a little more effort than a
 * streaming default pays: brotli 5 and gzip 6 are a few hundred microseconds for a queue page.
 */
const BROTLI_QUALITY = 5;
const GZIP_LEVEL = 6;

/**
 * JSON answers remembered by key (for a GET route: its query string), all valid for one stamp: a
 * different stamp (the data they were read from has changed) empties the cache before anything is read
 * from it, so nothing made before a change is ever sent after it. Bounded by bytes (answers and their
 * compressed forms): when full it starts over.
 */
export class JsonAnswers {
  private stamp: string | null = null;
  private readonly entries = new Map<string, JsonAnswer>();
  private bytes = 0;

  constructor(private readonly maxBytes: number) {}

  get(key: string, stamp: string): JsonAnswer | undefined {
    if (stamp !== this.stamp) {
      this.clear();
      this.stamp = stamp;
      return undefined;
    }
    return this.entries.get(key);
  }

  /** Keeps `json` as the answer for `key` under `stamp` (the stamp read BEFORE the data was). */
  set(key: string, stamp: string, json: string): JsonAnswer {
    const answer = jsonAnswer(json);
    if (stamp !== this.stamp) {
      this.clear();
      this.stamp = stamp;
    }
    this.grow(answer.body.length);
    this.entries.set(key, answer);
    return answer;
  }

  /** The answer's bytes in `encoding`, compressing (once) on first use. */
  encoded(answer: JsonAnswer, encoding: Encoding): Buffer {
    if (encoding === 'identity') return answer.body;
    let bytes = answer[encoding];
    if (!bytes) {
      bytes =
        encoding === 'br'
          ? zlib.brotliCompressSync(answer.body, {
              params: {
                [zlib.constants.BROTLI_PARAM_QUALITY]: BROTLI_QUALITY,
                [zlib.constants.BROTLI_PARAM_MODE]: zlib.constants.BROTLI_MODE_TEXT,
                [zlib.constants.BROTLI_PARAM_SIZE_HINT]: answer.body.length,
              },
            })
          : zlib.gzipSync(answer.body, { level: GZIP_LEVEL });
      answer[encoding] = bytes;
      this.grow(bytes.length);
    }
    return bytes;
  }

  get size(): number {
    return this.entries.size;
  }

  private grow(bytes: number): void {
    if (this.bytes + bytes > this.maxBytes) this.clear();
    this.bytes += bytes;
  }

  private clear(): void {
    this.entries.clear();
    this.bytes = 0;
  }
}

/** A weak ETag over the identity bytes: the same for every content coding of the same JSON. */
function jsonAnswer(json: string): JsonAnswer {
  const body = Buffer.from(json, 'utf8');
  const hash = createHash('sha1').update(body).digest('base64url');
  return { body, etag: `W/"${body.length.toString(16)}-${hash}"` };
}

/** The query string of a request as sent (after `?`), the key under which a GET answer is remembered. */
export function rawQueryOf(req: Request): string {
  const url = req.originalUrl;
  const at = url.indexOf('?');
  return at < 0 ? '' : url.slice(at + 1);
}

/**
 * Sends a remembered answer as `res.json` would, but from bytes made once: `ETag` (and 304 when the
 * client's `If-None-Match` holds it, RFC 9110 §13.1.2, weak comparison), the best compressed form the
 * client accepts (`Vary: Accept-Encoding`; the compression middleware leaves an encoded body alone), and
 * `Content-Length`.
 */
export function sendJsonAnswer(req: Request, res: Response, cache: JsonAnswers, answer: JsonAnswer): void {
  res.setHeader('Content-Type', 'application/json; charset=utf-8');
  res.setHeader('ETag', answer.etag);
  res.vary('Accept-Encoding');
  if (notModified(req, answer.etag)) {
    res.statusCode = 304;
    res.end();
    return;
  }
  const encoding = answer.body.length < COMPRESS_FROM_BYTES ? 'identity' : encodingFor(req);
  const bytes = cache.encoded(answer, encoding);
  if (encoding !== 'identity') res.setHeader('Content-Encoding', encoding);
  res.setHeader('Content-Length', bytes.length);
  res.statusCode = 200;
  if (req.method === 'HEAD') res.end();
  else res.end(bytes);
}

function notModified(req: Request, etag: string): boolean {
  const header = req.headers['if-none-match'];
  if (!header) return false;
  // A client asking for no cached copy gets the whole answer (as Express's `req.fresh` decides).
  if (/(?:^|,)\s*no-cache\s*(?:,|$)/.test(req.headers['cache-control'] ?? '')) return false;
  if (header.trim() === '*') return true;
  const opaque = (tag: string) => tag.trim().replace(/^W\//, '');
  const wanted = opaque(etag);
  return header.split(',').some((tag) => opaque(tag) === wanted);
}

/**
 * The encoding for this `Accept-Encoding` (RFC 9110 §12.5.3): brotli where the client weighs it no lower
 * than gzip (it is the smaller), else gzip, else the bytes as they are. Browsers send one of a handful of
 * headers, so each header's answer is remembered.
 */
const encodingByHeader = new Map<string, Encoding>();
function encodingFor(req: Request): Encoding {
  const header = req.headers['accept-encoding'];
  if (!header) return 'identity';
  let encoding = encodingByHeader.get(header);
  if (!encoding) {
    const weights = new Map<string, number>();
    for (const part of header.split(',')) {
      const [name, ...params] = part.trim().toLowerCase().split(';');
      const q = params.map((p) => /^\s*q=([\d.]+)\s*$/.exec(p)).find(Boolean);
      if (name) weights.set(name.trim(), q ? Number(q[1]) : 1);
    }
    const weight = (name: string) => weights.get(name) ?? weights.get('*') ?? 0;
    const br = weight('br');
    const gzip = Math.max(weight('gzip'), weight('x-gzip'));
    encoding = br > 0 && br >= gzip ? 'br' : gzip > 0 ? 'gzip' : 'identity';
    if (encodingByHeader.size >= 64) encodingByHeader.clear();
    encodingByHeader.set(header, encoding);
  }
  return encoding;
}
