import { resolve } from 'node:path';
import { defineConfig } from 'vitest/config';

// The fault suite (`npm run test:faults`): each file makes and breaks its own PostgreSQL cluster or
// server process, so the files run one after the other.
export default defineConfig({
  root: resolve(import.meta.dirname, '../..'),
  test: {
    include: ['tests/faults/**/*.fault.ts'],
    environment: 'node',
    fileParallelism: false,
    testTimeout: 180_000,
    hookTimeout: 120_000,
  },
});
