/**
 * On a phone, without a network-state library: assume online and let each request find out; the app
 * coming back to the foreground stands in for "the connection may be back".
 */
import { AppState } from 'react-native';

export function isOnline(): boolean {
  return true;
}

export function onConnectionReturn(cb: () => void): () => void {
  const sub = AppState.addEventListener('change', (state) => {
    if (state === 'active') cb();
  });
  return () => sub.remove();
}

export function onConnectionLoss(_cb: () => void): () => void {
  return () => {};
}
