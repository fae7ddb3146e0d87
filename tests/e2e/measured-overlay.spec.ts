/**
 * Measured capacitance on sweep charts (issue 7) in Chromium: an editor adds measured data
 * from the sweep card ("Add measured data"), runs a sweep of a microstrip's width, and sees
 * the measured sets as diamond markers with a legend entry per file and a toggle that hides
 * them. Units of both axes are checked through the drawing itself: a CSV written in µm and
 * pF/cm from the sweep's own C' values (read from the sweep CSV) must put its markers on the
 * solved curve's dots. A set of another quantity, and a chart of a non-capacitance value, get
 * a note instead of markers. All CSV files are made here for the test.
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { expect, test, type Locator, type Page } from '@playwright/test';
import Papa from 'papaparse';
import { signInAs } from './support/session';
import { unique } from './support/accounts';
import { EditorPage } from './editor-page';

const microstrip = {
  format: 'edgefield.section/1',
  title: 'Overlay feed line',
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

const SHOTS = path.join(os.tmpdir(), 'edgefield-measured-overlay');

/** Pixel centres of the measured diamonds ("M{cx},{cy-5}L…") in a chart. */
async function diamondCentres(points: Locator): Promise<[number, number][]> {
  const ds = await points.evaluateAll((els) => els.map((e) => e.getAttribute('d') ?? ''));
  return ds.map((d) => {
    const m = /^M([-\d.e]+),([-\d.e]+)L([-\d.e]+),([-\d.e]+)/.exec(d);
    if (!m) throw new Error(`not a diamond path: ${d}`);
    return [Number(m[1]), Number(m[4])];
  });
}

async function uploadFromSweepCard(page: Page, name: string, csv: string) {
  await page.getByTestId('sweep-add-measured').click();
  const dialog = page.getByTestId('add-measured-dialog');
  await expect(dialog).toBeVisible();
  await dialog.getByTestId('measured-file').setInputFiles({ name, mimeType: 'text/csv', buffer: Buffer.from(csv, 'utf8') });
  await expect(dialog.getByTestId('measured-done')).toContainText(name, { timeout: 30_000 });
  fs.mkdirSync(SHOTS, { recursive: true });
  for (const width of [1440, 1024]) {
    await page.setViewportSize({ width, height: 900 });
    await dialog.screenshot({ path: path.join(SHOTS, `add-measured-dialog-${width}.png`) });
  }
  await page.setViewportSize({ width: 1440, height: 900 });
  await dialog.getByRole('button', { name: 'Close' }).click();
  await expect(dialog).toBeHidden();
}

