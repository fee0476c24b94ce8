import react from '@vitejs/plugin-react';
import { VitePWA } from 'vite-plugin-pwa';
import { defineConfig } from 'vitest/config';

const apiPort = process.env.PORT ?? '5180';

export default defineConfig({
  plugins: [
    react(),
    VitePWA({
      injectRegister: null,
      registerType: 'autoUpdate',
      manifest: {
        name: 'Crownwatch',
        short_name: 'Crownwatch',
        description: 'Camber record and early warning for precast prestressed concrete',
        theme_color: '#2b2a27',
        background_color: '#f5f5f3',
        display: 'standalone',
        start_url: '/yard',
        icons: [],
      },
      workbox: {
        globPatterns: ['**/*.{js,css,html,woff,woff2,wasm,svg}'],
        maximumFileSizeToCacheInBytes: 4 * 1024 * 1024,
        navigateFallback: '/index.html',
        navigateFallbackDenylist: [/^\/api\//],
        cleanupOutdatedCaches: true,
      },
    }),
  ],
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
