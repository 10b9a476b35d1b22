import * as SecureStore from 'expo-secure-store';

import { type StoredSession, parseStoredSession } from '@/features/session/stored-session';

// Native: the session lives in the platform keychain/keystore.
const KEY = 'pivotwatch.session';

export const tokenStore = {
  async get(): Promise<StoredSession | null> {
    return parseStoredSession(await SecureStore.getItemAsync(KEY));
  },
  async set(session: StoredSession): Promise<void> {
    await SecureStore.setItemAsync(KEY, JSON.stringify(session));
  },
  async clear(): Promise<void> {
    await SecureStore.deleteItemAsync(KEY);
  },
};
