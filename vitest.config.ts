import { defineConfig } from 'vitest/config';

// One vitest run covers every workspace: pure units (shared, web) and API integration tests
// against the real PostgreSQL started by api/scripts/test.mjs.
export default defineConfig({
  test: {
    projects: [
      { test: { name: 'shared', include: ['shared/src/**/*.test.ts'], environment: 'node' } },
      { test: { name: 'db', include: ['db/src/**/*.test.ts'], environment: 'node', testTimeout: 120_000, hookTimeout: 60_000 } },
      {
        test: {
          name: 'api',
          include: ['api/src/**/*.test.ts', 'api/test/**/*.test.ts'],
          environment: 'node',
          globalSetup: ['api/test/global-setup.ts'],
          testTimeout: 60_000,
          hookTimeout: 60_000,
          pool: 'forks',
        },
      },
      {
        extends: './web/vite.config.ts',
        test: { name: 'web', include: ['web/src/**/*.test.{ts,tsx}'], environment: 'happy-dom' },
      },
    ],
  },
});
