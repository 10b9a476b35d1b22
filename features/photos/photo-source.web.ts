import { useEffect, useState } from 'react';
import type { ImageURISource } from 'react-native';

import { API_BASE } from '@/features/api';
import { tokenStore } from '@/features/session';

export type PhotoSource = { source: ImageURISource | null; failed: boolean };

/**
 * Object URLs of photos already fetched, oldest first. A photo's address is its content's hash, so a URL
 * never goes stale. The oldest are let go only beyond what one inspection can hold (100 photos), so a URL
 * is never revoked while its own gallery still shows it.
 */
const KEEP = 128;
const cache = new Map<string, Promise<string>>();

function remember(sha256: string, url: Promise<string>) {
  cache.set(sha256, url);
  while (cache.size > KEEP) {
    const [oldest, pending] = cache.entries().next().value as [string, Promise<string>];
    cache.delete(oldest);
    pending.then((u) => URL.revokeObjectURL(u)).catch(() => undefined);
  }
}

async function fetchObjectUrl(sha256: string): Promise<string> {
  const session = await tokenStore.get();
  const res = await fetch(`${API_BASE}/api/photos/${sha256}`, {
    headers: session ? { Authorization: `Bearer ${session.token}` } : {},
  });
  if (!res.ok) throw new Error(`Photo request failed (${res.status})`);
  return URL.createObjectURL(await res.blob());
}

/**
 * A stored photo as an image source. An <img> cannot send the session token, so the bytes are fetched
 * with it and shown from an object URL (the page's CSP allows blob: images).
 */
export function usePhotoSource(sha256: string, enabled = true): PhotoSource {
  const [state, setState] = useState<{ sha: string; url: string | null; failed: boolean }>({
    sha: sha256,
    url: null,
    failed: false,
  });
  useEffect(() => {
    if (!enabled) return;
    let live = true;
    let pending = cache.get(sha256);
    if (!pending) {
      pending = fetchObjectUrl(sha256);
      remember(sha256, pending);
      // A failed fetch is not kept, so the next view tries again.
      pending.catch(() => cache.get(sha256) === pending && cache.delete(sha256));
    }
    pending.then(
      (url) => live && setState({ sha: sha256, url, failed: false }),
      () => live && setState({ sha: sha256, url: null, failed: true }),
    );
    return () => {
      live = false;
    };
  }, [sha256, enabled]);
  const current = state.sha === sha256 ? state : { url: null, failed: false };
  return { source: current.url ? { uri: current.url } : null, failed: current.failed };
}
