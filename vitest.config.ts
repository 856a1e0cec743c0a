import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vitest/config';

const shared = fileURLToPath(new URL('./shared', import.meta.url));

export default defineConfig({
  resolve: { alias: { '@shared': shared } },
  test: {
    projects: [
      {
        resolve: { alias: { '@shared': shared } },
        test: { name: 'shared', include: ['shared/**/*.test.ts', 'tools/**/*.test.ts'], environment: 'node' },
      },
      {
        resolve: { alias: { '@shared': shared } },
        test: {
          name: 'api',
          include: ['api/**/*.test.ts', 'test/integration/**/*.test.ts'],
          environment: 'node',
          fileParallelism: false,
          globalSetup: ['test/support/global-setup.ts'],
          testTimeout: 20000,
          hookTimeout: 30000,
        },
      },
      {
        resolve: { alias: { '@shared': shared } },
        test: {
          name: 'e2e',
          include: ['test/e2e/**/*.e2e.ts'],
          environment: 'node',
          fileParallelism: false,
          globalSetup: ['test/e2e/global-setup.ts'],
          testTimeout: 60000,
          hookTimeout: 120000,
        },
      },
    ],
  },
});
