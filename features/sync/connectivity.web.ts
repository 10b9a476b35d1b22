/** In the browser: `navigator.onLine` and the window's online event (no extra library needed). */
export function isOnline(): boolean {
  return typeof navigator === 'undefined' ? true : navigator.onLine;
}

/** Calls `cb` whenever the connection comes back; returns the unsubscribe. */
export function onConnectionReturn(cb: () => void): () => void {
  window.addEventListener('online', cb);
  return () => window.removeEventListener('online', cb);
}

/** Calls `cb` when the connection is lost. */
export function onConnectionLoss(cb: () => void): () => void {
  window.addEventListener('offline', cb);
  return () => window.removeEventListener('offline', cb);
}
