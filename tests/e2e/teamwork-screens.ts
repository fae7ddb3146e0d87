/**
 * Screenshots of the team-work screens (issue 7) at 1440 and 1024 px, for looking at them:
 * `E2E_PORT=... npx tsx tests/e2e/teamwork-screens.ts <outDir>` against a running demo server.
 * Not a test (nothing is asserted); it only drives the pages.
 */
import { chromium, type Page } from '@playwright/test';

const base = `http://localhost:${process.env.E2E_PORT || 3115}`;
const out = process.argv[2] || 'test-results/teamwork-screens';

async function signIn(page: Page, email: string, password: string) {
  await page.goto(`${base}/login`);
  await page.getByTestId('login-email').fill(email);
  await page.getByTestId('login-password').fill(password);
  await page.getByTestId('login-submit').click();
  await page.waitForURL(/\/w\/[^/]+$/, { timeout: 60_000 });
  return /\/w\/([^/?#]+)/.exec(page.url())![1]!;
}

async function main() {
  const browser = await chromium.launch({ executablePath: '/usr/bin/chromium', args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-dev-shm-usage'] });
  for (const width of [1440, 1024]) {
    const page = await browser.newPage({ viewport: { width, height: 900 } });
    const shot = (name: string) => page.screenshot({ path: `${out}/${name}-${width}.png`, fullPage: true });
    const ws = await signIn(page, 'maren.holt@harrowlane.example', 'edgefield-owner');
    await page.goto(`${base}/w/${ws}/settings`);
    await page.getByTestId('plan-card').waitFor();
    await page.waitForTimeout(1500);
    await shot('settings');
    await page.goto(`${base}/w/${ws}`);
    await page.getByTestId('import-drawing').click();
    await page.getByTestId('import-file').setInputFiles('tests/fixtures/import/microstrip-and-wire.svg');
    await page.getByTestId('import-preview').waitFor();
    await page.screenshot({ path: `${out}/import-dialog-${width}.png` });
    await page.keyboard.press('Escape');
    await page.goto(`${base}/w/${ws}`);
    await page.getByTestId('section-link').first().click();
    await page.getByTestId('section-history-link').click();
    await page.getByTestId('revisions').waitFor();
    await page.waitForTimeout(1000);
    await shot('history');
    await page.goto(`${base}/w/${ws}/activity`);
    await shot('activity');
    await page.goto(`${base}/w/${ws}/notifications`);
    await page.waitForTimeout(1500);
    await shot('notifications');
    await page.goto(`${base}/invite/${'x'.repeat(43)}`);
    await shot('invite-invalid');
    await page.close();
  }
  await browser.close();
}
main().catch((e) => {
  console.error(e);
  process.exit(1);
});
