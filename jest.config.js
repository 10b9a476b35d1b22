// Unit and server tests. Browser tests have their own config (jest.browser.config.js).
const alias = { '^@/(.*)$': '<rootDir>/$1' };

module.exports = {
  projects: [
    {
      displayName: 'app',
      preset: 'jest-expo',
      testMatch: ['<rootDir>/tests/app/**/*.test.ts?(x)'],
      moduleNameMapper: alias,
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
      // jose ships ES modules only; ts-jest (allowJs) turns it into CommonJS for the node project.
      transformIgnorePatterns: ['/node_modules/(?!jose/)'],
      transform: {
        '^.+\\.tsx?$': ['ts-jest', { tsconfig: '<rootDir>/tsconfig.server.json', diagnostics: false }],
        '/node_modules/jose/.+\\.js$': [
          'ts-jest',
          { tsconfig: '<rootDir>/tsconfig.server.json', diagnostics: false },
        ],
      },
    },
  ],
};
