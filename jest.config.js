/** Jest for every workspace: TypeScript through ts-jest (type-checked). */
const { coreModuleNameMapper } = require('./packages/core/jest-map');
const { esOnlyTransform, esOnlyIgnore } = require('./packages/terrain/jest-esm');

module.exports = {
  testEnvironment: 'node',
  roots: ['<rootDir>/packages', '<rootDir>/tests', '<rootDir>/examples'],
  testMatch: ['**/?(*.)test.ts'],
  testPathIgnorePatterns: ['/node_modules/', '/dist/'],
  moduleNameMapper: coreModuleNameMapper('<rootDir>/packages/core'),
  transform: {
    '^.+\\.ts$': ['ts-jest', { tsconfig: '<rootDir>/tsconfig.json' }],
    ...esOnlyTransform,
  },
  transformIgnorePatterns: esOnlyIgnore,
};
