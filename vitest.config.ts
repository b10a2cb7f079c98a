import { defineConfig } from 'vitest/config';
import { fileURLToPath } from 'node:url';

const alias = {
  '@': fileURLToPath(new URL('./src', import.meta.url)),
  '@server': fileURLToPath(new URL('./server', import.meta.url)),
  '@shared': fileURLToPath(new URL('./shared', import.meta.url)),
};

// Two projects: node for shared/ and server/, jsdom for the client's components.
export default defineConfig({
  resolve: { alias },
  test: {
    projects: [
      // Generous limits: every server test file seeds the demo scenario, and CI has two cores.
      { resolve: { alias }, test: { name: 'node', environment: 'node', include: ['tests/shared/**/*.test.ts', 'tests/server/**/*.test.ts', 'tests/architecture/**/*.test.ts'], testTimeout: 30_000, hookTimeout: 60_000 } },
      { resolve: { alias }, test: { name: 'client', environment: 'jsdom', include: ['tests/client/**/*.test.{ts,tsx}'], testTimeout: 15_000 } },
    ],
  },
});
