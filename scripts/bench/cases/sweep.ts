/**
 * Bench case "sweep-12-points": in headless Chromium, a 12-point sweep of a microstrip trace
 * width at the standard preset in the analysis worker, from the request to the last point
 * (the worker is started first, so loading the solver code is not counted). Reported, never
 * asserted (target under 15 s on the project's 2-core machine); depends on machine load.
 */
import path from 'node:path';
import { buildHarness, launchChromium, serveStatic } from '../browser-harness';

export const name = 'sweep-12-points';


export interface SweepBenchResult {
  /** Wall time of the 12-point sweep in the worker, ms (the figure the issue asks for). */
  ms: number;
  points: number;
  failed: number;
  preset: 'standard';
  /** Z0 at each point, Ω (a check that the sweep solved what it should). */
  z0Ohm: number[];
}

export async function run(): Promise<SweepBenchResult> {
  const outDir = await buildHarness({ dir: 'scripts/bench/sweep-harness' });
  const srv = await serveStatic(outDir);
  const browser = await launchChromium();
  try {
    const page = await browser.newPage();
    await page.goto(srv.url);
    await page.waitForFunction(() => document.getElementById('status')?.textContent === 'ready', undefined, { timeout: 60_000 });
    const r = await page.evaluate(() => window.runSweep());
    return { ms: r.ms, points: r.points, failed: r.failed, preset: 'standard', z0Ohm: r.z0 };
  } finally {
    await browser.close();
    await srv.close();
  }
}
