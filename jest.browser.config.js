// Browser tests: playwright-core driving the system's Chromium against a running server
// at BASE_URL (scripts/test.sh starts one with demo data). One file at a time, slowly.
/** @type {import('jest').Config} */
module.exports = {
  displayName: 'browser',
  testEnvironment: 'node',
  transform: {
    '^.+\\.ts$': [
      'ts-jest',
      {
        tsconfig: 'tsconfig.server.json',
        diagnostics: { warnOnly: false },
      },
    ],
  },
  testMatch: ['<rootDir>/test/browser/**/*.e2e.ts'],
  testTimeout: 120000,
  maxWorkers: 1,
};
