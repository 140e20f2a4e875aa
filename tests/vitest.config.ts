import { defineConfig } from 'vitest/config';
import { fileURLToPath } from 'node:url';

export default defineConfig({
  resolve: {
    alias: {
      '@': fileURLToPath(new URL('../', import.meta.url)),
      // `server-only` throws outside React Server Components; tests run server code directly.
      'server-only': fileURLToPath(new URL('./support/server-only.mock.ts', import.meta.url)),
    },
  },
  root: fileURLToPath(new URL('../', import.meta.url)),
  test: {
    include: ['tests/**/*.test.ts'],
    testTimeout: 60_000,
    hookTimeout: 120_000,
    pool: 'forks',
  },
});
