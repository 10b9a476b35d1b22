/**
 * react-query follows the same network state as the banner and the sync: queries pause their retries
 * while offline and refetch when the connection returns (`onlineManager`), and refetch stale data when
 * the app comes back to the foreground or the page is shown again (`focusManager`). On the web react-query
 * would listen to the same browser events by itself; on a phone it hears nothing unless told.
 */
import { focusManager, onlineManager } from '@tanstack/react-query';

import { isOnline, onAppFocus, onNetworkChange } from '@/features/sync/network';

let wired = false;

/** Idempotent: `online-state.ts` calls it once as the signed-in code loads. */
export function wireQueryNetwork(): void {
  if (wired) return;
  wired = true;
  onlineManager.setEventListener((setOnline) => {
    setOnline(isOnline());
    return onNetworkChange(setOnline);
  });
  focusManager.setEventListener((handleFocus) => onAppFocus(handleFocus));
}
