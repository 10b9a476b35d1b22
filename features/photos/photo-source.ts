import { useEffect, useState } from 'react';
import type { ImageURISource } from 'react-native';

import { API_BASE } from '@/features/api';
import { tokenStore } from '@/features/session';

export type PhotoSource = { source: ImageURISource | null; failed: boolean };

/**
 * A stored photo as an image source. Photos sit behind sign-in, so the request carries the session
 * token; native images take request headers directly (the web build fetches the bytes itself).
 */
export function usePhotoSource(sha256: string, enabled = true): PhotoSource {
  const [token, setToken] = useState<string | null>(null);
  useEffect(() => {
    let live = true;
    if (enabled)
      tokenStore.get().then(
        (s) => live && setToken(s?.token ?? ''),
        () => live && setToken(''),
      );
    return () => {
      live = false;
    };
  }, [enabled]);
  if (!enabled || token === null) return { source: null, failed: false };
  return {
    source: {
      uri: `${API_BASE}/api/photos/${sha256}`,
      headers: token ? { Authorization: `Bearer ${token}` } : undefined,
      cache: 'force-cache',
    },
    failed: false,
  };
}
