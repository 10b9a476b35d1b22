/**
 * Registers the generated service worker (scripts/build-sw.ts) and reports when a new version has
 * installed and is waiting. The waiting worker takes over only when the inspector says so
 * (`applyUpdate`): it is told to skip waiting, and the page reloads once it controls the page. Drafts are
 * saved on every change, so the reload loses nothing.
 */
import { useSyncExternalStore } from 'react';
import { Workbox } from 'workbox-window';

let workbox: Workbox | null = null;
let waiting = false;
const listeners = new Set<() => void>();

/** How often an open app asks the server whether a new version exists (also on reconnect). */
const UPDATE_CHECK_MS = 60 * 60 * 1000;

function markWaiting() {
  waiting = true;
  listeners.forEach((l) => l());
}

/**
 * Registers `/sw.js` once per page. `onUpdate` is called when a new version is waiting. Nothing happens
 * where service workers are unavailable (an insecure origin, a browser without them) or in development,
 * where the dev server has no `sw.js`.
 */
export function registerServiceWorker(onUpdate?: () => void): void {
  if (onUpdate) listeners.add(onUpdate);
  if (workbox || __DEV__ || typeof navigator === 'undefined' || !('serviceWorker' in navigator)) return;
  workbox = new Workbox('/sw.js');
  workbox.addEventListener('waiting', markWaiting);
  workbox.register().catch((err: unknown) => console.warn('[pivotwatch] service worker not registered', err));
  const check = () => void workbox?.update().catch(() => undefined);
  setInterval(check, UPDATE_CHECK_MS);
  window.addEventListener('online', check);
}

/** Lets the waiting version take over, then reloads into it. */
export function applyUpdate(): void {
  if (!workbox || !waiting) return;
  workbox.addEventListener('controlling', () => window.location.reload());
  workbox.messageSkipWaiting();
}

function subscribe(listener: () => void): () => void {
  registerServiceWorker(listener);
  return () => {
    listeners.delete(listener);
  };
}

/** `updateReady` turns true when a new version is installed and waiting; `applyUpdate` switches to it. */
export function useAppUpdate(): { updateReady: boolean; applyUpdate: () => void } {
  const updateReady = useSyncExternalStore(
    subscribe,
    () => waiting,
    () => false,
  );
  return { updateReady, applyUpdate };
}
