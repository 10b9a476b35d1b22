// Metro config: the device database (expo-sqlite on web) loads a .wasm file from its worker,
// and the app bundles drizzle's generated device migrations (.sql).
const { getDefaultConfig } = require('expo/metro-config');

const config = getDefaultConfig(__dirname);
config.resolver.assetExts.push('wasm');
config.resolver.sourceExts.push('sql');

module.exports = config;
