/** Jest for every workspace: TypeScript through ts-jest (type-checked). */
module.exports = {
  testEnvironment: 'node',
  roots: ['<rootDir>/packages', '<rootDir>/tests', '<rootDir>/examples'],
  testMatch: ['**/?(*.)test.ts'],
  testPathIgnorePatterns: ['/node_modules/', '/dist/'],
  moduleNameMapper: { '^@scarpline/core$': '<rootDir>/packages/core/src/index.ts' },
  transform: { '^.+\\.ts$': ['ts-jest', { tsconfig: '<rootDir>/tsconfig.test.json' }] },
};
