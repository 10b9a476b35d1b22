/**
 * The phone's network state, from expo-network: connected, and the internet reachable where the system
 * can tell. Until the first reading arrives the phone counts as online (a request finds out soon enough);
 * a reading is taken again whenever the app comes back to the foreground, since the system may not have
 * told a suspended app of a change. The web's pair is `network.web.ts`.
 */
import { type NetworkState, addNetworkStateListener, getNetworkStateAsync } from 'expo-network';
import { AppState } from 'react-native';

/** Only a definite "no" counts: `isInternetReachable` is unknown (undefined) while the system checks. */
export function onlineOf(state: NetworkState): boolean {
  return state.isConnected !== false && state.isInternetReachable !== false;
}

let online = true;
let known: Promise<boolean> | null = null;
const listeners = new Set<(online: boolean) => void>();

function publish(next: boolean) {
  if (next === online) return;
  online = next;
  listeners.forEach((l) => l(next));
}

/** Counts the system's change events: a reading begun before the latest event is older than it. */
let events = 0;

function read(): Promise<boolean> {
  const since = events;
  return getNetworkStateAsync()
    .then((state) => {
      if (events === since) publish(onlineOf(state ?? {}));
      return online;
    })
    .catch(() => online);
}

let watching = false;
function watch() {
  if (watching) return;
  watching = true;
  addNetworkStateListener((state) => {
    events += 1;
    publish(onlineOf(state));
  });
  AppState.addEventListener('change', (s) => {
    if (s === 'active') void read();
  });
  known = read();
}

export function isOnline(): boolean {
  watch();
  return online;
}

/** Resolves with the state once the first reading is in (at once on the web). */
export function networkKnown(): Promise<boolean> {
  watch();
  return known ?? Promise.resolve(online);
}

/** Calls `cb` with every change of the network state; returns the unsubscribe. */
export function onNetworkChange(cb: (online: boolean) => void): () => void {
  watch();
  listeners.add(cb);
  return () => listeners.delete(cb);
}

export function onConnectionReturn(cb: () => void): () => void {
  return onNetworkChange((now) => (now ? cb() : undefined));
}

export function onConnectionLoss(cb: () => void): () => void {
  return onNetworkChange((now) => (now ? undefined : cb()));
}

/** The app in the foreground (`active`) or not: react-query's focus, and a moment to sync. */
export function onAppFocus(cb: (focused: boolean) => void): () => void {
  const sub = AppState.addEventListener('change', (s) => cb(s === 'active'));
  return () => sub.remove();
}
