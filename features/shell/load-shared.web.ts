/**
 * The code that two or more signed-in bundles share sits in one chunk of the web export (`__common`).
 * Expo's page would load it with the entry, before the sign-in form; scripts/build-web.ts takes it out
 * of index.html and leaves its address in `<meta name="pivotwatch-shared">`. The bundles' modules require
 * what it defines, so every bundle is imported only after `loadShared()` has run it (lazy-screen.tsx).
 */
import { firstScreenSettled } from '@/components/first-screen';

let shared: Promise<void> | null = null;

export function sharedChunkUrl(): string | null {
  return document.querySelector('meta[name="pivotwatch-shared"]')?.getAttribute('content') || null;
}

/** Runs the shared chunk once (no-op in development, where there is no such chunk). */
export function loadShared(): Promise<void> {
  if (shared) return shared;
  const src = sharedChunkUrl();
  if (!src) return (shared = Promise.resolve());
  shared = new Promise<void>((resolve, reject) => {
    const script = document.createElement('script');
    script.src = src;
    script.onload = () => resolve();
    script.onerror = () => {
      // Offline before the service worker held it, or the server away: the next attempt tries again.
      script.remove();
      shared = null;
      const err = new Error('Pivotwatch could not load its screens. Check the connection and try again.');
      err.name = 'ChunkLoadError';
      reject(err);
    };
    document.head.appendChild(script);
  });
  return shared;
}

/** How long after the first screen the rest of a role's areas wait for the service worker at most. */
const BACKGROUND_AFTER_MS = 5000;
/** How long the rest of a role's areas wait for the first screen to say it has its content, at most. */
const FIRST_SCREEN_MAX_MS = 20_000;
/** Then a pause, for the person's first look and taps (and for drawing what came with the content). */
const AFTER_FIRST_SCREEN_MS = 2000;

/**
 * Whether a service worker controlled this page when it loaded: its precache was complete then, so every
 * chunk of this version can come from it with no network, and nothing needs loading ahead.
 */
const heldAtStart = typeof navigator !== 'undefined' && navigator.serviceWorker?.controller != null;

/**
 * Resolves `true` once the first screen has its content (first-screen.ts), two seconds have passed, and then the service worker
 * controls the page (its precache is complete, so chunks come from it) or a few seconds have passed,
 * whichever is first; `false` straight away when a worker already held the page at start (a reload,
 * offline or not), where loading the other areas ahead would only compete with the first screen for the
 * main thread.
 */
export async function backgroundMoment(): Promise<boolean> {
  if (heldAtStart) return false;
  await firstScreenSettled(FIRST_SCREEN_MAX_MS);
  await new Promise((resolve) => setTimeout(resolve, AFTER_FIRST_SCREEN_MS));
  return new Promise((resolve) => {
    const sw = typeof navigator !== 'undefined' ? navigator.serviceWorker : undefined;
    if (!sw || sw.controller) return resolve(true);
    const timer = setTimeout(() => resolve(true), BACKGROUND_AFTER_MS);
    sw.addEventListener(
      'controllerchange',
      () => {
        clearTimeout(timer);
        resolve(true);
      },
      { once: true },
    );
  });
}
