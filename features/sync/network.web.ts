/**
 * The browser's network state: `navigator.onLine` and the window's online/offline events (no library
 * needed); the page shown or hidden stands in for the app's foreground. The phone's pair is `network.ts`.
 */
export function isOnline(): boolean {
  return typeof navigator === 'undefined' ? true : navigator.onLine;
}

/** Resolves with the state once it is known: in a browser, at once. */
export function networkKnown(): Promise<boolean> {
  return Promise.resolve(isOnline());
}

/** Calls `cb` with every change of the network state; returns the unsubscribe. */
export function onNetworkChange(cb: (online: boolean) => void): () => void {
  const up = () => cb(true);
  const down = () => cb(false);
  window.addEventListener('online', up);
  window.addEventListener('offline', down);
  return () => {
    window.removeEventListener('online', up);
    window.removeEventListener('offline', down);
  };
}

/** Calls `cb` whenever the connection comes back; returns the unsubscribe. */
export function onConnectionReturn(cb: () => void): () => void {
  return onNetworkChange((now) => (now ? cb() : undefined));
}

/** Calls `cb` when the connection is lost. */
export function onConnectionLoss(cb: () => void): () => void {
  return onNetworkChange((now) => (now ? undefined : cb()));
}

/** The page shown (true) or hidden: react-query's focus, and a moment to sync. */
export function onAppFocus(cb: (focused: boolean) => void): () => void {
  const changed = () => cb(document.visibilityState !== 'hidden');
  document.addEventListener('visibilitychange', changed);
  return () => document.removeEventListener('visibilitychange', changed);
}
