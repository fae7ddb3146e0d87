import { defineConfig } from 'vitest/config';
import path from 'node:path';

/**
 * The durability tests (tests/durability): they start the production build with `next start`,
 * so they run after `next build` (scripts/test.sh), one file at a time, never with the unit suite.
 */
export default defineConfig({
  resolve: { alias: { '@': path.resolve(import.meta.dirname) } },
  test: {
    environment: 'node',
    include: ['tests/durability/**/*.test.ts'],
    fileParallelism: false,
    testTimeout: 900_000,
    hookTimeout: 600_000,
  },
});
