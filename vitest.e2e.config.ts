import { defineConfig } from 'vitest/config';
import { fileURLToPath } from 'node:url';

// Real-browser tests: each file starts the built app on a free port with a fresh database.
export default defineConfig({
  resolve: {
    alias: {
      '@': fileURLToPath(new URL('./src', import.meta.url)),
      '@server': fileURLToPath(new URL('./server', import.meta.url)),
      '@shared': fileURLToPath(new URL('./shared', import.meta.url)),
    },
  },
  test: {
    include: ['tests/e2e/**/*.e2e.ts'],
    environment: 'node',
    testTimeout: 120_000,
    hookTimeout: 150_000,
    fileParallelism: false,
  },
});
