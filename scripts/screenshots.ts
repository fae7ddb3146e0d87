/**
 * Screenshots of every screen for each demo role at 1440 and 1024 px wide, saved into
 * ./screenshots/ (gitignored) for a person to look at: nothing may overflow, text must be
 * readable, the look must be our own.
 *
 * Usage: npx tsx scripts/screenshots.ts
 *   SCREENSHOTS_BASE_URL=http://localhost:3111  use a running server (demo mode) instead of
 *                                               starting one with scripts/serve-e2e.mjs
 *   E2E_PORT / E2E_SMTP_PORT / NEXT_DIST_DIR    as for serve-e2e (defaults 3220 / 2720 / .next-e2e)
 *   SCREENSHOTS_ONLY=login,home                 only screens whose name contains one of these
 */
import { chromium, type Browser, type Page } from '@playwright/test';
import { spawn, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { DEMO_ACCOUNTS } from '../lib/demo/accounts';

const WIDTHS = [1440, 1024] as const;
const OUT = path.resolve('screenshots');
const only = (process.env.SCREENSHOTS_ONLY ?? '').split(',').map((s) => s.trim()).filter(Boolean);
const wanted = (name: string) => only.length === 0 || only.some((o) => name.includes(o));

async function waitFor(url: string, ms: number) {
  const until = Date.now() + ms;
  while (Date.now() < until) {
    try {
      const r = await fetch(url);
      if (r.status < 500) return;
    } catch {
      /* not up yet */
    }
    await new Promise((r) => setTimeout(r, 1000));
  }
  throw new Error(`server at ${url} did not answer within ${ms / 1000} s`);
}

async function startServer(): Promise<{ baseURL: string; child?: ChildProcess }> {
  if (process.env.SCREENSHOTS_BASE_URL) return { baseURL: process.env.SCREENSHOTS_BASE_URL.replace(/\/$/, '') };
  const port = process.env.E2E_PORT || '3220';
  const child = spawn(process.execPath, ['scripts/serve-e2e.mjs'], {
    env: {
      ...process.env,
      E2E_PORT: port,
      E2E_SMTP_PORT: process.env.E2E_SMTP_PORT || '2720',
      NEXT_DIST_DIR: process.env.NEXT_DIST_DIR || '.next-e2e',
    },
    stdio: ['ignore', 'inherit', 'inherit'],
  });
  const baseURL = `http://localhost:${port}`;
  await waitFor(`${baseURL}/login`, 180_000);
  return { baseURL, child };
}

async function shot(page: Page, name: string, width: number) {
  if (!wanted(name)) return;
  await page.waitForLoadState('networkidle').catch(() => undefined);
  await page.evaluate(() => document.fonts.ready);
  const file = path.join(OUT, `${name}-${width}.png`);
  await page.screenshot({ path: file, fullPage: true });
  // Report horizontal overflow, the most common layout fault at 1024 px.
  const overflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
  console.log(`${overflow > 0 ? 'OVERFLOW ' + overflow + 'px ' : ''}${path.relative(process.cwd(), file)}`);
}

async function signIn(page: Page, baseURL: string, email: string, password: string) {
  await page.goto(`${baseURL}/login`);
  await page.getByTestId('login-email').fill(email);
  await page.getByTestId('login-password').fill(password);
  await page.getByTestId('login-submit').click();
  await page.waitForURL(/\/w\/[^/]+$/, { timeout: 60_000 });
  return /\/w\/([^/?#]+)/.exec(page.url())![1]!;
}

async function run(browser: Browser, baseURL: string) {
  for (const width of WIDTHS) {
    const ctx = await browser.newContext({ viewport: { width, height: 860 }, deviceScaleFactor: 1 });
    const page = await ctx.newPage();

    // Signed out
    await page.goto(`${baseURL}/login`);
    await shot(page, 'login', width);
    await page.getByTestId('login-submit').click();
    await shot(page, 'login-errors', width);
    await page.goto(`${baseURL}/signup`);
    await shot(page, 'signup', width);
    await page.getByTestId('signup-submit').click();
    await shot(page, 'signup-errors', width);
    await page.goto(`${baseURL}/demo/mailbox`);
    await shot(page, 'mailbox', width);
    await page.goto(`${baseURL}/no-such-page`);
    await shot(page, 'not-found', width);
    await ctx.close();

    for (const account of DEMO_ACCOUNTS) {
      const c = await browser.newContext({ viewport: { width, height: 860 }, deviceScaleFactor: 1 });
      const p = await c.newPage();
      const ws = await signIn(p, baseURL, account.email, account.password);
      const r = account.role;
      await shot(p, `${r}-home`, width);
      await p.getByTestId('account-menu').click();
      await shot(p, `${r}-account-menu`, width);
      await p.keyboard.press('Escape');
      if (r !== 'viewer') {
        await p.getByTestId('new-section').click();
        await shot(p, `${r}-create-section`, width);
        await p.keyboard.press('Escape');
      }
      if (r === 'editor') {
        await p.getByTestId('sections-search').fill('zzzz no match');
        await p.getByTestId('sections-empty').waitFor();
        await shot(p, `${r}-home-search-empty`, width);
        await p.getByTestId('sections-search').fill('');
        await p.getByTestId('workspace-switcher').click();
        await shot(p, `${r}-switcher`, width);
        await p.keyboard.press('Escape');
      }
      const first = p.getByTestId('section-link').first();
      if (await first.count()) {
        await first.click();
        await p.getByTestId('section-name').waitFor();
        // The drawing editor loads after the page (Konva is client-only); give it time to draw.
        await p.locator('[data-testid="section-editor-slot"] canvas').first().waitFor({ timeout: 30_000 }).catch(() => undefined);
        await shot(p, `${r}-section`, width);
        if (r !== 'viewer') {
          await p.getByTestId('section-rename').click();
          await shot(p, `${r}-section-rename`, width);
          await p.keyboard.press('Escape');
        }
      }
      await p.goto(`${baseURL}/w/${ws}/settings`);
      await shot(p, `${r}-settings`, width);
      await p.goto(`${baseURL}/w/${ws}/solves`);
      await shot(p, `${r}-solves`, width);
      await p.goto(`${baseURL}/w/${ws}/sections/does-not-exist`);
      await shot(p, `${r}-section-not-found`, width);
      await c.close();
    }
  }
}

async function main() {
  fs.mkdirSync(OUT, { recursive: true });
  const { baseURL, child } = await startServer();
  const browser = await chromium.launch({
    executablePath: '/usr/bin/chromium',
    args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-dev-shm-usage', '--no-first-run'],
  });
  try {
    await run(browser, baseURL);
  } finally {
    await browser.close();
    if (child) {
      child.kill('SIGTERM');
      await new Promise((r) => child.once('exit', r));
    }
  }
  console.log(`screenshots in ${path.relative(process.cwd(), OUT)}/`);
}

let finished = false;
process.on('beforeExit', () => {
  if (!finished) {
    console.error('screenshots: stopped before finishing (the browser or the server went away)');
    process.exitCode = 1;
  }
});

main()
  .then(() => {
    finished = true;
  })
  .catch((e) => {
    console.error(e);
    process.exit(1);
  });
