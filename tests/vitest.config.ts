import { defineConfig } from 'vitest/config';
import { fileURLToPath } from 'node:url';

const root = fileURLToPath(new URL('../', import.meta.url));
const resolve = {
  alias: {
    '@': root,
    // `server-only` throws outside React Server Components; tests run server code directly.
    'server-only': fileURLToPath(new URL('./support/server-only.mock.ts', import.meta.url)),
  },
};

export default defineConfig({
  resolve,
  root,
  test: {
    testTimeout: 60_000,
    hookTimeout: 120_000,
    pool: 'forks',
    projects: [
      // Unit tests and HTTP integration tests against the running test server.
      { resolve, test: { name: 'fast', root, include: ['tests/unit/**/*.test.ts', 'tests/integration/**/*.test.ts'], exclude: ['tests/integration/faults/**'], testTimeout: 120_000, hookTimeout: 120_000, pool: 'forks' } },
      // Browser tests share one server and one Chromium at a time.
      // Fault drills stop and break shared services, so they run alone, after everything else.
      { resolve, test: { name: 'faults', root, include: ['tests/integration/faults/**/*.test.ts'], testTimeout: 180_000, hookTimeout: 120_000, pool: 'forks', fileParallelism: false } },
      { resolve, test: { name: 'browser', root, include: ['tests/e2e/**/*.test.ts'], testTimeout: 180_000, hookTimeout: 120_000, pool: 'forks', fileParallelism: false } },
    ],
  },
});
