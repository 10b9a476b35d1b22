/**
 * Whether the app is online, as the "No connection" banner shows it: the platform's network state (the
 * browser's online/offline events) and, since a network can be up while the server cannot be reached
 * (and a phone has no network events without a library), what the last request found. When the network
 * comes back, the banner goes at once; the next request that fails brings it back.
 */
import { useSyncExternalStore } from 'react';

import { isOnline, onConnectionLoss, onConnectionReturn } from '@/features/sync/connectivity';
import { onReachabilityChange, reportServerReached, serverReached } from '@/features/api';

function onlineNow(): boolean {
  return isOnline() && serverReached();
}

function subscribe(listener: () => void): () => void {
  const offReturn = onConnectionReturn(() => {
    // A request that failed while the network was down says nothing about now.
    reportServerReached(true);
    listener();
  });
  const offLoss = onConnectionLoss(listener);
  const offReach = onReachabilityChange(listener);
  return () => {
    offReturn();
    offLoss();
    offReach();
  };
}

export function useOnline(): boolean {
  return useSyncExternalStore(subscribe, onlineNow, onlineNow);
}
