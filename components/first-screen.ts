/**
 * When the first screen after opening the app has its content: the moment the rest of a role's areas may
 * start loading in the background (features/shell/load-shared.web.ts) without competing with what the person is waiting
 * for. On a slow phone the inspector's first sync can outlast any fixed delay, and chunks loaded ahead
 * during it would be bytes and main-thread time taken from Today.
 */
import { useEffect } from 'react';

let settle: () => void = () => undefined;
const settled = new Promise<void>((resolve) => {
  settle = resolve;
});

/** Called by each role's home once its content (or its error) is on screen; later calls do nothing. */
export function markFirstScreenSettled(): void {
  settle();
}

/**
 * Resolves once a home has said its content is on screen, or after `maxWaitMs` (a page opened at another
 * address, or a home that never settles, still gets its areas loaded ahead).
 */
export function firstScreenSettled(maxWaitMs: number): Promise<void> {
  return Promise.race([settled, new Promise<void>((resolve) => setTimeout(resolve, maxWaitMs))]);
}

/** Marks the first screen settled once `done` turns true. */
export function useFirstScreenSettled(done: boolean): void {
  useEffect(() => {
    if (done) markFirstScreenSettled();
  }, [done]);
}
