// Flat config: Expo's recommended rules, with prettier handling formatting separately, plus the import
// rules that keep the layers pointing one way (DEVELOPERS.md, "Layers"). The zones come from
// lint/layers.js, which a test also reads to prove that a planted violation fails.
const { defineConfig } = require('eslint/config');
const expoConfig = require('eslint-config-expo/flat');

const { layerZones } = require('./lint/layers');

module.exports = defineConfig([
  expoConfig,
  {
    ignores: [
      'dist/*',
      'data/*',
      'artifacts/*',
      'coverage/*',
      'drizzle/*',
      '.expo/*',
      'tests/lint-fixtures/*',
    ],
  },
  {
    // Config files run in node (CommonJS).
    files: ['eslint.config.js', 'lint/**/*.js'],
    languageOptions: { globals: require('globals').node },
  },
  {
    settings: {
      // Resolves the `@/…` alias through tsconfig.json, so the import rules see where each import goes.
      'import/resolver': {
        typescript: { project: './tsconfig.json' },
        node: { extensions: ['.js', '.jsx', '.ts', '.tsx', '.web.ts', '.web.tsx', '.d.ts'] },
      },
    },
    rules: {
      'import/no-cycle': ['error', { ignoreExternal: true }],
      'import/no-restricted-paths': ['error', { zones: layerZones(__dirname) }],
    },
  },
  {
    // Icons come from components/feather-icon (the glyphs in use, subset for the web); the whole Feather
    // set would bring its full font back. The typescript-eslint rule leaves core no-restricted-imports free.
    files: ['**/*.ts', '**/*.tsx'],
    ignores: ['components/app-fonts.ts'],
    rules: {
      '@typescript-eslint/no-restricted-imports': [
        'error',
        {
          paths: [
            {
              name: '@expo/vector-icons/Feather',
              message:
                "Use Feather from '@/components/feather-icon' (icons in use only; see scripts/build-fonts.ts).",
            },
          ],
        },
      ],
    },
  },
  {
    // mathjs is a build-time tool: unit factors are generated from it (scripts/gen-unit-factors.ts), so
    // the web bundle and the server never carry it.
    files: ['**/*.{js,jsx,ts,tsx}'],
    ignores: ['scripts/**', 'tests/**', 'bench/**'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          paths: [{ name: 'mathjs', message: 'Use lib/units.ts (factors generated at build time).' }],
          patterns: [{ group: ['mathjs/*'], message: 'Use lib/units.ts (factors generated at build time).' }],
        },
      ],
    },
  },
]);
