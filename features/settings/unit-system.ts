import { useSyncExternalStore } from 'react';

import type { UnitSystem } from '@/lib/units';
import { preferenceStorage } from '@/features/settings/preference-storage';

/**
 * The person's choice of SI or US customary units for what the app shows. Stored on the device;
 * values are always stored and sent in SI.
 */
const KEY = 'pivotwatch.units';
const listeners = new Set<() => void>();
let current: UnitSystem = preferenceStorage.get(KEY) === 'us' ? 'us' : 'si';

export function setUnitSystem(system: UnitSystem) {
  current = system;
  preferenceStorage.set(KEY, system);
  listeners.forEach((l) => l());
}

export function useUnitSystem(): [UnitSystem, (s: UnitSystem) => void] {
  const system = useSyncExternalStore(
    (l) => {
      listeners.add(l);
      return () => listeners.delete(l);
    },
    () => current,
    () => current,
  );
  return [system, setUnitSystem];
}
