// What an exported (production) app bundle gets for `expo/devtools` (metro.config.js). expo-sqlite requires
// it only under `__DEV__`, yet Metro bundles what `require` names: 15 KB of a dev-tools client that a
// production build never runs.
export function getDevToolsPluginClientAsync() {
  return Promise.reject(new Error('Dev tools are not part of an exported build.'));
}
