// Browser tests: the real server and the real web export, driven through Debian's chromium.
module.exports = {
  displayName: 'browser',
  testEnvironment: 'node',
  testMatch: ['<rootDir>/tests/browser/**/*.test.ts'],
  // The accessibility sweep (axe-core over every screen, both sizes and themes) still finds serious
  // violations the app has not fixed yet (issue #17, item 11); it runs with `npm run test:a11y` and joins
  // `npm test` once it passes.
  testPathIgnorePatterns:
    process.env.PW_A11Y === '1' ? [] : ['<rootDir>/tests/browser/accessibility.test.ts'],
  moduleNameMapper: { '^@/(.*)$': '<rootDir>/$1' },
  transform: {
    '^.+\\.tsx?$': ['ts-jest', { tsconfig: '<rootDir>/tsconfig.server.json', diagnostics: false }],
  },
  globalSetup: '<rootDir>/tests/browser/global-setup.ts',
  testTimeout: 120000,
  // One server and one browser per file; two cores are shared with the server under test.
  maxWorkers: 1,
  // playwright keeps a socket to the browser process for a moment after close(); don't wait on it.
  forceExit: true,
};