test('measured sets on a sweep chart: units converted, a legend entry and a toggle per set, notes where they cannot match', async ({ page }) => {
  test.setTimeout(900_000);
  const workspaceId = await signInAs(page, 'editor');
  const res = await page.request.post(`/api/workspaces/${workspaceId}/sections`, { data: { name: unique('Overlay microstrip'), content: microstrip } });
  expect(res.status(), await res.text()).toBe(201);
  const body = (await res.json()) as { section?: { id: string }; id?: string };
  const sectionId = body.section?.id ?? body.id;
  expect(sectionId).toBeTruthy();

  // A set of another quantity, uploaded through the API beforehand: it must not be drawn.
  const other = await page.request.post(`/api/workspaces/${workspaceId}/sections/${sectionId}/measurements?name=gap-series.csv`, {
    data: 'gap (mm),C (pF/m)\n0.2,150\n0.4,120\n',
    headers: { 'content-type': 'text/csv' },
  });
  expect(other.status(), await other.text()).toBe(201);

  await page.goto(`/w/${workspaceId}/sections/${sectionId}`);
  await new EditorPage(page).expectReady();
  await page.getByTestId('analysis-tab-sweep').click();
  await page.getByTestId('analysis-preset').selectOption('quick');
  await page.getByTestId('sweep-target').selectOption('v:w');
  await page.getByTestId('sweep-kind').selectOption('linear');
  await page.getByTestId('sweep-from').fill('0.5');
  await page.getByTestId('sweep-to').fill('2');
  await page.getByTestId('sweep-points').fill('4');
  await expect(page.getByTestId('sweep-run')).toBeEnabled({ timeout: 30_000 });
  await page.getByTestId('sweep-run').click();
  await expect(page.getByTestId('sweep-table').locator('tbody tr')).toHaveCount(4, { timeout: 600_000 });
  await expect(page.getByTestId('analysis-progress')).toHaveCount(0, { timeout: 60_000 });

  // The solved C' at each width, from the sweep's CSV (full precision).
  const [dl] = await Promise.all([page.waitForEvent('download'), page.getByTestId('sweep-csv').click()]);
  const csvFile = path.join(os.tmpdir(), `overlay-sweep-${Date.now()}.csv`);
  await dl.saveAs(csvFile);
  const rows = Papa.parse<string[]>(fs.readFileSync(csvFile, 'utf8').trim(), { skipEmptyLines: true }).data; // headers hold quoted commas
  const col = rows[0]!.findIndex((h) => h.startsWith("C' (line)"));
  expect(col).toBeGreaterThan(0);
  const solved = rows.slice(1).map((r) => [Number(r[0]), Number(r[col])] as [number, number]);
  expect(solved).toHaveLength(4);
  expect(solved.every(([w, c]) => w > 0 && c > 0)).toBe(true);

  // The same values written in µm and pF/cm (1 pF/cm = 100 pF/m), added from the sweep card.
  const bench = ['w (µm),C (pF/cm)', ...solved.map(([w, c]) => `${(w * 1000).toPrecision(12)},${(c / 100).toPrecision(12)}`)].join('\n');
  await uploadFromSweepCard(page, 'bench-width.csv', bench);

  const legend = page.getByTestId('measured-legend');
  const benchSet = legend.locator('[data-testid="measured-set"][data-set-name="bench-width.csv"]');
  const gapSet = legend.locator('[data-testid="measured-set"][data-set-name="gap-series.csv"]');
  await expect(benchSet).toBeVisible({ timeout: 30_000 });
  await expect(gapSet).toBeVisible();

  // Charting Z0 (the default here): capacitance sets cannot be drawn, and say so.
  const chart = page.getByTestId('sweep-chart');
  await page.getByTestId('sweep-metric').selectOption('z0');
  await expect(benchSet).toHaveAttribute('data-matched', 'false');
  await expect(benchSet.getByTestId('measured-note')).toContainText('capacitance');
  await expect(chart.getByTestId('measured-point')).toHaveCount(0);

  // Charting C' (line) in pF/m: the bench set lands on the solved dots; the gap set does not match.
  await page.getByTestId('sweep-metric').selectOption('lineC');
  await expect(benchSet).toHaveAttribute('data-matched', 'true');
  await expect(gapSet).toHaveAttribute('data-matched', 'false');
  await expect(gapSet.getByTestId('measured-note')).toContainText('"gap (mm)"');
  const markers = chart.getByTestId('measured-point');
  await expect(markers).toHaveCount(4);
  await expect(chart.locator('.recharts-legend-wrapper')).toContainText('measured: bench-width.csv');
  await expect(benchSet.getByTestId('measured-note')).toContainText('converted from µm to mm');
  const dots = await chart
    .locator('.recharts-line-dots circle')
    .evaluateAll((els) => els.map((e) => [Number(e.getAttribute('cx')), Number(e.getAttribute('cy'))] as [number, number]));
  expect(dots).toHaveLength(4);
  const centres = await diamondCentres(markers);
  for (let i = 0; i < 4; i++) {
    expect(Math.abs(centres[i]![0] - dots[i]![0])).toBeLessThan(0.5);
    expect(Math.abs(centres[i]![1] - dots[i]![1])).toBeLessThan(0.5);
  }
  fs.mkdirSync(SHOTS, { recursive: true });
  for (const width of [1440, 1024]) {
    await page.setViewportSize({ width, height: 900 });
    await page.getByTestId('analysis-sweep').scrollIntoViewIfNeeded();
    await page.getByTestId('analysis-sweep').screenshot({ path: path.join(SHOTS, `sweep-measured-${width}.png`) });
  }
  await page.setViewportSize({ width: 1440, height: 900 });

  // The toggle hides the set's markers and its legend entry, and shows them again.
  await benchSet.getByTestId('measured-toggle').uncheck();
  await expect(markers).toHaveCount(0);
  await expect(chart.locator('.recharts-legend-wrapper')).not.toContainText('bench-width.csv');
  await expect(chart.locator('.recharts-line-dots circle')).toHaveCount(4);
  await benchSet.getByTestId('measured-toggle').check();
  await expect(markers).toHaveCount(4);

  // The file is kept with the section, listed with the section's files.
  const list = await page.request.get(`/api/workspaces/${workspaceId}/sections/${sectionId}/measurements`);
  expect(list.status()).toBe(200);
  const names = ((await list.json()) as { measurements: { name: string }[] }).measurements.map((m) => m.name).sort();
  expect(names).toEqual(['bench-width.csv', 'gap-series.csv']);
});

test('a viewer is not offered the upload of measured data on the sweep card', async ({ page }) => {
  const workspaceId = await signInAs(page, 'viewer');
  const list = await page.request.get(`/api/workspaces/${workspaceId}/sections`);
  const j = (await list.json()) as { sections?: { id: string }[] } | { id: string }[];
  const sections = Array.isArray(j) ? j : (j.sections ?? []);
  expect(sections.length).toBeGreaterThan(0);
  await page.goto(`/w/${workspaceId}/sections/${sections[0]!.id}`);
  await expect(page.getByTestId('analysis-card')).toBeVisible({ timeout: 30_000 });
  await page.getByTestId('analysis-tab-sweep').click();
  await expect(page.getByTestId('sweep-run')).toBeVisible();
  await expect(page.getByTestId('sweep-add-measured')).toHaveCount(0);
});
