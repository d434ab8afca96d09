/** Jest for @scarpline/api: real PostgreSQL (the local cluster's test database), ts-jest. */
const { coreModuleNameMapper } = require('../../packages/core/jest-map');

module.exports = {
  rootDir: __dirname,
  testEnvironment: 'node',
  roots: ['<rootDir>/test'],
  testMatch: ['**/?(*.)test.ts'],
  globalSetup: '<rootDir>/test/global-setup.ts',
  globalTeardown: '<rootDir>/test/global-teardown.ts',
  moduleNameMapper: coreModuleNameMapper('<rootDir>/../../packages/core'),
  transform: { '^.+\\.ts$': ['ts-jest', { tsconfig: '<rootDir>/test/tsconfig.json' }] },
  testTimeout: 60000,
};
