/**
 * Whether the app is online, as the "No connection" banner shows it: the platform's network state
 * (`network.ts`: expo-network on a phone, the browser's online/offline events on the web) and, since a
 * network can be up while the server cannot be reached, what the last request found. When the network
 * comes back, the banner goes at once; the next request that fails brings it back.
 */
import { useSyncExternalStore } from 'react';

import { isOnline, onConnectionLoss, onConnectionReturn } from '@/features/sync/network';
import { wireQueryNetwork } from '@/features/sync/query-network';
import { onReachabilityChange, reportServerReached, serverReached } from '@/features/api';

// Every signed-in page shows the connection (the shell's banner), so this module loads with the signed-in
// code: from then on react-query's online and focus managers follow the same network state.
wireQueryNetwork();

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
