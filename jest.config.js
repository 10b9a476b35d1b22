// Unit and server tests. Browser tests have their own config (jest.browser.config.js).
const alias = { '^@/(.*)$': '<rootDir>/$1' };

// d3 ships ES modules only; the app project takes their UMD builds (a feature's index.ts may bring a chart).
const d3 = ['array', 'color', 'format', 'interpolate', 'path', 'scale', 'shape', 'time', 'time-format'];
const d3Umd = Object.fromEntries(
  d3.map((p) => [`^d3-${p}$`, `<rootDir>/node_modules/d3-${p}/dist/d3-${p}.js`]),
);

module.exports = {
  // Server suites seed the demo (one bcrypt hash per demo user) in beforeAll; on a loaded 2-core machine
  // that has passed 5 s. Each test still fails on its own assertions; this only gives hooks room.
  testTimeout: 20_000,
  projects: [
    {
      displayName: 'app',
      preset: 'jest-expo',
      testMatch: ['<rootDir>/tests/app/**/*.test.ts?(x)'],
      moduleNameMapper: { ...alias, ...d3Umd },
      // jest-expo's own list, plus canonicalize (ES modules only; the phone signs with it).
      transformIgnorePatterns: [
        ...require('jest-expo/jest-preset').transformIgnorePatterns.map((p) =>
          p.startsWith('/node_modules/(?!(.pnpm|') ? p.replace('(?!(.pnpm|', '(?!(.pnpm|canonicalize|') : p,
        ),
      ],
    },
    {
      displayName: 'node',
      testEnvironment: 'node',
      testMatch: [
        '<rootDir>/tests/engine/**/*.test.ts',
        '<rootDir>/tests/device/**/*.test.ts',
        '<rootDir>/tests/server/**/*.test.ts',
        '<rootDir>/tests/lint/**/*.test.ts',
      ],
      moduleNameMapper: alias,
      // jose and canonicalize ship ES modules only; ts-jest (allowJs) turns them into CommonJS for the node project.
      transformIgnorePatterns: ['/node_modules/(?!(jose|canonicalize)/)'],
      transform: {
        '^.+\\.tsx?$': ['ts-jest', { tsconfig: '<rootDir>/tsconfig.server.json', diagnostics: false }],
        '/node_modules/(jose|canonicalize)/.+\\.js$': [
          'ts-jest',
          { tsconfig: '<rootDir>/tsconfig.server.json', diagnostics: false },
        ],
      },
    },
  ],
};
