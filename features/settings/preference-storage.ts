// Native: small preferences live in memory for the session (the keystore is for secrets).
const memory = new Map<string, string>();

export const preferenceStorage = {
  get: (key: string): string | null => memory.get(key) ?? null,
  set: (key: string, value: string) => void memory.set(key, value),
};
