/**
 * Engineering analysis in Chromium (issue 6): the fringing study of a plate pair (a sweep of
 * the gap-to-width ratio over 13 points) with its chart, table, CSV and PDF report (text read
 * back with pdftotext from Debian's poppler-utils, installed here when missing); goal seek of
 * a 50 Ω microstrip width on εr = 4.4 confirmed by a direct solve within 0.5%; and a sweep
 * cancelled part-way that keeps its points. Screenshots at 1440 and 1024 px.
 */
import { execFileSync, execSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { expect, test, type Page } from '@playwright/test';
import { signInAs } from './support/session';
import { unique } from './support/accounts';
import { EditorPage } from './editor-page';

const SHOTS = path.join('screenshots', 'analysis');

function pdfText(file: string): string {
  try {
    execFileSync('pdftotext', ['-v'], { stdio: 'ignore' });
  } catch {
    execSync('apt-get install -y poppler-utils || (apt-get update && apt-get install -y poppler-utils)', { stdio: 'ignore' });
  }
  return execFileSync('pdftotext', ['-layout', file, '-'], { encoding: 'utf8' });
}

const platePair = {
  format: 'edgefield.section/1',
  title: 'Sensor plates',
  units: 'mm',
  variables: { w: 2, d: 0.5 },
  nets: [
    { name: 'drive', role: 'signal' },
    { name: 'sense', role: 'ground' },
  ],
  shapes: [
    { id: 'lower', type: 'strip', x1: '-w/2', y1: 0, x2: 'w/2', y2: 0, conductor: 'sense' },
    { id: 'upper', type: 'strip', x1: '-w/2', y1: 'd', x2: 'w/2', y2: 'd', conductor: 'drive' },
  ],
};

const microstrip = {
  format: 'edgefield.section/1',
  title: 'Probe feed line',
  units: 'mm',
  variables: { w: 1, h: 0.8, t: 0.035 },
  materials: [{ id: 'laminate', name: 'Glass-epoxy laminate', epsR: 4.4, lossTangent: 0.02 }],
  nets: [{ name: 'feed', role: 'signal' }],
  shapes: [
    { id: 'substrate', type: 'rect', x: -8, y: 0, width: 16, height: 'h', dielectric: 'laminate' },
    { id: 'trace', type: 'rect', x: '-w/2', y: 'h', width: 'w', height: 't', conductor: 'feed' },
  ],
  boundary: { bottom: { type: 'ground', at: 0 } },
};

async function openNewSection(page: Page, workspaceId: string, name: string, content: unknown): Promise<void> {
  const res = await page.request.post(`/api/workspaces/${workspaceId}/sections`, { data: { name, content } });
  expect(res.status(), await res.text()).toBe(201);
  const body = (await res.json()) as { section?: { id: string }; id?: string };
  const id = body.section?.id ?? body.id;
  expect(id).toBeTruthy();
  await page.goto(`/w/${workspaceId}/sections/${id}`);
  await new EditorPage(page).expectReady();
  await expect(page.getByTestId('analysis-card')).toBeVisible();
}

async function shoot(page: Page, name: string, locator = page.getByTestId('analysis-card')) {
  fs.mkdirSync(SHOTS, { recursive: true });
  for (const width of [1440, 1024]) {
    await page.setViewportSize({ width, height: 900 });
    await locator.scrollIntoViewIfNeeded();
    await locator.screenshot({ path: path.join(SHOTS, `${name}-${width}.png`) });
  }
  await page.setViewportSize({ width: 1440, height: 900 });
}

test.describe('engineering analysis', () => {
  test('fringing study of a plate pair: chart, table, CSV and PDF report', async ({ page }) => {
    test.setTimeout(900_000);
    const workspaceId = await signInAs(page, 'editor');
    await openNewSection(page, workspaceId, unique('Fringing plates'), platePair);
    await page.getByTestId('toolbar-solve').click();
    await expect(page.getByTestId('results-panel').first()).toBeVisible({ timeout: 180_000 });

    await page.getByTestId('analysis-tab-fringing').click();
    await page.getByTestId('analysis-preset').selectOption('quick');
    await page.getByTestId('fringing-run').click();
    await expect(page.getByTestId('analysis-progress')).toBeVisible();
    await expect(page.getByTestId('fringing-table').locator('tbody tr')).toHaveCount(13, { timeout: 600_000 });
    await expect(page.getByTestId('analysis-progress')).toHaveCount(0, { timeout: 60_000 });
    // chart drawn with the solved curve and the published overlays
    const chart = page.getByTestId('fringing-chart');
    await expect(chart.locator('svg .recharts-line')).toHaveCount(4);
    await expect(chart).toContainText('Palmer 1937');
    await expect(page.getByTestId('fringing-thresholds')).toContainText('within 10%');

    // the table: solved/ideal grows with the ratio (fringing matters more as the gap opens)
    const col = async (row: number, c: number) => Number(await page.getByTestId('fringing-table').locator('tbody tr').nth(row).locator('td').nth(c).innerText());
    const first = await col(0, 1);
    const last = await col(12, 1);
    expect(first).toBeGreaterThan(1);
    expect(last).toBeGreaterThan(first);
    // Palmer 1937 (Trans. AIEE 56:363) holds for d ≪ w: at d/w = 0.01 within 1% of the solve
    expect(Math.abs(first / (await col(0, 2)) - 1)).toBeLessThan(0.01);

    // CSV export
    const [csvDl] = await Promise.all([page.waitForEvent('download'), page.getByTestId('fringing-csv').click()]);
    const csvFile = path.join(os.tmpdir(), `fringing-${Date.now()}.csv`);
    await csvDl.saveAs(csvFile);
    const csv = fs.readFileSync(csvFile, 'utf8').split('\r\n');
    expect(csv[0]).toContain('gap/width');
    expect(csv.slice(1, 14).every((l) => l.split(',').length >= 6)).toBe(true);
    expect(Number(csv[1]!.split(',')[1])).toBeCloseTo(first, 4);

    // PDF report: its text holds the results
    const [pdfDl] = await Promise.all([page.waitForEvent('download', { timeout: 120_000 }), page.getByTestId('fringing-pdf').click()]);
    const pdfFile = path.join(os.tmpdir(), `fringing-${Date.now()}.pdf`);
    await pdfDl.saveAs(pdfFile);
    const text = pdfText(pdfFile);
    expect(text).toContain('EDGEFIELD REPORT');
    expect(text).toContain('fringing study');
    expect(text).toContain(String(first));
    expect(text).toContain(String(last));
    expect(text).toContain('Palmer');
    expect(text).toContain('IEC 60664-1');
    await shoot(page, 'fringing-chart-table');

    // the solve's own report and tables
    await page.getByTestId('analysis-tab-lines').click();
    await page.getByTestId('analysis-volts').fill('250');
    await page.getByTestId('analysis-run-losses').click();
    await expect(page.getByTestId('table-peak')).toBeVisible({ timeout: 180_000 });
    await expect(page.getByTestId('analysis-lines').getByTestId('field-caution')).toBeVisible();
    const [solvePdf] = await Promise.all([page.waitForEvent('download', { timeout: 120_000 }), page.getByTestId('report-solve-pdf').click()]);
    const solveFile = path.join(os.tmpdir(), `solve-${Date.now()}.pdf`);
    await solvePdf.saveAs(solveFile);
    const solveText = pdfText(solveFile);
    expect(solveText).toContain('Capacitance per unit length, Maxwell form');
    expect(solveText).toContain('Peak field');
    execFileSync('pdftoppm', ['-r', '60', '-png', '-f', '1', '-l', '1', solveFile, path.join(SHOTS, 'report-solve-page')]);
    execFileSync('pdftoppm', ['-r', '60', '-png', '-f', '1', '-l', '1', pdfFile, path.join(SHOTS, 'report-fringing-page')]);
    await shoot(page, 'lines-peak');
  });

  test('goal seek finds the width of a 50 Ω microstrip on εr = 4.4; a direct solve confirms it', async ({ page }) => {
    test.setTimeout(900_000);
    const workspaceId = await signInAs(page, 'editor');
    await openNewSection(page, workspaceId, unique('Goal microstrip'), microstrip);
    await page.getByTestId('analysis-tab-goal').click();
    await page.getByTestId('analysis-preset').selectOption('standard');
    await page.getByTestId('goal-variable').selectOption('w');
    await page.getByTestId('goal-lo').fill('0.5');
    await page.getByTestId('goal-hi').fill('3');
    await page.getByTestId('goal-metric').selectOption('z0');
    await page.getByTestId('goal-target').fill('50');
    await expect(page.getByTestId('goal-run')).toBeEnabled({ timeout: 30_000 });
    await page.getByTestId('goal-run').click();
    await expect(page.getByTestId('goal-result')).toBeVisible({ timeout: 600_000 });
    const w = Number(await page.getByTestId('goal-value').getAttribute('data-value'));
    // Hammerstad & Jensen 1980 put a 50 Ω line on εr = 4.4 near w/h ≈ 1.9 (from memory; wide band here)
    expect(w / 0.8).toBeGreaterThan(1.5);
    expect(w / 0.8).toBeLessThan(2.2);
    await page.getByTestId('goal-confirm').click();
    await expect(page.getByTestId('goal-confirmed')).toBeVisible({ timeout: 300_000 });
    const z = Number(await page.getByTestId('goal-confirmed').getAttribute('data-metric'));
    expect(Math.abs(z / 50 - 1)).toBeLessThan(0.005);
    await shoot(page, 'goal-seek');

    // out of reach: a clear message
    await page.getByTestId('goal-target').fill('5');
    await page.getByTestId('goal-run').click();
    await expect(page.getByTestId('goal-error')).toContainText('not reachable in this range', { timeout: 300_000 });
  });

  test('a sweep of a named dimension: chart, table, CSV; cancel keeps finished points', async ({ page }) => {
    test.setTimeout(900_000);
    const workspaceId = await signInAs(page, 'editor');
    await openNewSection(page, workspaceId, unique('Sweep microstrip'), microstrip);
    await page.getByTestId('analysis-tab-sweep').click();
    await page.getByTestId('analysis-preset').selectOption('quick');
    await page.getByTestId('sweep-target').selectOption('v:w');
    await page.getByTestId('sweep-kind').selectOption('linear');
    await page.getByTestId('sweep-from').fill('0.5');
    await page.getByTestId('sweep-to').fill('3');
    await page.getByTestId('sweep-points').fill('12');
    await expect(page.getByTestId('sweep-run')).toBeEnabled({ timeout: 30_000 });
    await page.getByTestId('sweep-run').click();
    await expect(page.getByTestId('sweep-table').locator('tbody tr')).toHaveCount(12, { timeout: 600_000 });
    await expect(page.getByTestId('sweep-chart').locator('svg .recharts-line')).toHaveCount(1);
    const [dl] = await Promise.all([page.waitForEvent('download'), page.getByTestId('sweep-csv').click()]);
    const f = path.join(os.tmpdir(), `sweep-${Date.now()}.csv`);
    await dl.saveAs(f);
    const lines = fs.readFileSync(f, 'utf8').trim().split('\r\n');
    expect(lines).toHaveLength(13);
    expect(lines[0]).toContain('Z0 (Ω)');
    await shoot(page, 'sweep-chart-table');

    // run again and cancel after the second point: the finished points stay
    await page.getByTestId('sweep-run').click();
    await expect(page.getByTestId('sweep-table').locator('tbody tr')).toHaveCount(2, { timeout: 300_000 });
    await page.getByTestId('analysis-cancel').click();
    await expect(page.getByTestId('analysis-message')).toContainText('Cancelled');
    const kept = await page.getByTestId('sweep-table').locator('tbody tr').count();
    expect(kept).toBeGreaterThanOrEqual(2);
    expect(kept).toBeLessThan(12);
  });
});
