// Metro config: the device database (expo-sqlite on web) loads a .wasm file from its worker, the web
// fonts are WOFF2 assets (scripts/build-fonts.ts),
// and the app bundles drizzle's generated device migrations (.sql).
const path = require('path');
const { getDefaultConfig } = require('expo/metro-config');

const config = getDefaultConfig(__dirname);
config.resolver.assetExts.push('wasm', 'woff2');
config.resolver.sourceExts.push('sql');

// zod re-exports every locale it ships as `z.locales`; Metro does not tree-shake, so each would sit in the
// entry bundle. English only (metro/zod-locales.js) — the language zod uses unless told otherwise.
const zodLocales = /[\\/]node_modules[\\/]zod[\\/]v4[\\/]locales[\\/]index\.c?js$/;
const zodEnglishOnly = path.join(__dirname, 'metro', 'zod-locales.js');
config.resolver.resolveRequest = (context, moduleName, platform) => {
  const resolved = context.resolveRequest(context, moduleName, platform);
  if (resolved.type === 'sourceFile' && zodLocales.test(resolved.filePath)) {
    return { type: 'sourceFile', filePath: zodEnglishOnly };
  }
  return resolved;
};

module.exports = config;
