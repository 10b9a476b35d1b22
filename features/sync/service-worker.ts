/** Native builds update through the stores (or expo-updates); there is no service worker. */
export function registerServiceWorker(_onUpdate?: () => void): void {}

export function applyUpdate(): void {}

export function useAppUpdate(): { updateReady: boolean; applyUpdate: () => void } {
  return { updateReady: false, applyUpdate };
}
