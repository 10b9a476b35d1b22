import { useSyncExternalStore } from 'react';

import { preferenceStorage } from '@/features/settings/preference-storage';

/**
 * Whether new photos keep where they were taken. Off unless the inspector turns it on; the choice is kept
 * on this device (the browser's storage; on native for the session). Off means no place is kept at all,
 * not even the camera's own GPS.
 */
const KEY = 'pivotwatch.photoPlace';
const listeners = new Set<() => void>();
let current = preferenceStorage.get(KEY) === 'on';

export function setPhotoPlaceAllowed(allowed: boolean) {
  current = allowed;
  preferenceStorage.set(KEY, allowed ? 'on' : 'off');
  listeners.forEach((l) => l());
}

export const photoPlaceAllowed = () => current;

export function usePhotoPlaceAllowed(): [boolean, (allowed: boolean) => void] {
  const allowed = useSyncExternalStore(
    (l) => {
      listeners.add(l);
      return () => listeners.delete(l);
    },
    () => current,
    () => current,
  );
  return [allowed, setPhotoPlaceAllowed];
}
