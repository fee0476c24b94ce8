import react from '@vitejs/plugin-react';
import { defineConfig } from 'vitest/config';

const apiPort = process.env.PORT ?? '5180';

export default defineConfig({
  plugins: [react()],
  build: { outDir: '.build/client', emptyOutDir: true, sourcemap: true },
  server: { port: 5173, host: '127.0.0.1', proxy: { '/api': `http://127.0.0.1:${apiPort}` } },
  test: {
    include: ['tests/**/*.test.ts'],
    environment: 'node',
    globalSetup: ['tests/setup/global-setup.ts'],
    testTimeout: 30_000,
    hookTimeout: 60_000,
  },
});
