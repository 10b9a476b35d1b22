// Web: small preferences persist in localStorage, so they survive reloads offline.
export const preferenceStorage = {
  get: (key: string): string | null => {
    try {
      return globalThis.localStorage?.getItem(key) ?? null;
    } catch {
      return null;
    }
  },
  set: (key: string, value: string) => {
    try {
      globalThis.localStorage?.setItem(key, value);
    } catch {
      // Storage full or blocked: the choice lasts for this session only.
    }
  },
};
