/**
 * End-to-end tests in Debian's Chromium (/usr/bin/chromium; never a downloaded browser).
 * The webServer serves the already built app (scripts/serve-e2e.mjs: `next start` in demo mode
 * with a fresh temporary data directory). One worker: the tests share one server and database.
 *
 * Ports and build folder: E2E_PORT (3210), E2E_SMTP_PORT (2725), NEXT_DIST_DIR (.next-e2e).
 */
import { defineConfig, devices } from '@playwright/test';

process.env.PLAYWRIGHT_SKIP_BROWSER_DOWNLOAD = '1';

const port = Number(process.env.E2E_PORT || 3210);
const baseURL = `http://localhost:${port}`;

export default defineConfig({
  testDir: 'tests/e2e',
  testMatch: '**/*.spec.ts',
  fullyParallel: false,
  workers: 1,
  retries: process.env.CI ? 1 : 0,
  // Generous: the machine is small (2 cores) and often shared with builds.
  timeout: 120_000,
  expect: { timeout: 15_000 },
  forbidOnly: Boolean(process.env.CI),
  reporter: process.env.CI ? [['list'], ['html', { open: 'never', outputFolder: `playwright-report/e2e-${port}` }]] : [['list']],
  // Per port, so runs of several developers on one machine do not clear each other's artifacts.
  outputDir: `test-results/e2e-${port}`,
  use: {
    baseURL,
    ...devices['Desktop Chrome'],
    viewport: { width: 1440, height: 900 },
    trace: 'retain-on-failure',
    screenshot: 'only-on-failure',
    launchOptions: {
      executablePath: '/usr/bin/chromium',
      args: [
        '--headless',
        '--no-sandbox',
        '--disable-gpu',
        '--disable-quic',
        '--no-first-run',
        '--disable-background-networking',
        '--disable-component-update',
        '--disable-sync',
        '--disable-dev-shm-usage',
      ],
    },
  },
  projects: [{ name: 'chromium' }],
  webServer: {
    command: 'node scripts/serve-e2e.mjs',
    url: `${baseURL}/login`,
    timeout: 180_000,
    reuseExistingServer: false,
    stdout: 'pipe',
    stderr: 'pipe',
    env: {
      E2E_PORT: String(port),
      E2E_SMTP_PORT: process.env.E2E_SMTP_PORT || '2725',
      NEXT_DIST_DIR: process.env.NEXT_DIST_DIR || '.next-e2e',
    },
  },
});
