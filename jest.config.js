/** @type {import('jest').Config} */
const swc = [
  '@swc/jest',
  {
    jsc: {
      parser: { syntax: 'typescript', tsx: true },
      transform: { react: { runtime: 'automatic' } },
    },
  },
];

const nodeProject = (name) => ({
  displayName: name,
  testEnvironment: 'node',
  testMatch: [`<rootDir>/tests/${name}/**/*.test.ts`],
  transform: { '^.+\\.(t|j)sx?$': swc },
  moduleNameMapper: { '^@/(.*)$': '<rootDir>/$1' },
});

module.exports = {
  globalSetup: '<rootDir>/tests/setup/global-setup.ts',
  globalTeardown: '<rootDir>/tests/setup/global-teardown.ts',
  maxWorkers: 2,
  testTimeout: 30_000,
  projects: [nodeProject('unit'), nodeProject('api'), nodeProject('e2e')],
};
