/**
 * expo-network's native side as jest-expo mocks it (the `ExpoNetwork` native module expo-network holds:
 * jest-expo's NativeModule whose methods are jest.fn()s),
 * given a phone's answers, and React Native's AppState listeners captured. Import it before any app module
 * that reads the network: `features/sync/online-state.ts` starts listening as it loads. The library's own
 * JavaScript (`addNetworkStateListener`, `getNetworkStateAsync`) runs as in the app.
 */
import { act } from '@testing-library/react-native';
import { NetworkStateType } from 'expo-network';
import ExpoNetwork from 'expo-network/build/ExpoNetwork';
import { AppState } from 'react-native';

export type PhoneNetworkState = { type?: string; isConnected?: boolean; isInternetReachable?: boolean };
export const wifi: PhoneNetworkState = {
  type: NetworkStateType.WIFI,
  isConnected: true,
  isInternetReachable: true,
};
export const noNetwork: PhoneNetworkState = {
  type: NetworkStateType.NONE,
  isConnected: false,
  isInternetReachable: false,
};

const native = ExpoNetwork as unknown as { getNetworkStateAsync: jest.Mock; addListener: jest.Mock };
let current = wifi;
const networkListeners: ((s: PhoneNetworkState) => void)[] = [];
native.getNetworkStateAsync.mockImplementation(async () => current);
native.addListener.mockImplementation((event: string, cb: (s: PhoneNetworkState) => void) => {
  if (event === 'onNetworkStateChanged') networkListeners.push(cb);
  return { remove: () => undefined };
});

const appStateListeners: ((s: string) => void)[] = [];
jest.spyOn(AppState, 'addEventListener').mockImplementation((_type, cb) => {
  appStateListeners.push(cb as (s: string) => void);
  return { remove: () => undefined } as ReturnType<typeof AppState.addEventListener>;
});

/** How many listeners the app has on the phone's network events. */
export const networkListenerCount = () => networkListeners.length;

/** The phone's system reports a new network state (and answers with it from now on). */
export function networkBecomes(s: PhoneNetworkState): void {
  current = s;
  act(() => networkListeners.forEach((l) => l(s)));
}

/** The app goes to the background ('background') or comes back ('active'). */
export function appStateBecomes(s: 'active' | 'background'): void {
  act(() => appStateListeners.forEach((l) => l(s)));
}
