/**
 * What the last request to the server found: reached, or not (no network, DNS, connection refused). The
 * API client reports every outcome here; the connection banner reads it together with the platform's
 * network state (`online-state.ts`). Pure and platform-free, so the API client stays importable anywhere.
 */
let reached = true;
const listeners = new Set<() => void>();

export function serverReached(): boolean {
  return reached;
}

export function reportServerReached(value: boolean): void {
  if (value === reached) return;
  reached = value;
  listeners.forEach((l) => l());
}

export function onReachabilityChange(listener: () => void): () => void {
  listeners.add(listener);
  return () => listeners.delete(listener);
}
