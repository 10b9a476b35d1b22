/** A phone's bundle is one file: nothing is shared between chunks (see load-shared.web.ts). */
export function loadShared(): Promise<void> {
  return Promise.resolve();
}

/** Nothing to load ahead: the whole app is in the bundle. */
export function backgroundMoment(): Promise<boolean> {
  return Promise.resolve(false);
}
