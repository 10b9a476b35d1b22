// Metro config: the device database (expo-sqlite on web) loads a .wasm file from its worker, the web
// fonts are WOFF2 assets (scripts/build-fonts.ts),
// and the app bundles drizzle's generated device migrations (.sql).
const { getDefaultConfig } = require('expo/metro-config');

const config = getDefaultConfig(__dirname);
config.resolver.assetExts.push('wasm', 'woff2');
config.resolver.sourceExts.push('sql');

module.exports = config;
