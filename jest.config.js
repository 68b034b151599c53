// Unit and API tests. Browser tests have their own config (jest.browser.config.js).
const tsJest = ['ts-jest', { tsconfig: 'tsconfig.server.json', diagnostics: { warnOnly: false } }];

/** @type {import('jest').Config} */
module.exports = {
  // API tests set up a PostgreSQL schema and migrations in beforeAll; on a loaded 2-core
  // machine that can take longer than jest's default 5 s for a hook.
  testTimeout: 30000,
  projects: [
    {
      displayName: 'engine',
      testEnvironment: 'node',
      transform: { '^.+\\.ts$': tsJest },
      testMatch: ['<rootDir>/shared/**/*.spec.ts', '<rootDir>/test/engine/**/*.test.ts'],
    },
    {
      displayName: 'server',
      testEnvironment: 'node',
      transform: { '^.+\\.ts$': tsJest },
      setupFilesAfterEnv: ['<rootDir>/test/api/support/fail-on-console.ts'],
      testMatch: ['<rootDir>/server/**/*.spec.ts', '<rootDir>/test/api/**/*.test.ts'],
    },
    {
      displayName: 'client',
      preset: 'jest-preset-angular',
      testEnvironment: 'jest-preset-angular/environments/jest-jsdom-env',
      setupFilesAfterEnv: ['<rootDir>/src/test-setup.ts'],
      testMatch: ['<rootDir>/src/**/*.spec.ts'],
      transform: {
        '^.+\\.(ts|mjs|js|html)$': [
          'jest-preset-angular',
          { tsconfig: '<rootDir>/tsconfig.spec.json', stringifyContentPathRegex: '\\.(html|svg)$' },
        ],
      },
      transformIgnorePatterns: ['node_modules/(?!.*\\.mjs$)'],
    },
  ],
};
