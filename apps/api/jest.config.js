/** Jest for @scarpline/api: real PostgreSQL (the local cluster's test database), ts-jest. */
module.exports = {
  rootDir: __dirname,
  testEnvironment: 'node',
  roots: ['<rootDir>/test'],
  testMatch: ['**/?(*.)test.ts'],
  globalSetup: '<rootDir>/test/global-setup.ts',
  globalTeardown: '<rootDir>/test/global-teardown.ts',
  moduleNameMapper: { '^@scarpline/core$': '<rootDir>/../../packages/core/src/index.ts' },
  transform: { '^.+\\.ts$': ['ts-jest', { tsconfig: '<rootDir>/tsconfig.test.json' }] },
  testTimeout: 60000,
};
