import { defineConfig } from 'vitest/config';

const root = import.meta.dirname;
const resolve = {
  alias: {
    '@': root,
    // react-native ships Flow sources; tests render through react-native-web instead.
    'react-native': 'react-native-web',
  },
};

export default defineConfig({
  resolve,
  test: {
    projects: [
      { resolve, test: { name: 'shared', include: ['test/shared/**/*.test.ts'], environment: 'node' } },
      {
        resolve,
        test: {
          name: 'server',
          include: ['test/server/**/*.test.ts'],
          environment: 'node',
          globalSetup: ['test/support/global-setup.ts'],
          testTimeout: 30_000,
          hookTimeout: 60_000,
        },
      },
      {
        resolve,
        test: {
          name: 'e2e',
          include: ['test/e2e/**/*.test.ts'],
          environment: 'node',
          globalSetup: ['test/support/global-setup.ts', 'test/e2e/e2e-setup.ts'],
          testTimeout: 60_000,
          hookTimeout: 120_000,
          fileParallelism: false,
        },
      },
    ],
  },
});
