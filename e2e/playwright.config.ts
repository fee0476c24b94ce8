import { resolve } from 'node:path';
import { defineConfig, devices } from '@playwright/test';

export const E2E_PORT = 5190;
export const E2E_MAIL_WEB_PORT = 1982;
const root = resolve(import.meta.dirname, '..');

export default defineConfig({
  testDir: '.',
  outputDir: resolve(root, '.build/test-results'),
  forbidOnly: !!process.env.CI,
  retries: process.env.CI ? 1 : 0,
  workers: 1,
  reporter: [['list']],
  timeout: 30_000,
  use: {
    baseURL: `http://127.0.0.1:${E2E_PORT}`,
    trace: 'on-first-retry',
    ...devices['Desktop Chrome'],
    launchOptions: {
      executablePath: '/usr/bin/chromium',
      args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
    },
  },
  webServer: {
    command: 'node_modules/.bin/tsx server/ops/serve-e2e.ts',
    cwd: root,
    url: `http://127.0.0.1:${E2E_PORT}/api/health`,
    reuseExistingServer: false,
    timeout: 60_000,
    env: {
      NODE_ENV: 'test',
      PORT: String(E2E_PORT),
      SMTP_PORT: '1927',
      MAIL_WEB_PORT: String(E2E_MAIL_WEB_PORT),
      LOG_LEVEL: 'warn',
      E2E_DATABASE_URL: process.env.E2E_DATABASE_URL ?? '',
    },
  },
});
