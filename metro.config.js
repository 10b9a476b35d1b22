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

// drizzle-orm's SQL builder and relations import two PostgreSQL modules that pull in all of pg-core;
// small stand-ins (metro/drizzle-pg-*.js) answer the same two questions.
const drizzleStandIns = [
  [/[\\/]node_modules[\\/]drizzle-orm[\\/]pg-core[\\/]columns[\\/]enum\.js$/, 'drizzle-pg-enum.js'],
  [/[\\/]node_modules[\\/]drizzle-orm[\\/]pg-core[\\/]primary-keys\.js$/, 'drizzle-pg-primary-keys.js'],
];
// `expo export` (production): expo-sqlite's dev-tools client is required under __DEV__ only.
const expoDevtools = /[\\/]node_modules[\\/]expo[\\/]devtools\.js$/;
const production = process.env.NODE_ENV === 'production';

const standIn = (file) => ({ type: 'sourceFile', filePath: path.join(__dirname, 'metro', file) });

config.resolver.resolveRequest = (context, moduleName, platform) => {
  const resolved = context.resolveRequest(context, moduleName, platform);
  if (resolved.type !== 'sourceFile') return resolved;
  if (zodLocales.test(resolved.filePath)) return { type: 'sourceFile', filePath: zodEnglishOnly };
  for (const [pattern, file] of drizzleStandIns) if (pattern.test(resolved.filePath)) return standIn(file);
  if (production && expoDevtools.test(resolved.filePath)) return standIn('expo-devtools.js');
  return resolved;
};

module.exports = config;
