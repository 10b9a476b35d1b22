/** A phone's app is one bundle: no chunk can fail to arrive (see stale-build.web.ts). */
export const CHUNK_FAILED_MESSAGE =
  'Pivotwatch could not load this page. Check the connection and try again.';

export function isChunkLoadFailure(_err: unknown): boolean {
  return false;
}

export function afterChunkFailure(): Promise<never> {
  return Promise.reject(new Error(CHUNK_FAILED_MESSAGE));
}
