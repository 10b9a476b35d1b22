// Flat config: Expo's recommended rules, with prettier handling formatting separately.
const { defineConfig } = require('eslint/config');
const expoConfig = require('eslint-config-expo/flat');

module.exports = defineConfig([
  expoConfig,
  {
    ignores: ['dist/*', 'data/*', 'artifacts/*', 'coverage/*', 'drizzle/*', '.expo/*'],
  },
]);
