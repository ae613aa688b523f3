import { defineConfig } from 'vitest/config';
import { fileURLToPath } from 'node:url';

export default defineConfig({
  resolve: {
    alias: {
      '@': fileURLToPath(new URL('./src', import.meta.url)),
      '@shared': fileURLToPath(new URL('./shared', import.meta.url)),
    },
  },
  test: {
    include: ['tests/unit/**/*.test.ts', 'tests/unit/**/*.test.tsx', 'tests/api/**/*.test.ts'],
    pool: 'forks',
    maxWorkers: 2,
    testTimeout: 20000,
    // a harness seeds the demo through the upload parse workers; a fresh worker thread takes a second or more to load on a busy machine
    hookTimeout: 60000,
  },
});
