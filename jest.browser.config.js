// Browser tests: the real server and the real web export, driven through Debian's chromium.
module.exports = {
  displayName: 'browser',
  testEnvironment: 'node',
  testMatch: ['<rootDir>/tests/browser/**/*.test.ts'],
  moduleNameMapper: { '^@/(.*)$': '<rootDir>/$1' },
  // canonicalize ships ES modules only (tests sign pushes as a phone does); ts-jest turns it into CommonJS.
  transformIgnorePatterns: ['/node_modules/(?!canonicalize/)'],
  transform: {
    '^.+\\.tsx?$': ['ts-jest', { tsconfig: '<rootDir>/tsconfig.server.json', diagnostics: false }],
    '/node_modules/canonicalize/.+\\.js$': [
      'ts-jest',
      { tsconfig: '<rootDir>/tsconfig.server.json', diagnostics: false },
    ],
  },
  globalSetup: '<rootDir>/tests/browser/global-setup.ts',
  testTimeout: 120000,
  // One server and one browser per file; two cores are shared with the server under test.
  maxWorkers: 1,
  // playwright keeps a socket to the browser process for a moment after close(); don't wait on it.
  forceExit: true,
};
