/**
 * A phone's app has no browser tab to name. (Expo Router's Head on iOS registers a Handoff activity
 * through a native module this app does not build, so it is not used there.)
 */
export function PageHead(_props: { title: string }) {
  return null;
}
