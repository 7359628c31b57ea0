// Jest projects: shared (pure core), server (supertest against the real PostgreSQL that
// `npm test` starts), web (Angular components in jsdom) and e2e (Chromium against the built app).
const { createCjsPreset } = require('jest-preset-angular/presets');

const aliases = {
  '^@shared/(.*)$': '<rootDir>/shared/$1',
  '^@db/(.*)$': '<rootDir>/db/$1',
};

const nodeTransform = {
  '^.+\\.ts$': [
    'ts-jest',
    {
      tsconfig: {
        module: 'commonjs',
        moduleResolution: 'node10',
        target: 'ES2022',
        esModuleInterop: true,
        isolatedModules: true,
        strict: true,
        experimentalDecorators: true,
      },
    },
  ],
};

/** @type {import('jest').Config} */
module.exports = {
  projects: [
    {
      displayName: 'shared',
      testEnvironment: 'node',
      roots: ['<rootDir>/shared', '<rootDir>/tests/reference'],
      testMatch: ['**/*.spec.ts'],
      moduleNameMapper: aliases,
      transform: nodeTransform,
    },
    {
      displayName: 'server',
      testEnvironment: 'node',
      roots: ['<rootDir>/server', '<rootDir>/db', '<rootDir>/tests/api'],
      testMatch: ['**/*.spec.ts'],
      moduleNameMapper: aliases,
      transform: nodeTransform,
      setupFilesAfterEnv: ['<rootDir>/tests/api/support/jest-setup.ts'],
    },
    {
      displayName: 'web',
      ...createCjsPreset({ tsconfig: '<rootDir>/tsconfig.spec.json' }),
      testEnvironment: 'jest-preset-angular/environments/jest-jsdom-env',
      roots: ['<rootDir>/src'],
      testMatch: ['**/*.spec.ts'],
      setupFilesAfterEnv: ['<rootDir>/src/test-setup.ts'],
      moduleNameMapper: aliases,
      transformIgnorePatterns: ['node_modules/(?!.*\\.mjs$|echarts/|zrender/)'],
    },
    {
      displayName: 'e2e',
      testEnvironment: 'node',
      roots: ['<rootDir>/tests/e2e'],
      testMatch: ['**/*.e2e.ts'],
      moduleNameMapper: aliases,
      transform: nodeTransform,
      setupFilesAfterEnv: ['<rootDir>/tests/e2e/support/jest-setup.ts'],
    },
  ],
};
