/**
 * How far a file from the API has come: the server making it (`preparing`, until its answer starts),
 * the bytes arriving (`downloading`: bytes of the whole when the answer says its length), and handing it
 * over (`saving`). Pure: the web's download reads the answer's body stream with it, and a phone's
 * download reports through expo-file-system's own progress in the same shape.
 */
export type DownloadStep = 'preparing' | 'downloading' | 'saving';

export type DownloadProgress = {
  step: DownloadStep;
  receivedBytes: number;
  /** Null when the answer did not say its length (or said the length of a compressed form). */
  totalBytes: number | null;
};

export type OnDownloadProgress = (progress: DownloadProgress) => void;

/**
 * The body's length in bytes as sent, or null when it cannot be known ahead: no Content-Length, or a
 * Content-Encoding (the header then counts the compressed bytes, the stream gives the decoded ones).
 */
export function expectedLength(headers: Pick<Headers, 'get'>): number | null {
  const encoding = headers.get('content-encoding');
  if (encoding && encoding.trim().toLowerCase() !== 'identity') return null;
  const raw = headers.get('content-length');
  if (raw === null || !/^\d+$/.test(raw.trim())) return null;
  const n = Number(raw);
  return Number.isSafeInteger(n) && n > 0 ? n : null;
}

/**
 * Reads an answer's body to the end, reporting the bytes as each chunk arrives (never more than the
 * stated total: a length that proves wrong becomes unknown rather than past 100 %). Falls back to
 * `blob()` where the body is not a stream.
 */
export async function readBody(res: Response, onProgress?: OnDownloadProgress): Promise<Blob> {
  if (!res.body || typeof res.body.getReader !== 'function') {
    const blob = await res.blob();
    onProgress?.({ step: 'downloading', receivedBytes: blob.size, totalBytes: blob.size });
    return blob;
  }
  const type = res.headers.get('content-type') ?? '';
  let total = expectedLength(res.headers);
  const reader = res.body.getReader();
  const chunks: Uint8Array[] = [];
  let received = 0;
  onProgress?.({ step: 'downloading', receivedBytes: 0, totalBytes: total });
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    chunks.push(value);
    received += value.byteLength;
    if (total !== null && received > total) total = null;
    onProgress?.({ step: 'downloading', receivedBytes: received, totalBytes: total });
  }
  return new Blob(chunks as BlobPart[], { type });
}
