import { defineConfig } from '@playwright/test';

const port = Number(process.env['E2E_PORT'] ?? 4391);

/** End-to-end tests in Debian's Chromium (never a downloaded browser). */
export default defineConfig({
  testDir: './e2e',
  outputDir: 'test-results/e2e-output',
  fullyParallel: false,
  workers: 1,
  retries: 0,
  timeout: 90_000,
  expect: { timeout: 10_000 },
  reporter: [['list'], ['json', { outputFile: 'test-results/e2e.json' }]],
  use: {
    baseURL: `http://127.0.0.1:${port}`,
    viewport: { width: 1366, height: 860 },
    trace: 'retain-on-failure',
    screenshot: 'only-on-failure',
    launchOptions: {
      executablePath: '/usr/bin/chromium',
      args: [
        '--headless',
        '--no-sandbox',
        '--disable-gpu',
        '--disable-dev-shm-usage',
        '--disable-background-networking',
        '--disable-component-update',
        '--disable-sync',
        '--no-first-run',
      ],
    },
  },
  webServer: {
    command: 'npx tsx seed-data/load.ts && npx tsx server/main.ts',
    url: `http://127.0.0.1:${port}/api/health`,
    reuseExistingServer: false,
    timeout: 60_000,
    env: { ...process.env, PORT: String(port), NODE_ENV: 'test', MAIL_MODE: 'fake', LOG_LEVEL: 'warn' } as Record<string, string>,
    stdout: 'pipe',
    stderr: 'pipe',
  },
});
