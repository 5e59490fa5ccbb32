import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vitest/config';

const alias = {
  '@': fileURLToPath(new URL('./src', import.meta.url)),
  '@server': fileURLToPath(new URL('./server', import.meta.url)),
  '@shared': fileURLToPath(new URL('./shared', import.meta.url)),
};

// The S3 SDK warns once per process that its releases from 2027 on need Node 22;
// the pinned release runs on Node 20, and the warning would open every test file's output.
const AWS_SDK_QUIET = { AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED: 'true' };

// One run, three projects: pure unit tests, API tests over HTTP against a real
// PostgreSQL, and browser end-to-end tests. The database projects share one
// throwaway cluster started by tests/global-setup.ts.
export default defineConfig({
  resolve: { alias },
  test: {
    reporters: ['default', 'json'],
    outputFile: { json: 'test-output/results.json' },
    projects: [
      {
        resolve: { alias },
        test: {
          name: 'unit',
          include: ['tests/shared/**/*.test.ts', 'tests/client/**/*.test.ts', 'tests/scripts/**/*.test.ts'],
          exclude: ['**/*.process.test.ts', '**/node_modules/**'],
          environment: 'node',
          // Bounds, not goals: on a busy 2-core machine a 4-hour simulated ride takes seconds.
          testTimeout: 60_000,
          hookTimeout: 60_000,
        },
      },
      {
        resolve: { alias },
        test: {
          name: 'api',
          // *.process.test.ts start real Crosswatt processes (with their own PostgreSQL) and signal them.
          include: ['tests/server/**/*.test.ts', 'tests/scripts/**/*.process.test.ts'],
          globalSetup: ['tests/global-setup.ts'],
          env: AWS_SDK_QUIET,
          setupFiles: ['tests/server/setup-database.ts'],
          testTimeout: 30_000,
          hookTimeout: 60_000,
        },
      },
      {
        resolve: { alias },
        test: {
          name: 'e2e',
          include: ['tests/e2e/**/*.test.ts'],
          globalSetup: ['tests/e2e/support/ensure-chromium.ts', 'tests/global-setup.ts'],
          env: AWS_SDK_QUIET,
          setupFiles: ['tests/server/setup-database.ts'],
          testTimeout: 90_000,
          hookTimeout: 90_000,
          fileParallelism: false,
        },
      },
    ],
  },
});
