import { forgetGlimpses } from '@/features/session/glimpse';
import { type StoredSession, parseStoredSession } from '@/features/session/stored-session';

// Web: localStorage, so a signed-in inspector can reload the app with no signal and keep working.
// See DEVELOPERS.md ("Where the session token lives") for why not a cookie or sessionStorage.
const KEY = 'pivotwatch.session';

export const tokenStore = {
  async get(): Promise<StoredSession | null> {
    try {
      return parseStoredSession(globalThis.localStorage?.getItem(KEY) ?? null);
    } catch {
      return null;
    }
  },
  async set(session: StoredSession): Promise<void> {
    globalThis.localStorage?.setItem(KEY, JSON.stringify(session));
  },
  /** Signing out (or a token the server refused): the session, and with it every person's glimpse. */
  async clear(): Promise<void> {
    globalThis.localStorage?.removeItem(KEY);
    forgetGlimpses();
  },
};
