import { defineConfig } from '@playwright/test';
import { E2E_ORIGIN } from './paths';

export default defineConfig({
  testDir: '.',
  testMatch: '**/*.e2e.ts',
  fullyParallel: false,
  workers: 1,
  retries: 0,
  timeout: 60_000,
  reporter: [['list']],
  outputDir: '../../data/e2e-results',
  use: {
    baseURL: E2E_ORIGIN,
    trace: 'retain-on-failure',
    screenshot: 'only-on-failure',
    launchOptions: {
      executablePath: '/usr/bin/chromium',
      args: [
        '--no-sandbox',
        '--disable-gpu',
        '--disable-dev-shm-usage',
        '--disable-background-networking',
        '--disable-component-update',
        '--disable-sync',
        '--no-first-run',
        '--disable-quic',
      ],
    },
  },
  webServer: {
    command: 'node --import tsx tests/e2e/serve.ts',
    cwd: '../..',
    url: `${E2E_ORIGIN}/cautions`,
    timeout: 120_000,
    reuseExistingServer: false,
    stdout: 'pipe',
  },
});
